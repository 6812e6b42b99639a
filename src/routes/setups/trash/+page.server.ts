import { error, fail } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { callApi, type SetupList } from '$lib/notebook/api';
import { getOrFail } from '$lib/notebook/load';

const PAGE_SIZE = 20;

export async function load({ fetch, url, locals }) {
	requireUser(locals.user, url);
	const page = Math.max(1, Math.min(1_000_000, Math.floor(Number(url.searchParams.get('page'))) || 1));
	const list = await getOrFail<SetupList>(fetch, `/api/v1/setups/trash?page=${page}&pageSize=${PAGE_SIZE}`, url);
	return { list };
}

export const actions = {
	/** Back into the notebook with every revision it had. */
	restore: async ({ request, fetch }) => {
		const form = await request.formData();
		const id = String(form.get('id') ?? '');
		const title = String(form.get('title') ?? 'The setup');
		if (!id) return fail(400, { errors: { form: 'Pick a setup to restore.' } as Record<string, string> });
		const r = await callApi<{ id: string; revisionNumber: number }>(fetch, `/api/v1/setups/${encodeURIComponent(id)}/untrash`, { method: 'POST' });
		if (r.ok) return { restored: { id: r.data.id, title, revisionNumber: r.data.revisionNumber } };
		if (r.status === 401) error(401, r.message);
		return fail(r.status === 404 || r.status === 403 ? r.status : 400, { errors: { form: `“${title}” could not be restored: ${r.message}` } as Record<string, string> });
	}
};
