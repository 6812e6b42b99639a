import { error, fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { myStudios } from '$lib/server/studios';
import { createGear, listGear, updateGear, type GearItem } from '$lib/server/gear';
import { attempt, parseInput, type ServiceFailure } from '$lib/server/actions';
import { issuesByField } from '$lib/notebook/api';
import { GEAR_KIND_LIST, specFromForm, type GearKindName } from '$lib/notebook/gear-form';
import { gearCreateSchema, gearUpdateSchema } from '$lib/scene/gear';

export async function load({ url, locals }) {
	const user = requireUser(locals.user, url);
	const studios = (await myStudios(user)).map((s) => ({ id: s.id, name: s.name, personal: s.personal, role: s.role }));
	const asked = url.searchParams.get('studio');
	// Without a choice, a shared studio's shelf (where a team keeps its gear), else the personal one.
	const studio = studios.find((s) => s.id === asked) ?? studios.find((s) => !s.personal) ?? studios[0];
	if (!studio) return { studios, studioId: null, canEdit: false, items: [] as GearItem[], editId: null };
	const shelf = await listGear(user, { studioId: studio.id, includeRetired: true });
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

/** A refusal ends the page with its status (401, 403, 404), as an unknown item or a shelf the caller may not change. */
function refuse(r: ServiceFailure) {
	if (r.status === 401 || r.status === 403 || r.status === 404) error(r.status, r.message);
}

/** Every other failure: each message beside the input its path names (`name`, `spec.guideNumberM`), or under the form. */
function fieldErrors(r: ServiceFailure): Record<string, string> {
	refuse(r);
	const errors = issuesByField(r.issues);
	if (!Object.keys(errors).length) errors.form = r.message;
	return errors;
}

function kindOf(form: FormData): GearKindName | null {
	const k = String(form.get('kind') ?? '');
	return (GEAR_KIND_LIST as readonly string[]).includes(k) ? (k as GearKindName) : null;
}

export const actions = {
	add: async ({ request, locals }) => {
		const form = await request.formData();
		const values = rawValues(form);
		const kind = kindOf(form);
		if (!kind) return fail(400, { action: 'add', kind: null, values, errors: { form: 'Choose what kind of gear to add.' } as Record<string, string> });
		const studioId = String(form.get('studioId') ?? '');
		const name = String(form.get('name') ?? '').trim();
		const { spec, errors } = specFromForm(kind, form);
		if (!name) errors.name = 'must not be empty: give it the name you call it by';
		if (Object.keys(errors).length) return fail(400, { action: 'add', kind, values, errors });
		const input = parseInput(gearCreateSchema, { studioId, kind, name, spec, notes: String(form.get('notes') ?? '') });
		const r = input.ok ? await attempt(() => createGear(locals.user, input.data)) : input;
		if (!r.ok) return fail(400, { action: 'add', kind, values, errors: fieldErrors(r) });
		return { action: 'add', kind, added: r.data.name };
	},

	edit: async ({ request, locals }) => {
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
		const input = parseInput(gearUpdateSchema, { name, spec, notes: String(form.get('notes') ?? '') });
		const r = input.ok ? await attempt(() => updateGear(locals.user, id, input.data)) : input;
		if (!r.ok) return fail(400, { action: 'edit', kind, values, errors: fieldErrors(r) });
		redirect(303, `/gear?studio=${encodeURIComponent(studioId)}&saved=${encodeURIComponent(r.data.name)}#${kind}`);
	},

	/** Retire an item (it leaves the shelf; setups keep their copies) or put it back. */
	retire: async ({ request, locals }) => {
		const form = await request.formData();
		const id = String(form.get('id') ?? '');
		const retired = form.get('retired') === '1';
		const r = await attempt(() => updateGear(locals.user, id, { retired }));
		if (!r.ok) {
			refuse(r);
			return fail(400, { action: 'retire', kind: null, values: {}, errors: { form: r.message } as Record<string, string> });
		}
		return { action: 'retire', kind: null, retiredName: r.data.name, retired };
	}
};
