// Named queries of exercises, starts and hand-ins. Services ask authz first and call these; a hand-in's
// version is numbered inside one transaction with the student's start row locked.
import { and, asc, desc, eq, inArray, isNull, max } from 'drizzle-orm';
import { db } from '../index';
import { exerciseStarts, exercises, handIns, shots, users, workshopLessons, workshopMembers, type HandIn, type NewExercise } from '../schema';

// ---------- exercises ----------

export async function findExerciseRow(id: string) {
	const [row] = await db.select().from(exercises).where(eq(exercises.id, id));
	return row ?? null;
}

export async function insertExercise(values: NewExercise) {
	const [row] = await db.insert(exercises).values(values).returning();
	return row;
}

export async function updateExerciseRow(id: string, values: Partial<Pick<NewExercise, 'title' | 'brief' | 'dueAt' | 'targets' | 'revisionNumber'>>) {
	const [row] = await db.update(exercises).set({ ...values, updatedAt: new Date() }).where(eq(exercises.id, id)).returning();
	return row ?? null;
}

export async function deleteExerciseRow(id: string) {
	await db.delete(exercises).where(eq(exercises.id, id));
}

/** A lesson's exercises, or a workshop's (with their lesson's title and place), soonest due first. */
export async function listExercises(where: { lessonId: string } | { workshopId: string }) {
	return db
		.select({ exercise: exercises, lessonTitle: workshopLessons.title, lessonPosition: workshopLessons.position })
		.from(exercises)
		.innerJoin(workshopLessons, eq(workshopLessons.id, exercises.lessonId))
		.where('lessonId' in where ? eq(exercises.lessonId, where.lessonId) : eq(exercises.workshopId, where.workshopId))
		.orderBy(asc(workshopLessons.position), asc(exercises.dueAt), asc(exercises.createdAt));
}

// ---------- starts ----------

export async function findStart(exerciseId: string, userId: string) {
	const [row] = await db.select().from(exerciseStarts).where(and(eq(exerciseStarts.exerciseId, exerciseId), eq(exerciseStarts.userId, userId)));
	return row ?? null;
}

/** The start a setup is the copy of, if any: the editor shows that exercise's brief. */
export async function findStartBySetup(setupId: string) {
	const [row] = await db.select().from(exerciseStarts).where(eq(exerciseStarts.setupId, setupId));
	return row ?? null;
}

/** Records a start; null when the student already has one (two starts at once: the first wins). */
export async function insertStart(exerciseId: string, userId: string, setupId: string) {
	const [row] = await db.insert(exerciseStarts).values({ exerciseId, userId, setupId }).onConflictDoNothing().returning();
	return row ?? null;
}

export async function replaceStartSetup(startId: string, setupId: string) {
	await db.update(exerciseStarts).set({ setupId, startedAt: new Date() }).where(eq(exerciseStarts.id, startId));
}

// ---------- hand-ins ----------

export async function findHandInRow(id: string) {
	const [row] = await db.select().from(handIns).where(eq(handIns.id, id));
	return row ?? null;
}

/**
 * Stores a hand-in as the student's next version. The student's start row is locked for the
 * transaction, so two hand-ins of one student at the same moment get versions n and n + 1, and
 * hand-ins of different students never wait for each other.
 */
export async function insertHandIn(values: Omit<typeof handIns.$inferInsert, 'version' | 'id'>): Promise<HandIn> {
	return db.transaction(async (tx) => {
		await tx
			.select({ id: exerciseStarts.id })
			.from(exerciseStarts)
			.where(and(eq(exerciseStarts.exerciseId, values.exerciseId), eq(exerciseStarts.userId, values.userId)))
			.for('update');
		const [last] = await tx
			.select({ version: max(handIns.version) })
			.from(handIns)
			.where(and(eq(handIns.exerciseId, values.exerciseId), eq(handIns.userId, values.userId)));
		const [row] = await tx
			.insert(handIns)
			.values({ ...values, version: (last?.version ?? 0) + 1 })
			.returning();
		return row;
	});
}

/** Every version of every hand-in of an exercise, newest version first within a student. */
export async function listHandIns(exerciseIds: string[], userId?: string) {
	if (!exerciseIds.length) return [];
	return db
		.select({ handIn: handIns, name: users.name, email: users.email })
		.from(handIns)
		.innerJoin(users, eq(users.id, handIns.userId))
		.where(and(inArray(handIns.exerciseId, exerciseIds), userId ? eq(handIns.userId, userId) : undefined))
		.orderBy(asc(users.email), desc(handIns.version));
}

/** The versions of one student's hand-in, newest first. */
export async function listVersions(exerciseId: string, userId: string) {
	return db
		.select({ id: handIns.id, version: handIns.version, handedInAt: handIns.handedInAt, late: handIns.late, state: handIns.state })
		.from(handIns)
		.where(and(eq(handIns.exerciseId, exerciseId), eq(handIns.userId, userId)))
		.orderBy(desc(handIns.version));
}

export async function reviewHandInRow(id: string, values: Pick<HandIn, 'state' | 'feedback' | 'reviewedById'>) {
	const [row] = await db
		.update(handIns)
		.set({ ...values, reviewedAt: new Date() })
		.where(eq(handIns.id, id))
		.returning();
	return row ?? null;
}

/** The workshop's students, for the gradebook's rows (a student with no hand-in still has a row). */
export async function listStudents(workshopId: string) {
	return db
		.select({ userId: users.id, name: users.name, email: users.email })
		.from(workshopMembers)
		.innerJoin(users, eq(users.id, workshopMembers.userId))
		.where(and(eq(workshopMembers.workshopId, workshopId), eq(workshopMembers.role, 'student')))
		.orderBy(asc(users.email));
}

/** Which of `shotIds` are live shots of the setup. */
export async function liveShotIds(setupId: string, shotIds: string[]): Promise<Set<string>> {
	if (!shotIds.length) return new Set();
	const rows = await db
		.select({ id: shots.id })
		.from(shots)
		.where(and(eq(shots.setupId, setupId), inArray(shots.id, shotIds), isNull(shots.deletedAt)));
	return new Set(rows.map((r) => r.id));
}

export async function findUser(id: string) {
	const [row] = await db.select({ id: users.id, name: users.name, email: users.email }).from(users).where(eq(users.id, id));
	return row ?? null;
}
