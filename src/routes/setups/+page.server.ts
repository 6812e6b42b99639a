import { fail, isHttpError, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { myStudios } from '$lib/server/studios';
import { listSetupsFor } from '$lib/server/setups';
import { listGearOnShelves } from '$lib/server/gear';
import { attempt, parseInput } from '$lib/server/actions';
import { createSetupFromForm } from '$lib/server/setups-changes';
import { importSetup } from '$lib/server/setups-export';
import { readNewSetupForm } from '$lib/notebook/create';
import { apiSearch, readListQuery } from '$lib/notebook/list-query';
import { blankDocument } from '$lib/notebook/load';
import { setupListQuerySchema } from '$lib/scene/inputs';
import { importQuerySchema, MAX_EXPORT_BYTES } from '$lib/scene/export';

/** A refusal (a studio filter the caller may not see) becomes the list's message, not an error page. */
async function orRefusal<T>(work: Promise<T>): Promise<{ ok: true; data: T } | { ok: false; message: string }> {
	try {
		return { ok: true, data: await work };
	} catch (e) {
		if (isHttpError(e)) return { ok: false, message: e.body.message };
		throw e;
	}
}

export async function load({ locals, url }) {
	const user = requireUser(locals.user, url);
	const query = readListQuery(url.searchParams);
	const studios = await myStudios(user);
	const shelves = query.studio ? studios.filter((s) => s.id === query.studio) : studios;
	// The same question the browser's search-as-you-type asks the API, read by the API's own schema.
	const listQuery = setupListQuerySchema.parse(Object.fromEntries(new URLSearchParams(apiSearch(query))));
	const [list, gear] = await Promise.all([orRefusal(listSetupsFor(user, listQuery)), listGearOnShelves(user, shelves.map((s) => s.id))]);
	return {
		query,
		studios: studios.map((s) => ({ id: s.id, name: s.name, personal: s.personal, role: s.role })),
		list: list.ok ? list.data : { items: [], total: 0, page: query.page, pageSize: 20 },
		listError: list.ok ? null : list.message,
		gear
	};
}

export const actions = {
	/** New setup: a small form (studio, title, subject) → a setup with a minimal document. */
	create: async ({ request, locals }) => {
		const values = readNewSetupForm(await request.formData());
		const r = await createSetupFromForm(locals.user, values, blankDocument());
		if (!r.ok) return fail(r.status, { action: 'create', values, errors: r.errors });
		redirect(303, `/setups/${r.id}?created=1`);
	},

	/** Import: a setup file from an export, as POST /api/v1/setups/import takes it; a bad file creates nothing. */
	import: async ({ request, locals }) => {
		const form = await request.formData();
		const studioId = String(form.get('studioId') ?? '');
		const file = form.get('file');
		const values = { studioId };
		if (!(file instanceof File) || file.size === 0) {
			return fail(400, { action: 'import', values, errors: { file: file instanceof File && file.name ? `“${file.name}” is empty.` : 'Choose a setup file to import.' } });
		}
		if (file.size > MAX_EXPORT_BYTES) {
			return fail(400, {
				action: 'import',
				values,
				errors: { file: `“${file.name}” is too large (${Math.ceil(file.size / 1024)} KiB); a setup file is at most ${MAX_EXPORT_BYTES / 1024} KiB.` }
			});
		}
		const text = await file.text();
		const query = parseInput(importQuerySchema, { studio: studioId || undefined });
		const r = query.ok ? await attempt(() => importSetup(locals.user, text, { studioId: query.data.studio })) : query;
		if (!r.ok) {
			const details = r.issues.filter((i) => i.path.length).slice(0, 8).map((i) => `${i.path.join('.')}: ${i.message}`);
			const where = r.issues.some((i) => i.path[0] === 'studio') ? 'studioId' : 'file';
			return fail(r.status, {
				action: 'import',
				values,
				errors: { [where]: `“${file.name}”: ${r.message}` } as Record<string, string>,
				details
			});
		}
		redirect(303, `/setups/${r.data.id}?imported=1`);
	}
};
