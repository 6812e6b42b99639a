import { redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { runAction } from '$lib/server/actions';
import { acceptWorkshopInvitation, lookUpWorkshopInvitation } from '$lib/server/workshops';

export async function load({ params, locals }) {
	const invitation = await lookUpWorkshopInvitation(params.token);
	return { invitation, signedInAs: locals.user?.email ?? null };
}

export const actions = {
	accept: async ({ locals, params, url }) => {
		requireUser(locals.user, url);
		const result = await runAction('accept', () => acceptWorkshopInvitation(locals.user, params.token));
		if (result && 'status' in result) return result;
		redirect(303, `/workshops/${result.workshopId}?joined`);
	}
};
