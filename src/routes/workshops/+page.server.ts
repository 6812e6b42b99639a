import { redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { myStudios } from '$lib/server/studios';
import { createWorkshop, listMyWorkshops } from '$lib/server/workshops';
import { formAction, text } from '$lib/server/workshops/forms';
import { workshopCreateSchema } from '$lib/workshops/inputs';

export async function load({ locals, url }) {
	const user = requireUser(locals.user, url);
	const [workshops, studios] = await Promise.all([listMyWorkshops(user), myStudios(user)]);
	// Workshops are made in a studio where the caller is owner or editor.
	return { workshops, studios: studios.filter((s) => s.role === 'owner' || s.role === 'editor').map((s) => ({ id: s.id, name: s.name })) };
}

export const actions = {
	create: async ({ locals, request, url }) => {
		requireUser(locals.user, url);
		const form = await request.formData();
		const raw = { studioId: text(form, 'studioId'), title: text(form, 'title'), capacity: text(form, 'capacity') || undefined };
		const result = await formAction('create', workshopCreateSchema, raw, (input) => createWorkshop(locals.user, input), raw);
		if (result && 'id' in result) redirect(303, `/workshops/${result.id}?created`);
		return result;
	}
};
