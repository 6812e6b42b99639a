// Named queries for the gear shelf. Callers have asked authz first (src/lib/server/gear.ts).
import { and, asc, eq, inArray, isNull, sql } from 'drizzle-orm';
import { db, type Tx } from '../index';
import { gear, type Gear, type NewGear } from '../schema';
import { inStudiosOf, type StudioFilter } from './visibility';
import type { GearKind } from '$lib/scene/gear';
import { calibratedGuideNumber } from '$lib/shots/measure';
import { recordCalibration } from './shots';

/** The shelf of one studio, or of several at once (`studioIds` an array). */
export async function listGearRows(studioIds: string | string[], { kind, includeRetired = false }: { kind?: GearKind; includeRetired?: boolean } = {}) {
	if (Array.isArray(studioIds) && studioIds.length === 0) return [];
	return db
		.select()
		.from(gear)
		.where(
			and(
				Array.isArray(studioIds) ? inArray(gear.studioId, studioIds) : eq(gear.studioId, studioIds),
				kind ? eq(gear.kind, kind) : undefined,
				includeRetired ? undefined : isNull(gear.retiredAt)
			)
		)
		.orderBy(asc(gear.kind), asc(gear.name), asc(gear.id));
}

export type GearOption = Pick<Gear, 'id' | 'name' | 'kind' | 'studioId'>;

/** Live gear of several shelves, only what a list of choices shows, in the studios the filter lets through. */
export async function listGearOptions(studioIds: string[], visible: StudioFilter): Promise<GearOption[]> {
	if (studioIds.length === 0) return [];
	return db
		.select({ id: gear.id, name: gear.name, kind: gear.kind, studioId: gear.studioId })
		.from(gear)
		.where(and(inArray(gear.studioId, studioIds), isNull(gear.retiredAt), inStudiosOf(gear.studioId, visible)))
		.orderBy(asc(gear.kind), asc(gear.name), asc(gear.id));
}

export async function findGearRow(id: string) {
	const [row] = await db.select().from(gear).where(eq(gear.id, id));
	return row ?? null;
}

/** The studio's gear among `ids` (retired included: a setup may keep using retired gear). */
export async function gearRowsByIds(studioId: string, ids: string[]) {
	if (ids.length === 0) return [];
	return db
		.select()
		.from(gear)
		.where(and(eq(gear.studioId, studioId), inArray(gear.id, ids)));
}

/** An offset typed for a flash on the gear form, kept in its calibration history with the write. */
export interface TypedCalibration {
	offsetStops: number;
	ratedGuideNumberM: number;
	createdById: string | null;
}

export function recordTypedCalibration(gearId: string, typed: TypedCalibration, tx?: Tx) {
	return recordCalibration(
		{
			gearId,
			method: 'typed',
			guideNumberM: calibratedGuideNumber(typed.ratedGuideNumberM, typed.offsetStops),
			ratedGuideNumberM: typed.ratedGuideNumberM,
			reading: { typedOffsetStops: typed.offsetStops },
			createdById: typed.createdById
		},
		tx
	);
}

export async function insertGearRow(values: NewGear, typed?: TypedCalibration) {
	return db.transaction(async (tx) => {
		const [row] = await tx.insert(gear).values(values).returning();
		if (typed) await recordTypedCalibration(row.id, typed, tx);
		return row;
	});
}

export async function updateGearRow(
	id: string,
	changes: { name?: string; spec?: Record<string, unknown>; notes?: string; retired?: boolean },
	typed?: TypedCalibration
) {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.update(gear)
			.set({
				...(changes.name !== undefined ? { name: changes.name } : {}),
				...(changes.spec !== undefined ? { spec: changes.spec } : {}),
				...(changes.notes !== undefined ? { notes: changes.notes } : {}),
				...(changes.retired !== undefined ? { retiredAt: changes.retired ? sql`coalesce(${gear.retiredAt}, now())` : null } : {}),
				updatedAt: sql`now()`
			})
			.where(eq(gear.id, id))
			.returning();
		if (row && typed) await recordTypedCalibration(row.id, typed, tx);
		return row ?? null;
	});
}
