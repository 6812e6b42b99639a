import { redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { runAction } from '$lib/server/actions';
import {
	addLesson,
	addSession,
	deleteWorkshop,
	removeSession,
	reorderLessons,
	setWorkshopPrice,
	updateWorkshop,
	workshopOverview
} from '$lib/server/workshops';
import { formAction, localToIso, text } from '$lib/server/workshops/forms';
import { listExercisesFor } from '$lib/server/exercises';
import { lessonSchema, sessionSchema, workshopDetailsSchema } from '$lib/workshops/inputs';
import { priceSchema } from '$lib/seats/inputs';
import { paymentsConfigured } from '$lib/server/payments/provider';

export async function load({ locals, params, url }) {
	const user = requireUser(locals.user, url);
	const { access, ...overview } = await workshopOverview(user, params.id);
	const exercises = await listExercisesFor(user, params.id);
	return { ...overview, exercises, paymentsReady: paymentsConfigured(), can: access.can, myRole: access.workshopRole ?? access.studioRole ?? (access.isAdmin ? 'site admin' : null) };
}

export const actions = {
	details: async ({ locals, params, request }) => {
		const form = await request.formData();
		const raw = { title: text(form, 'title'), summary: text(form, 'summary'), capacity: text(form, 'capacity'), state: text(form, 'state') };
		return formAction('details', workshopDetailsSchema, raw, async (input) => {
			await updateWorkshop(locals.user, params.id, input);
			return { action: 'details', saved: true };
		}, raw);
	},
	price: async ({ locals, params, request }) => {
		const form = await request.formData();
		const raw = { amount: text(form, 'amount'), currency: text(form, 'currency') };
		return formAction('price', priceSchema, raw, async (input) => {
			await setWorkshopPrice(locals.user, params.id, input);
			return { action: 'price', saved: true };
		}, raw);
	},
	addSession: async ({ locals, params, request }) => {
		const form = await request.formData();
		const offset = text(form, 'tzOffset') || '0';
		const raw = { startsAt: localToIso(text(form, 'startsAt'), offset), endsAt: localToIso(text(form, 'endsAt'), offset), place: text(form, 'place') };
		return formAction('addSession', sessionSchema, raw, async (input) => {
			await addSession(locals.user, params.id, input);
			return { action: 'addSession', saved: true };
		}, { startsAt: text(form, 'startsAt'), endsAt: text(form, 'endsAt'), place: raw.place });
	},
	removeSession: async ({ locals, params, request }) => {
		const id = text(await request.formData(), 'sessionId');
		return runAction('removeSession', async () => {
			await removeSession(locals.user, params.id, id);
			return { action: 'removeSession', saved: true };
		});
	},
	addLesson: async ({ locals, params, request }) => {
		const form = await request.formData();
		const raw = { title: text(form, 'title') };
		const result = await formAction('addLesson', lessonSchema, raw, (input) => addLesson(locals.user, params.id, input), raw);
		if (result && 'id' in result) redirect(303, `/workshops/${params.id}/lessons/${result.id}`);
		return result;
	},
	moveLesson: async ({ locals, params, request }) => {
		const form = await request.formData();
		const order = text(form, 'order').split(',').filter(Boolean);
		return runAction('moveLesson', async () => {
			await reorderLessons(locals.user, params.id, order);
			return { action: 'moveLesson', saved: true };
		});
	},
	delete: async ({ locals, params }) => {
		const result = await runAction('delete', () => deleteWorkshop(locals.user, params.id));
		if (result && typeof result === 'object' && 'status' in result) return result;
		redirect(303, '/workshops?deleted');
	}
};
