import { redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { listSetupsFor } from '$lib/server/setups';
import { addExercise } from '$lib/server/exercises';
import { lessonForViewer } from '$lib/server/workshops';
import { exerciseFormAction, exerciseFromForm } from '$lib/server/exercises/forms';
import { exerciseCreateSchema } from '$lib/exercises/inputs';
import { setupListQuerySchema } from '$lib/scene/inputs';
import { error } from '@sveltejs/kit';

export async function load({ locals, params, url }) {
	const user = requireUser(locals.user, url);
	const view = await lessonForViewer(user, params.id, params.lessonId);
	if (!view.can['workshop.run']) error(403, 'Your role in this workshop does not allow that (workshop.run).');
	const setups = (await listSetupsFor(user, setupListQuerySchema.parse({ pageSize: '100', sort: 'title', order: 'asc' }))).items.map((s) => ({
		id: s.id,
		title: s.title,
		studioName: s.studioName,
		revisionNumber: s.revisionNumber
	}));
	// A step's setup is the likely start: offered first.
	const fromSteps = [...new Set(view.steps.map((s) => s.setupId))];
	setups.sort((a, b) => Number(fromSteps.includes(b.id)) - Number(fromSteps.includes(a.id)));
	return { workshop: view.workshop, lesson: { id: view.lesson.id, title: view.lesson.title }, setups };
}

export const actions = {
	default: async ({ locals, params, request }) => {
		const form = await request.formData();
		const raw = exerciseFromForm(form);
		const result = await exerciseFormAction('create', exerciseCreateSchema, raw, form, (input) => addExercise(locals.user, params.id, params.lessonId, input));
		if (result && typeof result === 'object' && 'id' in result) redirect(303, `/workshops/${params.id}/exercises/${result.id}?set`);
		return result;
	}
};
