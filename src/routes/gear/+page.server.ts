import { error, fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { myStudios } from '$lib/server/studios';
import { callApi, type ApiIssue } from '$lib/notebook/api';
import { getOrFail } from '$lib/notebook/load';
import { GEAR_KIND_LIST, specFromForm, type GearKindName } from '$lib/notebook/gear-form';

export interface GearItem {
	id: string;
	studioId: string;
	kind: GearKindName;
	name: string;
	spec: Record<string, unknown>;
	notes: string;
	retiredAt: string | null;
	updatedAt: string;
}

export async function load({ fetch, url, locals }) {
	const user = requireUser(locals.user, url);
	const studios = (await myStudios(user)).map((s) => ({ id: s.id, name: s.name, personal: s.personal, role: s.role }));
	const asked = url.searchParams.get('studio');
	// Without a choice, a shared studio's shelf (where a team keeps its gear), else the personal one.
	const studio = studios.find((s) => s.id === asked) ?? studios.find((s) => !s.personal) ?? studios[0];
	if (!studio) return { studios, studioId: null, canEdit: false, items: [] as GearItem[], editId: null };
	const shelf = await getOrFail<{ studioId: string; canEdit: boolean; items: GearItem[] }>(fetch, `/api/v1/gear?studio=${studio.id}&retired=1`, url);
	return {
		studios,
		studioId: studio.id,
		canEdit: shelf.canEdit,
		items: shelf.items,
		editId: url.searchParams.get('edit')
	};
}

function rawValues(form: FormData): Record<string, string> {
	const out: Record<string, string> = {};
	for (const [k, v] of form) if (typeof v === 'string') out[k] = v;
	return out;
}

/** API issues keyed like the form's inputs: `name`, `notes`, `spec.guideNumberM`. */
function issueErrors(issues: ApiIssue[], message: string): Record<string, string> {
	const errors: Record<string, string> = {};
	for (const i of issues) {
		const key = i.path.join('.') || 'form';
		if (!(key in errors)) errors[key] = i.message;
	}
	if (!Object.keys(errors).length) errors.form = message;
	return errors;
}

function kindOf(form: FormData): GearKindName | null {
	const k = String(form.get('kind') ?? '');
	return (GEAR_KIND_LIST as readonly string[]).includes(k) ? (k as GearKindName) : null;
}

export const actions = {
	add: async ({ request, fetch }) => {
		const form = await request.formData();
		const values = rawValues(form);
		const kind = kindOf(form);
		if (!kind) return fail(400, { action: 'add', kind: null, values, errors: { form: 'Choose what kind of gear to add.' } as Record<string, string> });
		const studioId = String(form.get('studioId') ?? '');
		const name = String(form.get('name') ?? '').trim();
		const { spec, errors } = specFromForm(kind, form);
		if (!name) errors.name = 'must not be empty: give it the name you call it by';
		if (Object.keys(errors).length) return fail(400, { action: 'add', kind, values, errors });
		const r = await callApi<{ id: string; name: string }>(fetch, '/api/v1/gear', {
			method: 'POST',
			body: { studioId, kind, name, spec, notes: String(form.get('notes') ?? '') }
		});
		if (!r.ok) {
			if (r.status === 401 || r.status === 403 || r.status === 404) error(r.status, r.message);
			return fail(400, { action: 'add', kind, values, errors: issueErrors(r.issues, r.message) });
		}
		return { action: 'add', kind, added: r.data.name };
	},

	edit: async ({ request, fetch }) => {
		const form = await request.formData();
		const values = rawValues(form);
		const kind = kindOf(form);
		const id = String(form.get('id') ?? '');
		const studioId = String(form.get('studioId') ?? '');
		if (!kind || !id) return fail(400, { action: 'edit', kind, values, errors: { form: 'The form lost which item it edits; reload the page.' } as Record<string, string> });
		const name = String(form.get('name') ?? '').trim();
		const { spec, errors } = specFromForm(kind, form);
		if (!name) errors.name = 'must not be empty';
		if (Object.keys(errors).length) return fail(400, { action: 'edit', kind, values, errors });
		const r = await callApi<{ id: string; name: string }>(fetch, `/api/v1/gear/${encodeURIComponent(id)}`, {
			method: 'PATCH',
			body: { name, spec, notes: String(form.get('notes') ?? '') }
		});
		if (!r.ok) {
			if (r.status === 401 || r.status === 403 || r.status === 404) error(r.status, r.message);
			return fail(400, { action: 'edit', kind, values, errors: issueErrors(r.issues, r.message) });
		}
		redirect(303, `/gear?studio=${encodeURIComponent(studioId)}&saved=${encodeURIComponent(r.data.name)}#${kind}`);
	},

	/** Retire an item (it leaves the shelf; setups keep their copies) or put it back. */
	retire: async ({ request, fetch }) => {
		const form = await request.formData();
		const id = String(form.get('id') ?? '');
		const retired = form.get('retired') === '1';
		const r = await callApi<{ name: string }>(fetch, `/api/v1/gear/${encodeURIComponent(id)}`, { method: 'PATCH', body: { retired } });
		if (!r.ok) {
			if (r.status === 401 || r.status === 403 || r.status === 404) error(r.status, r.message);
			return fail(400, { action: 'retire', kind: null, values: {}, errors: { form: r.message } as Record<string, string> });
		}
		return { action: 'retire', kind: null, retiredName: r.data.name, retired };
	}
};
