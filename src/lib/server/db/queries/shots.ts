// Named queries for shots, their sessions and measures, flash calibrations and checklists. Callers have
// asked authz first (src/lib/server/shots.ts).
import { and, asc, desc, eq, inArray, isNotNull, isNull, sql } from 'drizzle-orm';
import { calibrationOffsetStops } from '$lib/shots/measure';
import { db, type Tx } from '../index';
import {
	flashCalibrations,
	gear,
	sessionTicks,
	shootingSessions,
	shotMeasures,
	shots,
	storageLeftovers,
	studioChecklists,
	type FlashCalibration,
	type NewFlashCalibration,
	type NewShot
} from '../schema';

export async function findShotRow(setupId: string, shotId: string) {
	const [row] = await db.select().from(shots).where(and(eq(shots.id, shotId), eq(shots.setupId, setupId)));
	return row ?? null;
}

/** A setup's shots, oldest first, live or in the trash. */
export async function listShotRows(setupId: string, { trashed = false } = {}) {
	return db
		.select()
		.from(shots)
		.where(and(eq(shots.setupId, setupId), trashed ? isNotNull(shots.deletedAt) : isNull(shots.deletedAt)))
		.orderBy(asc(shots.createdAt), asc(shots.id));
}

/** The newest measure of each of these shots. */
export async function latestMeasures(shotIds: string[]) {
	if (!shotIds.length) return new Map<string, typeof shotMeasures.$inferSelect>();
	const rows = await db.select().from(shotMeasures).where(inArray(shotMeasures.shotId, shotIds)).orderBy(desc(shotMeasures.createdAt));
	const latest = new Map<string, typeof shotMeasures.$inferSelect>();
	for (const r of rows) if (!latest.has(r.shotId)) latest.set(r.shotId, r);
	return latest;
}

export async function insertShotRow(values: NewShot, tx: Tx | typeof db = db) {
	const [row] = await tx.insert(shots).values(values).returning();
	return row;
}

export async function updateShotRow(shotId: string, values: Partial<NewShot>) {
	const [row] = await db.update(shots).set(values).where(eq(shots.id, shotId)).returning();
	return row;
}

export async function insertMeasure(values: typeof shotMeasures.$inferInsert) {
	const [row] = await db.insert(shotMeasures).values(values).returning();
	return row;
}

export async function listSessionRows(setupId: string) {
	return db.select().from(shootingSessions).where(eq(shootingSessions.setupId, setupId)).orderBy(asc(shootingSessions.shotOn), asc(shootingSessions.createdAt));
}

export async function findSessionRow(setupId: string, sessionId: string) {
	const [row] = await db
		.select()
		.from(shootingSessions)
		.where(and(eq(shootingSessions.id, sessionId), eq(shootingSessions.setupId, setupId)));
	return row ?? null;
}

export async function insertSessionRow(values: typeof shootingSessions.$inferInsert) {
	const [row] = await db.insert(shootingSessions).values(values).returning();
	return row;
}

export async function ticksOf(sessionIds: string[]) {
	if (!sessionIds.length) return [];
	return db.select().from(sessionTicks).where(inArray(sessionTicks.sessionId, sessionIds)).orderBy(asc(sessionTicks.tickedAt));
}

/** Changes a session's date or note and replaces its ticks, in one transaction. */
export async function updateSessionRow(
	sessionId: string,
	values: { shotOn?: string; note?: string },
	ticks: { items: string[]; byId: string } | null
) {
	return db.transaction(async (tx) => {
		const [row] = Object.keys(values).length
			? await tx.update(shootingSessions).set(values).where(eq(shootingSessions.id, sessionId)).returning()
			: await tx.select().from(shootingSessions).where(eq(shootingSessions.id, sessionId));
		if (ticks) {
			const kept = await tx.select().from(sessionTicks).where(eq(sessionTicks.sessionId, sessionId));
			const keep = new Set(ticks.items);
			const gone = kept.filter((t) => !keep.has(t.item)).map((t) => t.item);
			if (gone.length) await tx.delete(sessionTicks).where(and(eq(sessionTicks.sessionId, sessionId), inArray(sessionTicks.item, gone)));
			const had = new Set(kept.map((t) => t.item));
			const added = ticks.items.filter((i) => !had.has(i));
			if (added.length) await tx.insert(sessionTicks).values(added.map((item) => ({ sessionId, item, tickedById: ticks.byId })));
		}
		return row;
	});
}

export async function checklistOf(studioId: string) {
	const [row] = await db.select().from(studioChecklists).where(eq(studioChecklists.studioId, studioId));
	return row ?? null;
}

export async function saveChecklist(studioId: string, items: string[]) {
	await db
		.insert(studioChecklists)
		.values({ studioId, items })
		.onConflictDoUpdate({ target: studioChecklists.studioId, set: { items, updatedAt: new Date() } });
}

export async function calibrationsOf(gearId: string) {
	return db.select().from(flashCalibrations).where(eq(flashCalibrations.gearId, gearId)).orderBy(desc(flashCalibrations.createdAt));
}

/** A calibration's offset in stops: as typed, or from the guide numbers measured and rated. */
export function offsetOfCalibration(row: Pick<FlashCalibration, 'guideNumberM' | 'ratedGuideNumberM' | 'reading'>) {
	return 'typedOffsetStops' in row.reading ? row.reading.typedOffsetStops : calibrationOffsetStops(row);
}

/** Makes an offset the flash's calibration in force on the shelf (its `spec.calibrationOffsetStops`). */
async function setShelfCalibration(tx: Tx, gearId: string, offsetStops: number) {
	await tx
		.update(gear)
		.set({ spec: sql`jsonb_set(${gear.spec}, '{calibrationOffsetStops}', ${JSON.stringify(offsetStops)}::jsonb)`, updatedAt: sql`now()` })
		.where(eq(gear.id, gearId));
}

/**
 * Records a calibration and puts it in force: the row and the flash's offset on the shelf in one
 * transaction (`tx` to join one already open, as a gear form's save does).
 */
export async function recordCalibration(values: NewFlashCalibration, tx?: Tx) {
	const work = async (t: Tx) => {
		const [row] = await t.insert(flashCalibrations).values(values).returning();
		await setShelfCalibration(t, row.gearId, offsetOfCalibration(row));
		return row;
	};
	return tx ? work(tx) : db.transaction(work);
}

/**
 * Marks a calibration undone and puts the newest one left in force (none: 0 stops, the rated guide
 * number), in one transaction. Null when there is no such calibration in force on this flash.
 */
export async function undoCalibrationRow(gearId: string, calibrationId: string) {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.update(flashCalibrations)
			.set({ undoneAt: new Date() })
			.where(and(eq(flashCalibrations.id, calibrationId), eq(flashCalibrations.gearId, gearId), isNull(flashCalibrations.undoneAt)))
			.returning();
		if (!row) return null;
		const [inForce] = await tx
			.select()
			.from(flashCalibrations)
			.where(and(eq(flashCalibrations.gearId, gearId), isNull(flashCalibrations.undoneAt)))
			.orderBy(desc(flashCalibrations.createdAt))
			.limit(1);
		await setShelfCalibration(tx, gearId, inForce ? offsetOfCalibration(inForce) : 0);
		return row;
	});
}

export async function rememberLeftovers(keys: string[]) {
	if (!keys.length) return;
	await db.insert(storageLeftovers).values(keys.map((key) => ({ key }))).onConflictDoNothing();
}

export async function listLeftovers(limit = 100) {
	return (await db.select({ key: storageLeftovers.key }).from(storageLeftovers).limit(limit)).map((r) => r.key);
}

export async function forgetLeftovers(keys: string[]) {
	if (!keys.length) return;
	await db.delete(storageLeftovers).where(inArray(storageLeftovers.key, keys));
}
