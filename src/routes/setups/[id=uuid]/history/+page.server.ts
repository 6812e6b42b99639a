import { fail } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { getSetup, listSetupRevisions, restoreRevision, StaleRevisionError } from '$lib/server/setups';

export async function load({ params, url, locals }) {
	const user = requireUser(locals.user, url);
	const [setup, revisions] = await Promise.all([getSetup(user, params.id), listSetupRevisions(user, params.id)]);
	return {
		setup: { id: setup.id, title: setup.title, subject: setup.subject, revisionNumber: setup.revisionNumber },
		revisions: revisions.map((r) => ({
			number: r.number,
			authorName: r.authorName,
			createdAt: r.createdAt,
			message: r.message,
			restoredFrom: r.restoredFrom,
			hasThumbnail: r.hasThumbnail
		})),
		canEdit: setup.canEdit
	};
}

export const actions = {
	/** A new revision that copies an older one; refused if someone saved since the page was loaded. */
	restore: async ({ request, params, locals }) => {
		const form = await request.formData();
		const n = Number(form.get('revision'));
		const latest = Number(form.get('latestRevision'));
		if (!Number.isInteger(n) || n < 1) return fail(400, { action: 'restore', errors: { form: 'Pick a revision to restore.' } as Record<string, string> });
		const baseRevision = Number.isInteger(latest) && latest >= 1 ? latest : undefined;
		try {
			const { revisionNumber } = await restoreRevision(locals.user, params.id, n, { baseRevision });
			return { action: 'restore', restored: n, revisionNumber };
		} catch (e) {
			// A refusal (401, 403, 404) goes on to SvelteKit's error page, as for any page.
			if (!(e instanceof StaleRevisionError)) throw e;
			return fail(409, {
				action: 'restore',
				errors: {
					form: `Not restored: someone saved revision ${e.latestRevision} while this page was open. The list now shows it; look at what changed, then restore again if you still want revision ${n}.`
				} as Record<string, string>
			});
		}
	}
};
