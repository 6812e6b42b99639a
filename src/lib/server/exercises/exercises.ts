// Exercises: what must stay true (an exercise pins a revision its instructor could see, its targets
// pass their schema, a student has one copy of the start) is kept here; who may do what is asked of
// authz. Students read the starting revision through the exercise, never through the setup.
import { error } from '@sveltejs/kit';
import { authorizeExercise, authorizeWorkshop, EXERCISE_NOT_FOUND } from '$lib/server/authz';
import { RuleViolation } from '$lib/server/errors';
import type { SessionUser } from '$lib/server/session';
import type { Exercise } from '$lib/server/db/schema';
import { renderNotes } from '$lib/notebook/markdown';
import { findLesson } from '$lib/server/db/queries/workshops';
import { findRevision, findSetup, trashSetupRow } from '$lib/server/db/queries/setups';
import {
	deleteExerciseRow,
	findExerciseRow,
	findStart,
	findStartBySetup,
	insertExercise,
	insertStart,
	listExercises,
	listHandIns,
	replaceStartSetup,
	updateExerciseRow
} from '$lib/server/db/queries/exercises';
import { readStoredDocument } from '$lib/server/setups-documents';
import { duplicateRevision, personalStudioId } from '$lib/server/setups';
import { LESSON_NOT_FOUND, pinnableRevision } from '$lib/server/workshops/lessons';
import { askedText, type Target } from '$lib/light/targets';
import type { SetupDocument } from '$lib/scene/document';
import type { ExerciseCreateInput, ExerciseUpdateInput } from '$lib/exercises/inputs';
import type { ExerciseSummary } from '$lib/exercises/types';
import { isUuid } from '$lib/uuid';

export type { ExerciseSummary };

export function exerciseSummary(e: Exercise, lessonTitle: string, mine: ExerciseSummary['mine'] = null): ExerciseSummary {
	return {
		id: e.id,
		workshopId: e.workshopId,
		lessonId: e.lessonId,
		lessonTitle,
		title: e.title,
		brief: e.brief,
		briefHtml: renderNotes(e.brief),
		dueAt: e.dueAt.toISOString(),
		pastDue: Date.now() > e.dueAt.getTime(),
		setupId: e.setupId,
		revisionNumber: e.revisionNumber,
		targets: e.targets,
		targetWords: e.targets.map(askedText),
		mine
	};
}

/** A student's own start and latest hand-in of each exercise, for their lists. */
async function minesOf(user: SessionUser, exercises: Exercise[]): Promise<Map<string, NonNullable<ExerciseSummary['mine']>>> {
	const [starts, handIns] = await Promise.all([Promise.all(exercises.map((e) => findStart(e.id, user.id))), listHandIns(exercises.map((e) => e.id), user.id)]);
	const out = new Map<string, NonNullable<ExerciseSummary['mine']>>();
	exercises.forEach((e, i) => {
		const latest = handIns.find((h) => h.handIn.exerciseId === e.id)?.handIn;
		out.set(e.id, {
			setupId: starts[i]?.setupId ?? null,
			latest: latest ? { id: latest.id, version: latest.version, state: latest.state, late: latest.late } : null
		});
	});
	return out;
}

/** A lesson's exercises (or a whole workshop's) for anyone who follows it; a student's own progress beside each. */
export async function listExercisesFor(user: SessionUser | null, workshopId: string, lessonId?: string): Promise<ExerciseSummary[]> {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.follow');
	const rows = await listExercises(lessonId ? { lessonId } : { workshopId: access.workshop.id });
	const own = access.workshopRole === 'student' ? await minesOf(user!, rows.map((r) => r.exercise)) : null;
	return rows.filter((r) => r.exercise.workshopId === access.workshop.id).map((r) => exerciseSummary(r.exercise, r.lessonTitle, own?.get(r.exercise.id) ?? null));
}

/**
 * The exercise a setup is the caller's own copy of, for the editor's brief panel: null for any other
 * setup, for someone else's copy, or when the exercise is gone.
 */
export async function exerciseForSetup(user: SessionUser | null, setupId: string): Promise<ExerciseSummary | null> {
	if (!user || !isUuid(setupId)) return null;
	const start = await findStartBySetup(setupId);
	if (!start || start.userId !== user.id) return null;
	const exercise = await findExerciseRow(start.exerciseId);
	if (!exercise) return null;
	return exerciseSummary(exercise, '', { setupId, latest: null });
}

// ---------- setting exercises ----------

function checkDue(dueAt: Date) {
	if (dueAt.getTime() < Date.now() - 24 * 3600_000) throw new RuleViolation('The due date has already passed; choose a later one.', 'dueAt');
}

export async function addExercise(user: SessionUser | null, workshopId: string, lessonId: string, input: ExerciseCreateInput): Promise<Exercise> {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.run');
	const lesson = isUuid(lessonId) ? await findLesson(access.workshop.id, lessonId) : null;
	if (!lesson) error(404, LESSON_NOT_FOUND);
	if (access.workshop.state === 'archived') throw new RuleViolation('This workshop is archived: set no new exercises in it.', 'form');
	checkDue(input.dueAt);
	const pinned = await pinnableRevision(user, input.setupId, input.revisionNumber);
	return insertExercise({
		workshopId: access.workshop.id,
		lessonId: lesson.id,
		title: input.title,
		brief: input.brief,
		setupId: pinned.setup.id,
		revisionNumber: pinned.number,
		dueAt: input.dueAt,
		targets: input.targets,
		createdById: user!.id
	});
}

export async function updateExercise(user: SessionUser | null, exerciseId: string, input: ExerciseUpdateInput, workshopId?: string): Promise<Exercise> {
	const { exercise } = await authorizeExercise(user, exerciseId, 'workshop.run', workshopId);
	const row = await updateExerciseRow(exercise.id, { title: input.title, brief: input.brief, dueAt: input.dueAt, targets: input.targets });
	if (!row) error(404, EXERCISE_NOT_FOUND);
	return row;
}

/** Removes an exercise with its hand-ins; the students' copies stay in their notebooks. */
export async function removeExercise(user: SessionUser | null, exerciseId: string, workshopId?: string) {
	const { exercise } = await authorizeExercise(user, exerciseId, 'workshop.run', workshopId);
	await deleteExerciseRow(exercise.id);
}

// ---------- starting ----------

/** The starting revision's document, read through the exercise (the caller's right is settled). */
export async function startingDocument(exercise: Exercise): Promise<SetupDocument> {
	const found = await findRevision(exercise.setupId, exercise.revisionNumber);
	if (!found) error(404, 'The starting revision of this exercise is gone.');
	return readStoredDocument(found.revision.document).document;
}

/**
 * A student starts an exercise: the starting revision is duplicated into their personal studio, with
 * lineage back to it, once. Starting again opens the same copy (unless it went to the trash: then a
 * fresh copy is made). Two starts at the same moment keep the first copy and trash the other.
 */
export async function startExercise(user: SessionUser | null, exerciseId: string, workshopId?: string): Promise<{ setupId: string; created: boolean }> {
	const { exercise, access } = await authorizeExercise(user, exerciseId, 'workshop.handIn', workshopId);
	const signedIn = user!;
	const existing = await findStart(exercise.id, signedIn.id);
	if (existing) {
		const copy = await findSetup(existing.setupId);
		if (copy) return { setupId: existing.setupId, created: false };
	}
	if (access.workshop.state === 'archived') throw new RuleViolation('This workshop is archived: its exercises can no longer be started.', 'exerciseId');
	const found = await findSetup(exercise.setupId, { includeTrashed: true });
	if (!found) error(404, 'The starting setup of this exercise is gone.');
	const copy = await duplicateRevision(signedIn, found.setup, exercise.revisionNumber, {
		studioId: await personalStudioId(signedIn),
		subject: found.setup.subject || exercise.title,
		title: exercise.title
	});
	if (existing) {
		// The old copy is in the trash: the start now names the new one.
		await replaceStartSetup(existing.id, copy.id);
		return { setupId: copy.id, created: true };
	}
	const start = await insertStart(exercise.id, signedIn.id, copy.id);
	if (start) return { setupId: copy.id, created: true };
	await trashSetupRow(copy.id, signedIn.id);
	const winner = await findStart(exercise.id, signedIn.id);
	return { setupId: winner!.setupId, created: false };
}
