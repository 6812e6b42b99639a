// Lessons and steps: what must stay true (a step pins a revision the instructor could see when it was
// pinned, hidden ids name the revision's own elements, a reorder names exactly the lesson's steps) is
// kept here; who may do what is asked of authz. Students read a step's pinned revision through the
// workshop (stepForViewer, lessonForViewer), never through the setup.
import { error, isHttpError } from '@sveltejs/kit';
import { authorizeSetup, authorizeWorkshop, type WorkshopCapability } from '$lib/server/authz';
import { RuleViolation } from '$lib/server/errors';
import type { SessionUser } from '$lib/server/session';
import { renderNotes } from '$lib/notebook/markdown';
import { findRevision, findSetup } from '$lib/server/db/queries/setups';
import {
	deleteLessonRow,
	deleteStepRow,
	findLesson,
	findStepPlace,
	findStepWithRevision,
	insertLesson,
	insertStep,
	listLessons,
	listStepsWithRevisions,
	reorderLessonRows,
	reorderStepRows,
	updateLessonRow,
	updateStepRow,
	type StepRow
} from '$lib/server/db/queries/workshops';
import { readStoredDocument } from '$lib/server/setups-documents';
import { duplicateRevision, personalStudioId, type DuplicateResult } from '$lib/server/setups';
import { isUuid } from '$lib/uuid';
import type { ExposureResult } from '$lib/light/scene';
import type { SetupDocument } from '$lib/scene/document';
import {
	MAX_STEPS_PER_LESSON,
	type CopyStepInput,
	type LessonInput,
	type StepCreateInput,
	type StepUpdateInput
} from '$lib/workshops/inputs';
import { stepDocument, stepElements, stepExposure, visibleElementIds, type StepElement } from '$lib/workshops/step-document';

export const LESSON_NOT_FOUND = 'No such lesson.';
export const STEP_NOT_FOUND = 'No such step.';

// ---------- what a viewer gets ----------

/** One step as its viewer may see it, the pinned revision read and the exposure worked out on what it shows. */
export interface StepView {
	id: string;
	workshopId: string;
	lessonId: string;
	/** Order in the lesson, from 0. */
	position: number;
	caption: string;
	setupId: string;
	/** The setup's title as it was at the pinned revision. */
	setupTitle: string;
	revisionNumber: number;
	/** For those who run the workshop: the setup's newest revision (to offer "use the latest revision"); null for followers. */
	latestRevision: number | null;
	/** The pinned revision's document, whole. */
	revisionDocument: SetupDocument;
	/** The document as the step shows it: hidden elements gone from the plan, the scene and the gear. */
	document: SetupDocument;
	hiddenElementIds: string[];
	visibleElementIds: string[];
	/** Every element of the revision, for the step editor's choice of what to show. */
	elements: StepElement[];
	exposure: ExposureResult | null;
	/** Why there is no exposure. */
	exposureError: string | null;
}

function stepView(row: StepRow, workshopId: string, runs: boolean): StepView {
	const read = readStoredDocument(row.document);
	const hidden = row.hiddenElementIds;
	const computed = read.documentIssues
		? ({ ok: false, message: `Revision ${row.revisionNumber} does not pass today's checks.` } as const)
		: stepExposure(read.document, hidden);
	return {
		id: row.id,
		workshopId,
		lessonId: row.lessonId,
		position: row.position,
		caption: row.caption,
		setupId: row.setupId,
		setupTitle: row.setupTitle,
		revisionNumber: row.revisionNumber,
		latestRevision: runs ? row.setupLatestRevision : null,
		revisionDocument: read.document,
		document: stepDocument(read.document, hidden),
		hiddenElementIds: hidden,
		visibleElementIds: visibleElementIds(read.document, hidden),
		elements: stepElements(read.document),
		exposure: computed.ok ? computed.result : null,
		exposureError: computed.ok ? null : computed.message
	};
}

/**
 * One step for whoever may follow its workshop (student, instructor, studio member): 404 for a step
 * that does not exist or whose workshop the caller may not see.
 */
export async function stepForViewer(user: SessionUser | null, stepId: string): Promise<StepView> {
	const place = isUuid(stepId) ? await findStepPlace(stepId) : null;
	if (!place) {
		if (!user) error(401, 'Sign in first.');
		error(404, STEP_NOT_FOUND);
	}
	const access = await authorizeWorkshop(user, place.workshopId, 'workshop.follow');
	const row = await findStepWithRevision(stepId);
	if (!row) error(404, STEP_NOT_FOUND);
	return stepView(row, place.workshopId, access.can['workshop.run']);
}

export interface LessonView {
	workshop: { id: string; title: string; studioName: string; state: string };
	lesson: {
		id: string;
		position: number;
		title: string;
		studentNotes: string;
		studentNotesHtml: string;
		/** Only for those who may read presenter notes (instructors, studio owners and editors); null otherwise. */
		presenterNotes: string | null;
		presenterNotesHtml: string | null;
	};
	/** The workshop's lessons in order, for navigation. */
	lessons: { id: string; position: number; title: string; stepCount: number }[];
	steps: StepView[];
	can: Record<WorkshopCapability, boolean>;
}

/** A lesson with its steps, for a viewer: presenter notes only for those who may read them. */
export async function lessonForViewer(user: SessionUser | null, workshopId: string, lessonId: string): Promise<LessonView> {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.follow');
	const lesson = isUuid(lessonId) ? await findLesson(access.workshop.id, lessonId) : null;
	if (!lesson) error(404, LESSON_NOT_FOUND);
	const [rows, lessons] = await Promise.all([listStepsWithRevisions([lesson.id]), listLessons(access.workshop.id)]);
	const notesForPresenter = access.can['workshop.presenterNotes'];
	return {
		workshop: { id: access.workshop.id, title: access.workshop.title, studioName: access.studioName, state: access.workshop.state },
		lesson: {
			id: lesson.id,
			position: lesson.position,
			title: lesson.title,
			studentNotes: lesson.studentNotes,
			studentNotesHtml: renderNotes(lesson.studentNotes),
			presenterNotes: notesForPresenter ? lesson.presenterNotes : null,
			presenterNotesHtml: notesForPresenter ? renderNotes(lesson.presenterNotes) : null
		},
		lessons,
		steps: rows.map((r) => stepView(r, access.workshop.id, access.can['workshop.run'])),
		can: access.can
	};
}

/** Every lesson of a workshop with its steps (the handout of the whole workshop). */
export async function workshopLessonsForViewer(user: SessionUser | null, workshopId: string): Promise<LessonView[]> {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.follow');
	const lessons = await listLessons(access.workshop.id);
	return Promise.all(lessons.map((l) => lessonForViewer(user, access.workshop.id, l.id)));
}

// ---------- lessons ----------

async function lessonToRun(user: SessionUser | null, workshopId: string, lessonId: string) {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.run');
	const lesson = isUuid(lessonId) ? await findLesson(access.workshop.id, lessonId) : null;
	if (!lesson) error(404, LESSON_NOT_FOUND);
	return { access, lesson };
}

export async function addLesson(user: SessionUser | null, workshopId: string, input: LessonInput) {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.run');
	return insertLesson(access.workshop.id, input);
}

export async function updateLesson(user: SessionUser | null, workshopId: string, lessonId: string, input: LessonInput) {
	const { lesson } = await lessonToRun(user, workshopId, lessonId);
	await updateLessonRow(lesson.id, input);
}

export async function removeLesson(user: SessionUser | null, workshopId: string, lessonId: string) {
	const { lesson } = await lessonToRun(user, workshopId, lessonId);
	await deleteLessonRow(lesson.id);
}

export async function reorderLessons(user: SessionUser | null, workshopId: string, lessonIds: string[]) {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.run');
	if ((await reorderLessonRows(access.workshop.id, lessonIds)) === 'mismatch') {
		throw new RuleViolation('The new order must name every lesson of this workshop once, and nothing else. Reload the page and try again.', 'lessonIds');
	}
}

// ---------- steps ----------

/**
 * The revision a step may pin: the setup must be one the instructor can see (anything else reads as
 * "no such setup", as authz answers everywhere) and the revision must exist.
 */
export async function pinnableRevision(user: SessionUser | null, setupId: string, revisionNumber: number | undefined) {
	let setup;
	try {
		({ setup } = await authorizeSetup(user, setupId, 'setups.view'));
	} catch (e) {
		if (isHttpError(e) && e.status === 404) throw new RuleViolation('No setup you can see has this id.', 'setupId');
		throw e;
	}
	const number = revisionNumber ?? setup.latestRevision;
	const found = await findRevision(setup.id, number);
	if (!found) {
		throw new RuleViolation(`“${setup.title}” has no revision ${number}: its revisions are 1 to ${setup.latestRevision}.`, 'revisionNumber');
	}
	const read = readStoredDocument(found.revision.document);
	if (read.documentIssues) {
		throw new RuleViolation(`Revision ${number} of “${setup.title}” does not pass today's checks and cannot be taught from.`, 'revisionNumber');
	}
	return { setup, number, document: read.document };
}

function checkHidden(document: SetupDocument, hidden: string[], revisionNumber: number) {
	const known = new Set(stepElements(document).map((e) => e.id));
	const unknown = hidden.filter((id) => !known.has(id));
	if (unknown.length) {
		throw new RuleViolation(`Revision ${revisionNumber} has no element ${unknown.map((id) => `“${id}”`).join(', ')} to hide.`, 'hiddenElementIds');
	}
	return [...new Set(hidden)];
}

async function stepToRun(user: SessionUser | null, stepId: string) {
	const place = isUuid(stepId) ? await findStepPlace(stepId) : null;
	if (!place) {
		if (!user) error(401, 'Sign in first.');
		error(404, STEP_NOT_FOUND);
	}
	const access = await authorizeWorkshop(user, place.workshopId, 'workshop.run');
	const row = await findStepWithRevision(stepId);
	if (!row) error(404, STEP_NOT_FOUND);
	return { access, row, place };
}

export async function addStep(user: SessionUser | null, workshopId: string, lessonId: string, input: StepCreateInput) {
	const { access, lesson } = await lessonToRun(user, workshopId, lessonId);
	const pinned = await pinnableRevision(user, input.setupId, input.revisionNumber);
	const hiddenElementIds = checkHidden(pinned.document, input.hiddenElementIds, pinned.number);
	const existing = await listStepsWithRevisions([lesson.id]);
	if (existing.length >= MAX_STEPS_PER_LESSON) {
		throw new RuleViolation(`A lesson has at most ${MAX_STEPS_PER_LESSON} steps.`, 'setupId');
	}
	const { row } = await insertStep(lesson.id, { setupId: pinned.setup.id, revisionNumber: pinned.number, hiddenElementIds, caption: input.caption });
	return stepForViewer(user, row.id).then((view) => ({ ...view, workshopId: access.workshop.id }));
}

/** Caption, shown elements, or the pinned revision; hidden ids are checked against the revision the step will pin. */
export async function updateStep(user: SessionUser | null, stepId: string, input: StepUpdateInput) {
	const { row } = await stepToRun(user, stepId);
	const values: Parameters<typeof updateStepRow>[1] = {};
	let document = readStoredDocument(row.document).document;
	let number = row.revisionNumber;
	if (input.revisionNumber !== undefined && input.revisionNumber !== row.revisionNumber) {
		const pinned = await pinnableRevision(user, row.setupId, input.revisionNumber);
		document = pinned.document;
		number = pinned.number;
		values.revisionNumber = pinned.number;
	}
	if (input.hiddenElementIds !== undefined) values.hiddenElementIds = checkHidden(document, input.hiddenElementIds, number);
	else if (values.revisionNumber !== undefined) {
		// Hidden elements the new revision no longer has are dropped; the rest stay hidden.
		const known = new Set(stepElements(document).map((e) => e.id));
		values.hiddenElementIds = row.hiddenElementIds.filter((id) => known.has(id));
	}
	if (input.caption !== undefined) values.caption = input.caption;
	if (Object.keys(values).length) await updateStepRow(row.id, values);
	return stepForViewer(user, row.id);
}

/** "Use the latest revision": the step pins the setup's newest revision (the instructor must still see the setup). */
export async function useLatestRevision(user: SessionUser | null, stepId: string) {
	const { row } = await stepToRun(user, stepId);
	const pinned = await pinnableRevision(user, row.setupId, undefined);
	return updateStep(user, stepId, { revisionNumber: pinned.number });
}

export async function removeStep(user: SessionUser | null, stepId: string) {
	const { row } = await stepToRun(user, stepId);
	await deleteStepRow(row.id);
}

/**
 * A lesson's steps in a new order, in one transaction: the list must name exactly this lesson's steps,
 * each once. A step of another lesson is refused and nothing moves.
 */
export async function reorderSteps(user: SessionUser | null, workshopId: string, lessonId: string, stepIds: string[]) {
	const { lesson } = await lessonToRun(user, workshopId, lessonId);
	if ((await reorderStepRows(lesson.id, stepIds)) === 'mismatch') {
		throw new RuleViolation(
			'The new order must name every step of this lesson once, and no step of another lesson. Nothing was moved; reload the page and try again.',
			'stepIds'
		);
	}
}

/**
 * A student (or anyone who follows the workshop) copies what a step shows into a studio of their own
 * to try it: the duplicate service, with lineage back to the pinned revision. The caller needs no right
 * on the setup itself; the workshop's step is the right to read that one revision.
 */
export async function copyStepToStudio(user: SessionUser | null, stepId: string, input: CopyStepInput): Promise<DuplicateResult> {
	const view = await stepForViewer(user, stepId);
	const signedIn = user!;
	const found = await findSetup(view.setupId, { includeTrashed: true });
	if (!found) error(404, STEP_NOT_FOUND);
	const setup = found.setup;
	const studioId = input.studioId ?? (await personalStudioId(signedIn));
	return duplicateRevision(
		signedIn,
		setup,
		view.revisionNumber,
		{ studioId, subject: input.subject, title: input.title ?? `${view.setupTitle} (step ${view.position + 1})` },
		(document) => stepDocument(document, view.hiddenElementIds)
	);
}
