import { redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { runAction } from '$lib/server/actions';
import { listSetupsFor } from '$lib/server/setups';
import { listExercisesFor } from '$lib/server/exercises';
import {
	addStep,
	lessonForViewer,
	removeLesson,
	removeStep,
	reorderSteps,
	updateLesson,
	updateStep,
	useLatestRevision
} from '$lib/server/workshops';
import { formAction, text } from '$lib/server/workshops/forms';
import { setupListQuerySchema } from '$lib/scene/inputs';
import { lessonSchema, stepCreateSchema, stepOrderSchema, stepUpdateSchema } from '$lib/workshops/inputs';

export async function load({ locals, params, url }) {
	const user = requireUser(locals.user, url);
	const view = await lessonForViewer(user, params.id, params.lessonId);
	// Those who run the workshop pick a step's setup among the setups they can see.
	const setups = view.can['workshop.run']
		? (await listSetupsFor(user, setupListQuerySchema.parse({ pageSize: '100', sort: 'title', order: 'asc' }))).items.map((s) => ({
				id: s.id,
				title: s.title,
				studioName: s.studioName,
				revisionNumber: s.revisionNumber
			}))
		: [];
	const exercises = await listExercisesFor(user, params.id, view.lesson.id);
	return { ...view, setups, exercises, unitSystem: user.unitSystem };
}

/** Step forms send the shown elements as checked boxes; every other element of the revision is hidden. */
function hiddenFrom(form: FormData): string[] | undefined {
	if (!form.has('elements')) return undefined;
	const all = text(form, 'elements').split(',').filter(Boolean);
	const shown = new Set(form.getAll('shown').map(String));
	return all.filter((id) => !shown.has(id));
}

export const actions = {
	lesson: async ({ locals, params, request }) => {
		const form = await request.formData();
		const raw = { title: text(form, 'title'), studentNotes: text(form, 'studentNotes'), presenterNotes: text(form, 'presenterNotes') };
		return formAction('lesson', lessonSchema, raw, async (input) => {
			await updateLesson(locals.user, params.id, params.lessonId, input);
			return { action: 'lesson', saved: true };
		}, raw);
	},
	removeLesson: async ({ locals, params }) => {
		const result = await runAction('removeLesson', () => removeLesson(locals.user, params.id, params.lessonId));
		if (result && typeof result === 'object' && 'status' in result) return result;
		redirect(303, `/workshops/${params.id}`);
	},
	addStep: async ({ locals, params, request }) => {
		const form = await request.formData();
		const raw = { setupId: text(form, 'setupId'), revisionNumber: text(form, 'revisionNumber') || undefined, caption: text(form, 'caption') };
		return formAction('addStep', stepCreateSchema, raw, async (input) => {
			const step = await addStep(locals.user, params.id, params.lessonId, input);
			return { action: 'addStep', saved: true, stepId: step.id };
		}, raw);
	},
	saveStep: async ({ locals, request }) => {
		const form = await request.formData();
		const stepId = text(form, 'stepId');
		const raw = { caption: text(form, 'caption'), revisionNumber: text(form, 'revisionNumber') || undefined, hiddenElementIds: hiddenFrom(form) };
		const result = await formAction('saveStep', stepUpdateSchema, raw, async (input) => {
			await updateStep(locals.user, stepId, input);
			return { action: 'saveStep', saved: true, stepId };
		}, { ...raw, stepId });
		return withStep(result, stepId);
	},
	latest: async ({ locals, request }) => {
		const stepId = text(await request.formData(), 'stepId');
		const result = await runAction('latest', async () => {
			const step = await useLatestRevision(locals.user, stepId);
			return { action: 'latest', saved: true, stepId, revisionNumber: step.revisionNumber };
		});
		return withStep(result, stepId);
	},
	removeStep: async ({ locals, request }) => {
		const stepId = text(await request.formData(), 'stepId');
		return runAction('removeStep', async () => {
			await removeStep(locals.user, stepId);
			return { action: 'removeStep', saved: true };
		});
	},
	reorder: async ({ locals, params, request }) => {
		const form = await request.formData();
		const raw = { stepIds: text(form, 'order').split(',').filter(Boolean) };
		return formAction('reorder', stepOrderSchema, raw, async (input) => {
			await reorderSteps(locals.user, params.id, params.lessonId, input.stepIds);
			return { action: 'reorder', saved: true };
		});
	}
};

/** A step form's failure says which step it was about, so the page puts the message on that step. */
function withStep<T>(result: T, stepId: string): T {
	const failure = result as { status?: number; data?: Record<string, unknown> };
	if (failure && typeof failure === 'object' && 'status' in failure && failure.data) failure.data.stepId = stepId;
	return result;
}
