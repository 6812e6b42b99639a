import { error, fail } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { keepWhatIf, presentLesson } from '$lib/server/live/present-data';

export async function load({ params, url, locals }) {
	const user = requireUser(locals.user, url);
	const { workshop, lesson, steps, startIndex } = await presentLesson(user, params.id, params.lesson);
	return { workshop, lesson, steps, startIndex, unitSystem: user.unitSystem };
}

export const actions = {
	/** Keeps the what-if on the projector as a new revision of the step's setup. */
	keep: async ({ params, request, locals }) => {
		const user = requireUser(locals.user);
		const form = await request.formData();
		const outcome = await keepWhatIf(user, params.id, {
			stepId: String(form.get('stepId') ?? ''),
			document: String(form.get('document') ?? ''),
			message: String(form.get('message') ?? '')
		});
		if (outcome.ok) return { revisionNumber: outcome.revisionNumber };
		if (outcome.status === 401 || outcome.status === 404) error(outcome.status, outcome.message);
		return fail(outcome.status, { errors: { message: outcome.message } });
	}
};
