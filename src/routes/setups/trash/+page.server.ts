import { error, fail } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { attempt } from '$lib/server/actions';
import { listTrash, untrashSetup } from '$lib/server/setups';
import { setupListQuerySchema } from '$lib/scene/inputs';

const PAGE_SIZE = 20;

export async function load({ url, locals }) {
	const user = requireUser(locals.user, url);
	const page = Math.max(1, Math.min(1_000_000, Math.floor(Number(url.searchParams.get('page'))) || 1));
	// The question GET /api/v1/setups/trash answers, read by its own schema.
	const list = await listTrash(user, setupListQuerySchema.parse({ page: String(page), pageSize: String(PAGE_SIZE) }));
	return { list };
}

export const actions = {
	/** Back into the notebook with every revision it had. */
	restore: async ({ request, locals }) => {
		const form = await request.formData();
		const id = String(form.get('id') ?? '');
		const title = String(form.get('title') ?? 'The setup');
		if (!id) return fail(400, { errors: { form: 'Pick a setup to restore.' } as Record<string, string> });
		const r = await attempt(() => untrashSetup(locals.user, id));
		if (r.ok) return { restored: { id: r.data.id, title, revisionNumber: r.data.revisionNumber } };
		if (r.status === 401) error(401, r.message);
		return fail(r.status === 404 || r.status === 403 ? r.status : 400, { errors: { form: `“${title}” could not be restored: ${r.message}` } as Record<string, string> });
	}
};
