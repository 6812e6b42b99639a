import { isHttpError, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { runAction } from '$lib/server/actions';
import { exercisePage, handIn, removeExercise, startExercise, updateExercise } from '$lib/server/exercises';
import { exerciseFormAction, exerciseFromForm, formValues } from '$lib/server/exercises/forms';
import { formAction, text } from '$lib/server/workshops/forms';
import { listSetupRevisions } from '$lib/server/setups';
import { listShots } from '$lib/server/shots';
import { exerciseUpdateSchema, handInSchema } from '$lib/exercises/inputs';
import type { SessionUser } from '$lib/server/session';

/** A student's copy with its revisions and shots, to hand in from; null when it is gone to the trash. */
async function copyOf(user: SessionUser, setupId: string | null) {
	if (!setupId) return null;
	try {
		const [revisions, shots] = await Promise.all([listSetupRevisions(user, setupId), listShots(user, setupId)]);
		return {
			setupId,
			revisions: revisions.map((r) => ({ number: r.number, createdAt: r.createdAt, message: r.message })).sort((a, b) => b.number - a.number),
			shots: shots.shots.map((s) => ({ id: s.id, fileName: s.fileName, revisionNumber: s.revisionNumber, thumbnail: s.images.thumbnail }))
		};
	} catch (e) {
		if (isHttpError(e) && e.status === 404) return null;
		throw e;
	}
}

export async function load({ locals, params, url }) {
	const user = requireUser(locals.user, url);
	const page = await exercisePage(user, params.id, params.exerciseId);
	const copy = page.can.handIn ? await copyOf(user, page.exercise.mine?.setupId ?? null) : null;
	return { ...page, copy, unitSystem: user.unitSystem };
}

export const actions = {
	start: async ({ locals, params }) => {
		const result = await runAction('start', () => startExercise(locals.user, params.exerciseId, params.id));
		if (result && typeof result === 'object' && 'setupId' in result) redirect(303, `/setups/${result.setupId}${result.created ? '?started' : ''}#plan`);
		return result;
	},
	handIn: async ({ locals, params, request }) => {
		const form = await request.formData();
		const raw = {
			setupId: text(form, 'setupId'),
			revisionNumber: text(form, 'revisionNumber') || undefined,
			shotIds: form.getAll('shotIds').map(String),
			note: text(form, 'note')
		};
		return formAction(
			'handIn',
			handInSchema,
			raw,
			async (input) => {
				const row = await handIn(locals.user, params.exerciseId, input, params.id);
				return { action: 'handIn', saved: true, version: row.version, late: row.late, handInId: row.id };
			},
			formValues(form)
		);
	},
	update: async ({ locals, params, request }) => {
		const form = await request.formData();
		const raw = exerciseFromForm(form);
		return exerciseFormAction('update', exerciseUpdateSchema, raw, form, async (input) => {
			await updateExercise(locals.user, params.exerciseId, input, params.id);
			return { action: 'update', saved: true };
		});
	},
	remove: async ({ locals, params }) => {
		await removeExercise(locals.user, params.exerciseId, params.id);
		redirect(303, `/workshops/${params.id}`);
	}
};
