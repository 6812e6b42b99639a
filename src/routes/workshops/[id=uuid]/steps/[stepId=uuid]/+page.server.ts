import { error, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { myStudios } from '$lib/server/studios';
import { copyStepToStudio, lessonForViewer, stepForViewer, STEP_NOT_FOUND } from '$lib/server/workshops';
import { formAction, text } from '$lib/server/workshops/forms';
import { elementLabels } from '$lib/notebook/load';
import { copyStepSchema } from '$lib/workshops/inputs';

export async function load({ locals, params, url }) {
	const user = requireUser(locals.user, url);
	const step = await stepForViewer(user, params.stepId);
	if (step.workshopId !== params.id) error(404, STEP_NOT_FOUND);
	const [lesson, studios] = await Promise.all([lessonForViewer(user, params.id, step.lessonId), myStudios(user)]);
	const index = lesson.steps.findIndex((s) => s.id === step.id);
	return {
		step,
		labels: elementLabels(step.document),
		workshop: lesson.workshop,
		lesson: { id: lesson.lesson.id, title: lesson.lesson.title },
		index,
		count: lesson.steps.length,
		previousId: lesson.steps[index - 1]?.id ?? null,
		nextId: lesson.steps[index + 1]?.id ?? null,
		// A copy goes to a studio where the caller may edit: their personal studio first.
		studios: studios.filter((s) => s.role === 'owner' || s.role === 'editor').map((s) => ({ id: s.id, name: s.name })),
		unitSystem: user.unitSystem
	};
}

export const actions = {
	copy: async ({ locals, params, request }) => {
		const form = await request.formData();
		const raw = { studioId: text(form, 'studioId') || undefined, subject: text(form, 'subject') };
		const result = await formAction('copy', copyStepSchema, raw, (input) => copyStepToStudio(locals.user, params.stepId, input), raw);
		if (result && 'id' in result) redirect(303, `/setups/${result.id}?duplicated`);
		return result;
	}
};
