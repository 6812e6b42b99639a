import { error, fail } from '@sveltejs/kit';
import { can, requireUser, studioAccess } from '$lib/server/authz';
import { callApi, type RevisionSummary, type SetupRecord } from '$lib/notebook/api';
import { getOrFail } from '$lib/notebook/load';

export async function load({ params, fetch, url, locals }) {
	const user = requireUser(locals.user, url);
	const id = encodeURIComponent(params.id);
	const [setup, revisions] = await Promise.all([
		getOrFail<SetupRecord & { canEdit?: boolean }>(fetch, `/api/v1/setups/${id}`, url),
		getOrFail<(RevisionSummary & { restoredFrom?: number | null })[]>(fetch, `/api/v1/setups/${id}/revisions`, url)
	]);
	const canEdit = setup.canEdit ?? can(await studioAccess(user, setup.studioId), 'setups.edit');
	return {
		setup: { id: setup.id, title: setup.title, subject: setup.subject, revisionNumber: setup.revisionNumber },
		revisions: revisions.map((r) => ({
			number: r.number,
			authorName: r.authorName,
			createdAt: r.createdAt,
			message: r.message,
			restoredFrom: r.restoredFrom ?? null
		})),
		canEdit
	};
}

export const actions = {
	/** A new revision that copies an older one; refused if someone saved since the page was loaded. */
	restore: async ({ request, params, fetch }) => {
		const form = await request.formData();
		const n = Number(form.get('revision'));
		const latest = Number(form.get('latestRevision'));
		if (!Number.isInteger(n) || n < 1) return fail(400, { action: 'restore', errors: { form: 'Pick a revision to restore.' } as Record<string, string> });
		const r = await callApi<{ revisionNumber: number }>(fetch, `/api/v1/setups/${encodeURIComponent(params.id)}/revisions/${n}/restore`, {
			method: 'POST',
			body: Number.isInteger(latest) && latest >= 1 ? { baseRevision: latest } : {}
		});
		if (r.ok) return { action: 'restore', restored: n, revisionNumber: r.data.revisionNumber };
		if (r.status === 409) {
			return fail(409, {
				action: 'restore',
				errors: {
					form: `Not restored: someone saved revision ${String(r.body?.latestRevision ?? 'a newer one')} while this page was open. The list now shows it; look at what changed, then restore again if you still want revision ${n}.`
				} as Record<string, string>
			});
		}
		if (r.status === 401 || r.status === 403 || r.status === 404) error(r.status, r.message);
		return fail(r.status, { action: 'restore', errors: { form: r.message } as Record<string, string> });
	}
};
