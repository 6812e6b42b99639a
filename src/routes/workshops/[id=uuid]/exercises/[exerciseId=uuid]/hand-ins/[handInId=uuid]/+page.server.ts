import { requireUser } from '$lib/server/authz';
import { handInPage, reviewHandIn } from '$lib/server/exercises';
import { formAction, text } from '$lib/server/workshops/forms';
import { reviewSchema } from '$lib/exercises/inputs';

export async function load({ locals, params, url }) {
	const user = requireUser(locals.user, url);
	return { ...(await handInPage(user, params.id, params.exerciseId, params.handInId)), unitSystem: user.unitSystem };
}

export const actions = {
	review: async ({ locals, params, request, url }) => {
		const form = await request.formData();
		const raw = { state: text(form, 'state'), feedback: text(form, 'feedback') };
		return formAction(
			'review',
			reviewSchema,
			raw,
			async (input) => {
				const { mailed } = await reviewHandIn(locals.user, params.id, params.exerciseId, params.handInId, input, { origin: url.origin });
				return { action: 'review', saved: true, mailed };
			},
			raw
		);
	}
};
