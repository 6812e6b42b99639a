// Hand-ins: a student hands in a pinned revision of their own copy of the exercise, with shots and a
// note; the targets are evaluated here from the stored revision (never from numbers a browser sends)
// and stored with it. Instructors review; the student is told by e-mail. Who may see what is authz's.
import { error, isHttpError } from '@sveltejs/kit';
import { authorizeExercise, authorizeHandIn, authorizeSetup, authorizeWorkshop } from '$lib/server/authz';
import { RuleViolation } from '$lib/server/errors';
import type { SessionUser } from '$lib/server/session';
import type { Exercise, HandIn } from '$lib/server/db/schema';
import { renderNotes } from '$lib/notebook/markdown';
import { compareDocuments, comparisonSentences, type Comparison } from '$lib/notebook/compare';
import { findRevision } from '$lib/server/db/queries/setups';
import {
	findStart,
	findUser,
	insertHandIn,
	listExercises,
	listHandIns,
	listStudents,
	listVersions,
	liveShotIds,
	reviewHandInRow
} from '$lib/server/db/queries/exercises';
import { readStoredDocument } from '$lib/server/setups-documents';
import { shotViewsFor, type ShotView } from '$lib/server/shots';
import { sendMail } from '$lib/server/mail';
import { handInReviewedLetter } from '$lib/server/mail/letters';
import { evaluateTargets, type TargetResult } from '$lib/light/targets';
import type { SetupDocument } from '$lib/scene/document';
import type { HandInInput, ReviewInput } from '$lib/exercises/inputs';
import { STATE_WORDS, type HandInState } from '$lib/exercises/states';
import { exerciseSummary, startingDocument, type ExerciseSummary } from './exercises';
import type { HandInRow } from '$lib/exercises/types';

export const handInPath = (h: Pick<HandIn, 'id' | 'exerciseId'>, workshopId: string) => `/workshops/${workshopId}/exercises/${h.exerciseId}/hand-ins/${h.id}`;

// ---------- handing in ----------

/**
 * Hands in revision `input.revisionNumber` (the latest by default) of the student's copy. Refused,
 * naming the field: a setup that is not the caller's copy of this exercise, a revision it does not
 * have or that fails today's checks, a shot not of that setup, a workshop that is archived. Before
 * the due date it is a new version; after it, the new version is marked late.
 */
export async function handIn(user: SessionUser | null, exerciseId: string, input: HandInInput, workshopId?: string): Promise<HandIn> {
	const { exercise, access } = await authorizeExercise(user, exerciseId, 'workshop.handIn', workshopId);
	const signedIn = user!;
	if (access.workshop.state === 'archived') throw new RuleViolation('This workshop is archived: it takes no more hand-ins.', 'exerciseId');
	const start = await findStart(exercise.id, signedIn.id);
	let setup;
	try {
		({ setup } = await authorizeSetup(signedIn, input.setupId, 'setups.view'));
	} catch (e) {
		if (isHttpError(e) && e.status === 404) throw new RuleViolation('No setup of yours has this id.', 'setupId');
		throw e;
	}
	if (!start || start.setupId !== setup.id) {
		throw new RuleViolation(`“${setup.title}” was not started from this exercise: start the exercise, work on its copy, and hand that in.`, 'setupId');
	}
	const number = input.revisionNumber ?? setup.latestRevision;
	const found = await findRevision(setup.id, number);
	if (!found) throw new RuleViolation(`“${setup.title}” has no revision ${number}: its revisions are 1 to ${setup.latestRevision}.`, 'revisionNumber');
	const read = readStoredDocument(found.revision.document);
	if (read.documentIssues) throw new RuleViolation(`Revision ${number} does not pass today's checks and cannot be handed in.`, 'revisionNumber');
	const shotIds = [...new Set(input.shotIds)];
	const live = await liveShotIds(setup.id, shotIds);
	const foreign = shotIds.filter((id) => !live.has(id));
	if (foreign.length) throw new RuleViolation(`${foreign.length === 1 ? 'A shot is' : `${foreign.length} shots are`} not shots of “${setup.title}” (or are in the trash).`, 'shotIds');
	const targetResults = evaluateTargets(exercise.targets, read.document.scene);
	return insertHandIn({
		exerciseId: exercise.id,
		userId: signedIn.id,
		setupId: setup.id,
		revisionNumber: number,
		shotIds,
		note: input.note,
		late: Date.now() > exercise.dueAt.getTime(),
		targets: exercise.targets,
		targetResults,
		targetsMet: targetResults.filter((r) => r.met === true).length
	});
}

// ---------- reading ----------

export type { HandInRow };

function rowsOf(exercise: Exercise, students: { userId: string; name: string | null; email: string }[], all: Awaited<ReturnType<typeof listHandIns>>): HandInRow[] {
	const latest = new Map<string, HandIn>();
	for (const h of all) if (h.handIn.exerciseId === exercise.id && !latest.has(h.handIn.userId)) latest.set(h.handIn.userId, h.handIn);
	// Someone who handed in and has since left the workshop keeps a row.
	const people = [...students];
	for (const h of all) if (h.handIn.exerciseId === exercise.id && !people.some((p) => p.userId === h.handIn.userId)) people.push({ userId: h.handIn.userId, name: h.name, email: h.email });
	return people.map((p) => {
		const h = latest.get(p.userId);
		return {
			userId: p.userId,
			name: p.name,
			email: p.email,
			handInId: h?.id ?? null,
			version: h?.version ?? null,
			handedInAt: h?.handedInAt.toISOString() ?? null,
			late: h?.late ?? false,
			targetsMet: h?.targetsMet ?? null,
			targetsTotal: h ? h.targetResults.length : null,
			state: h?.state ?? null
		};
	});
}

export interface ExercisePage {
	exercise: ExerciseSummary;
	workshop: { id: string; title: string; state: string };
	startDocument: SetupDocument;
	can: { run: boolean; review: boolean; handIn: boolean };
	/** For reviewers: one row a student. */
	rows: HandInRow[] | null;
	/** For a student: their hand-ins, newest first. */
	versions: { id: string; version: number; handedInAt: string; late: boolean; state: HandInState }[];
}

/** The exercise page: the brief, the starting plan, and the table (reviewers) or one's own hand-ins (a student). */
export async function exercisePage(user: SessionUser | null, workshopId: string, exerciseId: string): Promise<ExercisePage> {
	const { exercise, access } = await authorizeExercise(user, exerciseId, 'workshop.follow', workshopId);
	const lessons = await listExercises({ lessonId: exercise.lessonId });
	const lessonTitle = lessons[0]?.lessonTitle ?? '';
	const review = access.can['workshop.review'];
	const student = access.can['workshop.handIn'];
	const [startDocument, start, rows, versions] = await Promise.all([
		startingDocument(exercise),
		student ? findStart(exercise.id, user!.id) : null,
		review ? Promise.all([listStudents(access.workshop.id), listHandIns([exercise.id])]).then(([s, h]) => rowsOf(exercise, s, h)) : null,
		student ? listVersions(exercise.id, user!.id) : []
	]);
	const mine = student
		? { setupId: start?.setupId ?? null, latest: versions[0] ? { id: versions[0].id, version: versions[0].version, state: versions[0].state, late: versions[0].late } : null }
		: null;
	return {
		exercise: exerciseSummary(exercise, lessonTitle, mine),
		workshop: { id: access.workshop.id, title: access.workshop.title, state: access.workshop.state },
		startDocument,
		can: { run: access.can['workshop.run'], review, handIn: student },
		rows,
		versions: versions.map((v) => ({ ...v, handedInAt: v.handedInAt.toISOString() }))
	};
}

export interface HandInPage {
	exercise: ExerciseSummary;
	workshop: { id: string; title: string };
	student: { name: string | null; email: string };
	handIn: {
		id: string;
		version: number;
		setupId: string;
		revisionNumber: number;
		note: string;
		noteHtml: string;
		late: boolean;
		handedInAt: string;
		state: HandInState;
		stateWords: string;
		feedback: string;
		feedbackHtml: string;
		reviewedAt: string | null;
		targetResults: TargetResult[];
		targetsMet: number;
	};
	versions: { id: string; version: number; handedInAt: string; late: boolean; state: HandInState }[];
	startDocument: SetupDocument;
	handedDocument: SetupDocument;
	comparison: Comparison;
	sentences: string[];
	shots: ShotView[];
	own: boolean;
	canReview: boolean;
}

/** One hand-in: its student or a reviewer; 404 for anyone else and under another exercise or workshop. */
export async function handInPage(user: SessionUser | null, workshopId: string, exerciseId: string, handInId: string): Promise<HandInPage> {
	const { handIn: h, exercise, access, own, canReview } = await authorizeHandIn(user, handInId, 'read', { workshopId, exerciseId });
	const [startDocument, handed, student, versions, shotViews, lessons] = await Promise.all([
		startingDocument(exercise),
		findRevision(h.setupId, h.revisionNumber),
		findUser(h.userId),
		listVersions(exercise.id, h.userId),
		shotViewsFor(h.setupId, h.shotIds),
		listExercises({ lessonId: exercise.lessonId })
	]);
	if (!handed) error(404, 'The handed-in revision is gone.');
	const handedDocument = readStoredDocument(handed.revision.document).document;
	const comparison = compareDocuments(startDocument, handedDocument, { unitSystem: user!.unitSystem });
	const base = handInPath(h, access.workshop.id);
	// Shot images through the hand-in: a reviewer has no right on the student's own studio.
	const shots = shotViews.map((s) => ({
		...s,
		images: { original: `${base}/shots/${s.id}/original`, preview: `${base}/shots/${s.id}/preview`, thumbnail: `${base}/shots/${s.id}/thumbnail` }
	}));
	return {
		exercise: exerciseSummary(exercise, lessons[0]?.lessonTitle ?? ''),
		workshop: { id: access.workshop.id, title: access.workshop.title },
		student: { name: student?.name ?? null, email: student?.email ?? '' },
		handIn: {
			id: h.id,
			version: h.version,
			setupId: h.setupId,
			revisionNumber: h.revisionNumber,
			note: h.note,
			noteHtml: renderNotes(h.note),
			late: h.late,
			handedInAt: h.handedInAt.toISOString(),
			state: h.state,
			stateWords: STATE_WORDS[h.state],
			feedback: h.feedback,
			feedbackHtml: renderNotes(h.feedback),
			reviewedAt: h.reviewedAt?.toISOString() ?? null,
			targetResults: h.targetResults,
			targetsMet: h.targetsMet
		},
		versions: versions.map((v) => ({ ...v, handedInAt: v.handedInAt.toISOString() })),
		startDocument,
		handedDocument,
		comparison,
		sentences: comparisonSentences(comparison),
		shots,
		own,
		canReview
	};
}

// ---------- review ----------

/** Feedback and a state on one hand-in; the student is told by e-mail (a mail that fails does not undo the review). */
export async function reviewHandIn(
	user: SessionUser | null,
	workshopId: string,
	exerciseId: string,
	handInId: string,
	input: ReviewInput,
	context: { origin: string }
): Promise<{ handIn: HandIn; mailed: boolean }> {
	const { handIn: h, exercise, access } = await authorizeHandIn(user, handInId, 'review', { workshopId, exerciseId });
	const row = await reviewHandInRow(h.id, { state: input.state, feedback: input.feedback, reviewedById: user!.id });
	if (!row) error(404, 'No such hand-in.');
	const student = await findUser(h.userId);
	let mailed = false;
	if (student) {
		try {
			const url = `${context.origin}${handInPath(h, access.workshop.id)}`;
			await sendMail(handInReviewedLetter(student.email, url, exercise.title, user!.name || user!.email, input.state, input.feedback));
			mailed = true;
		} catch {
			mailed = false;
		}
	}
	return { handIn: row, mailed };
}

// ---------- tables ----------

/** The table of one exercise, for reviewers. */
export async function exerciseTable(user: SessionUser | null, workshopId: string, exerciseId: string) {
	const { exercise, access } = await authorizeExercise(user, exerciseId, 'workshop.review', workshopId);
	const [students, all] = await Promise.all([listStudents(access.workshop.id), listHandIns([exercise.id])]);
	return { exercise, workshop: access.workshop, rows: rowsOf(exercise, students, all) };
}

/** The workshop's whole gradebook: every exercise and every student, for reviewers. */
export async function gradebook(user: SessionUser | null, workshopId: string) {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.review');
	const exercises = (await listExercises({ workshopId: access.workshop.id })).map((r) => r.exercise);
	const [students, all] = await Promise.all([listStudents(access.workshop.id), listHandIns(exercises.map((e) => e.id))]);
	return { workshop: access.workshop, exercises: exercises.map((e) => ({ exercise: e, rows: rowsOf(e, students, all) })) };
}
