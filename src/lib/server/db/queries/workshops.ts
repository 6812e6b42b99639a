// Named queries of the workshops, their sessions, lessons, steps and live position (their people are in
// workshop-people.ts). Services ask authz first and call these; writes that touch several rows run in
// one transaction here.
import { and, asc, count, desc, eq, gt, inArray, isNull, or, sql } from 'drizzle-orm';
import { db, type Tx } from '../index';
import {
	seatBookings,
	setupRevisions,
	setups,
	studios,
	workshopLessons,
	workshopMembers,
	workshopSessions,
	workshopSteps,
	workshops,
	type NewWorkshop
} from '../schema';
import { inStudiosOf, type StudioFilter } from './visibility';

export type Runner = typeof db | Tx;

// ---------- workshops ----------

export async function insertWorkshop(values: NewWorkshop) {
	const [row] = await db.insert(workshops).values(values).returning();
	return row;
}

export async function slugTaken(slug: string): Promise<boolean> {
	const [row] = await db.select({ id: workshops.id }).from(workshops).where(eq(workshops.slug, slug));
	return Boolean(row);
}

/** Workshops the caller runs (through the studio) or belongs to (instructor or student), newest first. */
export async function listWorkshopsFor(userId: string, runs: StudioFilter) {
	const mine = db.select({ id: workshopMembers.workshopId }).from(workshopMembers).where(eq(workshopMembers.userId, userId));
	const throughStudio = runs === 'all' ? sql`true` : inStudiosOf(workshops.studioId, runs);
	return db
		.select({
			id: workshops.id,
			title: workshops.title,
			state: workshops.state,
			slug: workshops.slug,
			capacity: workshops.capacity,
			studioId: workshops.studioId,
			studioName: studios.name,
			role: workshopMembers.role,
			firstSession: sql<Date | null>`(select min(${workshopSessions.startsAt}) from ${workshopSessions} where ${workshopSessions.workshopId} = ${workshops.id})`.mapWith(
				(v) => (v ? new Date(v) : null)
			)
		})
		.from(workshops)
		.innerJoin(studios, eq(studios.id, workshops.studioId))
		.leftJoin(workshopMembers, and(eq(workshopMembers.workshopId, workshops.id), eq(workshopMembers.userId, userId)))
		.where(and(isNull(studios.deletedAt), or(throughStudio, inArray(workshops.id, mine))))
		.orderBy(desc(workshops.createdAt));
}

export async function findPublishedWorkshopBySlug(slug: string) {
	const [row] = await db
		.select({ workshop: workshops, studioName: studios.name })
		.from(workshops)
		.innerJoin(studios, eq(studios.id, workshops.studioId))
		.where(and(eq(workshops.slug, slug), eq(workshops.state, 'published'), isNull(studios.deletedAt)));
	return row ?? null;
}

export async function countStudents(workshopId: string, run: Runner = db): Promise<number> {
	const [row] = await run
		.select({ n: count() })
		.from(workshopMembers)
		.where(and(eq(workshopMembers.workshopId, workshopId), eq(workshopMembers.role, 'student')));
	return row?.n ?? 0;
}

/** Seats held for buyers at checkout whose hold has not run out (each keeps a seat until then). */
export async function countActiveHolds(workshopId: string, run: Runner = db, exceptBookingId: string | null = null): Promise<number> {
	const [row] = await run
		.select({ n: count() })
		.from(seatBookings)
		.where(
			and(
				eq(seatBookings.workshopId, workshopId),
				eq(seatBookings.state, 'held'),
				gt(seatBookings.holdExpiresAt, sql`now()`),
				exceptBookingId ? sql`${seatBookings.id} <> ${exceptBookingId}` : undefined
			)
		);
	return row?.n ?? 0;
}

/** Seats taken: the students, and the seats held for buyers at checkout. */
export async function countSeatsTaken(workshopId: string, run: Runner = db, exceptBookingId: string | null = null) {
	const [students, held] = await Promise.all([countStudents(workshopId, run), countActiveHolds(workshopId, run, exceptBookingId)]);
	return { students, held, taken: students + held };
}

/**
 * Changes a workshop's details, refusing a capacity below the seats already taken (students and seats
 * held at checkout): the count and the update run in one transaction with the workshop row locked, so
 * an acceptance or a booking cannot slip between.
 */
export async function updateWorkshopDetails(
	workshopId: string,
	values: { title: string; summary: string; capacity: number; state: 'draft' | 'published' | 'archived' }
): Promise<{ outcome: 'ok' } | { outcome: 'below-enrolled'; enrolled: number; held: number } | { outcome: 'no-sessions' }> {
	return db.transaction(async (tx) => {
		await tx.select({ id: workshops.id }).from(workshops).where(eq(workshops.id, workshopId)).for('update');
		const seats = await countSeatsTaken(workshopId, tx);
		if (values.capacity < seats.taken) return { outcome: 'below-enrolled' as const, enrolled: seats.students, held: seats.held };
		if (values.state === 'published') {
			const [s] = await tx.select({ n: count() }).from(workshopSessions).where(eq(workshopSessions.workshopId, workshopId));
			if (!s?.n) return { outcome: 'no-sessions' as const };
		}
		await tx.update(workshops).set({ ...values, updatedAt: new Date() }).where(eq(workshops.id, workshopId));
		return { outcome: 'ok' as const };
	});
}

export async function deleteWorkshopRow(workshopId: string) {
	await db.delete(workshops).where(eq(workshops.id, workshopId));
}

// ---------- sessions ----------

export async function listSessions(workshopId: string) {
	return db.select().from(workshopSessions).where(eq(workshopSessions.workshopId, workshopId)).orderBy(asc(workshopSessions.startsAt));
}

export async function insertSession(workshopId: string, values: { startsAt: Date; endsAt: Date; place: string }) {
	const [row] = await db.insert(workshopSessions).values({ workshopId, ...values }).returning();
	return row;
}

/** Removes a session unless it is the last of a published workshop. */
export async function deleteSessionRow(workshopId: string, sessionId: string): Promise<'ok' | 'missing' | 'last-published'> {
	return db.transaction(async (tx) => {
		const [w] = await tx.select({ state: workshops.state }).from(workshops).where(eq(workshops.id, workshopId)).for('update');
		const rows = await tx.select({ id: workshopSessions.id }).from(workshopSessions).where(eq(workshopSessions.workshopId, workshopId));
		if (!rows.some((r) => r.id === sessionId)) return 'missing';
		if (w?.state === 'published' && rows.length === 1) return 'last-published';
		await tx.delete(workshopSessions).where(eq(workshopSessions.id, sessionId));
		return 'ok';
	});
}

// ---------- lessons ----------

export async function listLessons(workshopId: string) {
	return db
		.select({
			id: workshopLessons.id,
			position: workshopLessons.position,
			title: workshopLessons.title,
			stepCount: count(workshopSteps.id)
		})
		.from(workshopLessons)
		.leftJoin(workshopSteps, eq(workshopSteps.lessonId, workshopLessons.id))
		.where(eq(workshopLessons.workshopId, workshopId))
		.groupBy(workshopLessons.id)
		.orderBy(asc(workshopLessons.position), asc(workshopLessons.createdAt));
}

export async function findLesson(workshopId: string, lessonId: string) {
	const [row] = await db
		.select()
		.from(workshopLessons)
		.where(and(eq(workshopLessons.id, lessonId), eq(workshopLessons.workshopId, workshopId)));
	return row ?? null;
}

export async function insertLesson(workshopId: string, values: { title: string; studentNotes: string; presenterNotes: string }) {
	return db.transaction(async (tx) => {
		await tx.select({ id: workshops.id }).from(workshops).where(eq(workshops.id, workshopId)).for('update');
		const [last] = await tx
			.select({ max: sql<number | null>`max(${workshopLessons.position})` })
			.from(workshopLessons)
			.where(eq(workshopLessons.workshopId, workshopId));
		const [row] = await tx
			.insert(workshopLessons)
			.values({ workshopId, position: (last?.max ?? -1) + 1, ...values })
			.returning();
		return row;
	});
}

export async function updateLessonRow(lessonId: string, values: { title: string; studentNotes: string; presenterNotes: string }) {
	await db.update(workshopLessons).set(values).where(eq(workshopLessons.id, lessonId));
}

export async function deleteLessonRow(lessonId: string) {
	await db.delete(workshopLessons).where(eq(workshopLessons.id, lessonId));
}

/**
 * Rewrites the order of a workshop's lessons in one transaction. The list must name exactly the
 * workshop's lessons, each once; anything else changes nothing.
 */
export async function reorderLessonRows(workshopId: string, lessonIds: string[]): Promise<'ok' | 'mismatch'> {
	return db.transaction(async (tx) => {
		const rows = await tx.select({ id: workshopLessons.id }).from(workshopLessons).where(eq(workshopLessons.workshopId, workshopId)).for('update');
		return writeOrder(rows, lessonIds, (id, position) => tx.update(workshopLessons).set({ position }).where(eq(workshopLessons.id, id)));
	});
}

/** Gives each id its place in `given`, once `given` is known to name exactly the locked `rows`, each once. */
async function writeOrder(rows: { id: string }[], given: string[], write: (id: string, position: number) => Promise<unknown>): Promise<'ok' | 'mismatch'> {
	if (!sameSet(rows.map((r) => r.id), given)) return 'mismatch';
	for (const [position, id] of given.entries()) await write(id, position);
	return 'ok';
}

function sameSet(have: string[], given: string[]): boolean {
	return have.length === given.length && new Set(given).size === given.length && given.every((id) => have.includes(id));
}

// ---------- steps ----------

const stepColumns = {
	id: workshopSteps.id,
	lessonId: workshopSteps.lessonId,
	position: workshopSteps.position,
	setupId: workshopSteps.setupId,
	revisionNumber: workshopSteps.revisionNumber,
	hiddenElementIds: workshopSteps.hiddenElementIds,
	caption: workshopSteps.caption,
	setupTitle: setupRevisions.title,
	setupLatestRevision: setups.latestRevision,
	document: setupRevisions.document
};

/** A lesson's steps in order, each with its pinned revision's document and catalogue title. */
export async function listStepsWithRevisions(lessonIds: string[]) {
	if (!lessonIds.length) return [];
	return db
		.select(stepColumns)
		.from(workshopSteps)
		.innerJoin(setups, eq(setups.id, workshopSteps.setupId))
		.innerJoin(
			setupRevisions,
			and(eq(setupRevisions.setupId, workshopSteps.setupId), eq(setupRevisions.number, workshopSteps.revisionNumber))
		)
		.where(inArray(workshopSteps.lessonId, lessonIds))
		.orderBy(asc(workshopSteps.position), asc(workshopSteps.createdAt));
}
export type StepRow = Awaited<ReturnType<typeof listStepsWithRevisions>>[number];

/** One step with the workshop and lesson it belongs to. */
export async function findStepPlace(stepId: string) {
	const [row] = await db
		.select({ stepId: workshopSteps.id, lessonId: workshopLessons.id, workshopId: workshopLessons.workshopId })
		.from(workshopSteps)
		.innerJoin(workshopLessons, eq(workshopLessons.id, workshopSteps.lessonId))
		.where(eq(workshopSteps.id, stepId));
	return row ?? null;
}

export async function findStepWithRevision(stepId: string) {
	const [row] = await db
		.select(stepColumns)
		.from(workshopSteps)
		.innerJoin(setups, eq(setups.id, workshopSteps.setupId))
		.innerJoin(
			setupRevisions,
			and(eq(setupRevisions.setupId, workshopSteps.setupId), eq(setupRevisions.number, workshopSteps.revisionNumber))
		)
		.where(eq(workshopSteps.id, stepId));
	return row ?? null;
}

export async function insertStep(
	lessonId: string,
	values: { setupId: string; revisionNumber: number; hiddenElementIds: string[]; caption: string }
) {
	return db.transaction(async (tx) => {
		await tx.select({ id: workshopLessons.id }).from(workshopLessons).where(eq(workshopLessons.id, lessonId)).for('update');
		const [last] = await tx
			.select({ max: sql<number | null>`max(${workshopSteps.position})`, n: count() })
			.from(workshopSteps)
			.where(eq(workshopSteps.lessonId, lessonId));
		const [row] = await tx
			.insert(workshopSteps)
			.values({ lessonId, position: (last?.max ?? -1) + 1, ...values })
			.returning();
		return { row, count: (last?.n ?? 0) + 1 };
	});
}

export async function updateStepRow(
	stepId: string,
	values: Partial<{ revisionNumber: number; hiddenElementIds: string[]; caption: string }>
) {
	await db.update(workshopSteps).set(values).where(eq(workshopSteps.id, stepId));
}

export async function deleteStepRow(stepId: string) {
	await db.delete(workshopSteps).where(eq(workshopSteps.id, stepId));
}

/**
 * Rewrites the order of a lesson's steps in one transaction. The list must name exactly the lesson's
 * steps, each once: a step of another lesson, a missing or a repeated one changes nothing.
 */
export async function reorderStepRows(lessonId: string, stepIds: string[]): Promise<'ok' | 'mismatch'> {
	return db.transaction(async (tx) => {
		const rows = await tx.select({ id: workshopSteps.id }).from(workshopSteps).where(eq(workshopSteps.lessonId, lessonId)).for('update');
		return writeOrder(rows, stepIds, (id, position) => tx.update(workshopSteps).set({ position }).where(eq(workshopSteps.id, id)));
	});
}

// ---------- live position ----------

export async function setLivePosition(workshopId: string, lessonId: string | null, stepId: string | null) {
	const [row] = await db
		.update(workshops)
		.set({ liveLessonId: lessonId, liveStepId: stepId, liveUpdatedAt: new Date() })
		.where(eq(workshops.id, workshopId))
		.returning({ liveLessonId: workshops.liveLessonId, liveStepId: workshops.liveStepId, liveUpdatedAt: workshops.liveUpdatedAt });
	return row ?? null;
}
