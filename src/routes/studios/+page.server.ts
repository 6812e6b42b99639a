import { fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { studioNameSchema } from '$lib/schemas/account';
import { createStudio, myStudios } from '$lib/server/studios';

export async function load({ locals, url }) {
	requireUser(locals.user, url);
	return { studios: await myStudios(locals.user, { withMemberCounts: true }) };
}

export const actions = {
	create: async ({ locals, request }) => {
		const parsed = studioNameSchema.safeParse((await request.formData()).get('name') ?? '');
		if (!parsed.success) return fail(400, { action: 'create', errors: { name: parsed.error.issues[0].message } });
		const studio = await createStudio(locals.user, parsed.data);
		redirect(303, `/studios/${studio.id}`);
	}
};
