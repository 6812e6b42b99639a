import { redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { runAction } from '$lib/server/actions';
import { acceptInvitation, lookUpInvitation } from '$lib/server/studios';

export async function load({ params, locals }) {
	const invitation = await lookUpInvitation(params.token);
	return { invitation, signedInAs: locals.user?.email ?? null };
}

export const actions = {
	accept: async ({ locals, params, url }) => {
		requireUser(locals.user, url);
		const result = await runAction('accept', () => acceptInvitation(locals.user, params.token));
		if (result && 'status' in result) return result;
		redirect(303, `/studios/${result.studioId}`);
	}
};
