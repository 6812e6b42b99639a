/**
 * What the present view, the presenter window and the follow page read and write, through the
 * workshop services (`$lib/server/workshops/`: authz, lessons, the live position) and the setups
 * service. Each function asks authz first; anything the caller may not see is a 404.
 */
import { error } from '@sveltejs/kit';
import { authorizeWorkshop } from '$lib/server/authz';
import type { SessionUser } from '$lib/server/session';
import { attempt, parseInput } from '$lib/server/actions';
import { getSetup, saveSetup } from '$lib/server/setups';
import { lessonForViewer, stepForViewer, workshopLessonsForViewer, type LessonView, type StepView } from '$lib/server/workshops/lessons';
import { setLiveStep } from '$lib/server/workshops/live-position';
import { setupSaveSchema } from '$lib/scene/inputs';
import type { LivePosition } from '$lib/present/live-message';
import type { PresenterStep, PresentStep } from '$lib/present/present.svelte';
import { positionOf, publishLivePosition, readLivePositions } from './index';

/** A step as the browser gets it: the whole pinned revision and which of its elements the step shows. */
function presentStep(step: StepView): PresentStep {
	return {
		id: step.id,
		caption: step.caption,
		setupId: step.setupId,
		setupTitle: step.setupTitle,
		revisionNumber: step.revisionNumber,
		document: step.revisionDocument,
		visibleIds: step.visibleElementIds
	};
}

function lessonHeader(view: LessonView) {
	return { workshop: { id: view.workshop.id, title: view.workshop.title }, lesson: { id: view.lesson.id, title: view.lesson.title } };
}

/**
 * The present view of a lesson, for those who run the workshop (404 for a stranger, 403 for a
 * student). It starts on the live step when that step is in this lesson.
 */
export async function presentLesson(user: SessionUser, workshopId: string, lessonId: string) {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.run');
	const view = await lessonForViewer(user, workshopId, lessonId);
	const steps = view.steps.map(presentStep);
	const live = access.workshop.liveStepId;
	const startIndex = Math.max(0, steps.findIndex((s) => s.id === live));
	return { ...lessonHeader(view), steps, startIndex };
}

/** The presenter window: the lesson's presenter notes and each step's caption and what it shows. */
export async function presenterLesson(user: SessionUser, workshopId: string, lessonId: string) {
	await authorizeWorkshop(user, workshopId, 'workshop.run');
	const view = await lessonForViewer(user, workshopId, lessonId);
	const labels = (step: StepView) => {
		const visible = new Set(step.visibleElementIds);
		return step.elements.filter((e) => visible.has(e.id) && !e.attachedTo && e.kind !== 'label').map((e) => e.label);
	};
	const steps: PresenterStep[] = view.steps.map((s) => ({ id: s.id, caption: s.caption, setupTitle: s.setupTitle, revisionNumber: s.revisionNumber, shows: labels(s) }));
	return { ...lessonHeader(view), steps, notesHtml: view.lesson.presenterNotesHtml ?? '' };
}

/** The follow page: every lesson and step of the workshop, as a student may see them. */
export async function followWorkshop(user: SessionUser, workshopId: string) {
	const lessons = await workshopLessonsForViewer(user, workshopId);
	const access = await authorizeWorkshop(user, workshopId, 'workshop.follow');
	return {
		workshop: { id: access.workshop.id, title: access.workshop.title },
		lessons: lessons.map((l) => ({ id: l.lesson.id, title: l.lesson.title, steps: l.steps.map(presentStep) }))
	};
}

/** Refuses a caller who may not follow the workshop (404; 401 signed out). */
export async function mayFollow(user: SessionUser, workshopId: string): Promise<void> {
	await authorizeWorkshop(user, workshopId, 'workshop.follow');
}

/** Where the workshop's live session stands now, for a follower (read with the caller's authz). */
export async function livePosition(user: SessionUser, workshopId: string): Promise<LivePosition> {
	const { workshop } = await authorizeWorkshop(user, workshopId, 'workshop.follow');
	return positionOf(workshop);
}

/** The instructor moved (null: stopped presenting): store it, then tell every app server. */
export async function moveLive(user: SessionUser, workshopId: string, stepId: string | null): Promise<LivePosition> {
	const moved = await setLiveStep(user, workshopId, stepId);
	const position: LivePosition | undefined = moved
		? { workshopId, lessonId: moved.lessonId, stepId: moved.stepId, at: Date.parse(moved.updatedAt) }
		: (await readLivePositions([workshopId]))[0];
	if (!position) error(404, 'No such workshop.');
	await publishLivePosition(position);
	return position;
}

export type KeepOutcome = { ok: true; revisionNumber: number } | { ok: false; status: number; message: string };

/**
 * "Keep as a new revision": the what-if shown on the projector, saved with the instructor's note as a
 * new revision of the step's setup on top of its latest revision (the step keeps its pin). Needs the
 * right to run the workshop and to edit the setup.
 */
export async function keepWhatIf(user: SessionUser, workshopId: string, input: { stepId: string; document: string; message: string }): Promise<KeepOutcome> {
	await authorizeWorkshop(user, workshopId, 'workshop.run');
	const step = await stepForViewer(user, input.stepId);
	if (step.workshopId !== workshopId) error(404, 'No such step.');
	let document: unknown;
	try {
		document = JSON.parse(input.document);
	} catch {
		return { ok: false, status: 400, message: 'document: is not the plan of the step (not JSON).' };
	}
	const message = input.message.trim();
	if (!message) return { ok: false, status: 400, message: 'Write a note for the revision: what does this what-if show?' };
	const outcome = await attempt(async () => {
		const setup = await getSetup(user, step.setupId);
		const parsed = parseInput(setupSaveSchema, { baseRevision: setup.revisionNumber, document, message });
		if (!parsed.ok) return parsed;
		return { ok: true as const, data: await saveSetup(user, step.setupId, parsed.data) };
	});
	if (!outcome.ok) {
		const status = outcome.status === 404 || outcome.status === 403 ? 403 : outcome.status;
		const text = status === 403 ? 'Only the setup’s editors can keep a revision of it; the what-if stays on the screen.' : outcome.message;
		return { ok: false, status, message: text };
	}
	if (!outcome.data.ok) return { ok: false, status: outcome.data.status, message: outcome.data.message };
	return { ok: true, revisionNumber: outcome.data.data.revisionNumber };
}
