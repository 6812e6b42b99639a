// Shots: the photographs made from a setup, kept against the revision they were made from, with their
// EXIF, values typed by hand, measures of exposure, and the shooting session they were made in. The
// image bytes live in object storage (src/lib/server/storage.ts); a row names its objects.
// Also the flash calibrations of gear-shelf flashes and the studios' pre-shot checklists.
import { sql } from 'drizzle-orm';
import { check, doublePrecision, index, integer, jsonb, pgTable, primaryKey, text, uuid } from 'drizzle-orm/pg-core';
import { belongsTo, optionalRef, timestamptz, uuidKey, writtenAt } from './columns';
import type { ShotExif, ShotTyped, MeterReading, MeasureRegion, CalibrationReading } from '$lib/shots/types';
import { users } from './auth';
import { gear } from './gear';
import { setups } from './setups';
import { studios } from './studios';

export const shootingSessions = pgTable(
	'shooting_sessions',
	{
		id: uuidKey(),
		setupId: belongsTo(() => setups.id),
		/** The day of the sitting (local to the photographer). */
		shotOn: text().notNull(),
		note: text().notNull().default(''),
		createdById: optionalRef(() => users.id),
		createdAt: writtenAt()
	},
	(t) => [index('shooting_sessions_setup_idx').on(t.setupId, t.shotOn)]
);

export const shots = pgTable(
	'shots',
	{
		id: uuidKey(),
		setupId: belongsTo(() => setups.id),
		sessionId: optionalRef(() => shootingSessions.id),
		/** The revision the shot was made from: the latest at upload, changeable to another of the same setup. */
		revisionNumber: integer().notNull(),
		fileName: text().notNull(),
		contentType: text().notNull(),
		byteSize: integer().notNull(),
		widthPx: integer().notNull(),
		heightPx: integer().notNull(),
		/** Object keys: the original as uploaded, and the JPEG thumbnail and preview made from it. */
		originalKey: text().notNull(),
		thumbnailKey: text().notNull(),
		previewKey: text().notNull(),
		/** What the file's EXIF recorded (null fields: not recorded). */
		exif: jsonb().$type<ShotExif>().notNull(),
		/** Values typed by hand where EXIF had none or was wrong; they win over `exif` and are marked typed. */
		typed: jsonb().$type<ShotTyped>().notNull().default({}),
		takenAt: timestamptz(),
		createdById: optionalRef(() => users.id),
		createdAt: writtenAt(),
		deletedAt: timestamptz()
	},
	(t) => [
		index('shots_setup_idx').on(t.setupId, t.createdAt),
		index('shots_session_idx').on(t.sessionId)
	]
);

/** How the actual exposure of a shot was found: a region of the original measured, or a meter reading typed. */
export const shotMeasures = pgTable(
	'shot_measures',
	{
		id: uuidKey(),
		shotId: belongsTo(() => shots.id),
		method: text().$type<'region' | 'meter'>().notNull(),
		region: jsonb().$type<MeasureRegion>(),
		/** Mean linear relative luminance of the region (0–1). */
		meanLuminance: doublePrecision(),
		meter: jsonb().$type<MeterReading>(),
		/** Stops above (+) or below (−) a mid-grey exposure. */
		actualOffsetStops: doublePrecision().notNull(),
		createdById: optionalRef(() => users.id),
		createdAt: writtenAt()
	},
	(t) => [
		index('shot_measures_shot_idx').on(t.shotId, t.createdAt),
		check('shot_measures_method_check', sql`${t.method} in ('region', 'meter')`)
	]
);

/**
 * Dated calibrations of a gear-shelf flash (from a shot, a meter reading, or typed on the shelf); the
 * newest not undone is in force, and its offset (2·log2(guideNumberM / ratedGuideNumberM) stops) is the
 * flash's `spec.calibrationOffsetStops`, which plans use.
 */
export const flashCalibrations = pgTable(
	'flash_calibrations',
	{
		id: uuidKey(),
		gearId: belongsTo(() => gear.id),
		method: text().$type<'shot' | 'meter' | 'typed'>().notNull(),
		/** The guide number worked out (m, ISO 100, full power) and the one the shelf said before. */
		guideNumberM: doublePrecision().notNull(),
		ratedGuideNumberM: doublePrecision().notNull(),
		shotId: optionalRef(() => shots.id),
		reading: jsonb().$type<CalibrationReading>().notNull(),
		createdById: optionalRef(() => users.id),
		createdAt: writtenAt(),
		undoneAt: timestamptz()
	},
	(t) => [
		index('flash_calibrations_gear_idx').on(t.gearId, t.createdAt),
		check('flash_calibrations_method_check', sql`${t.method} in ('shot', 'meter', 'typed')`)
	]
);

/** A studio's own pre-shot checklist; a studio without a row uses the default list. */
export const studioChecklists = pgTable('studio_checklists', {
	studioId: uuid()
		.primaryKey()
		.references(() => studios.id, { onDelete: 'cascade' }),
	items: text().array().notNull(),
	updatedAt: writtenAt()
});

/** One ticked checklist item of a shooting session (the item's text as it was when ticked). */
export const sessionTicks = pgTable(
	'session_ticks',
	{
		sessionId: belongsTo(() => shootingSessions.id),
		item: text().notNull(),
		tickedById: optionalRef(() => users.id),
		tickedAt: writtenAt()
	},
	(t) => [primaryKey({ columns: [t.sessionId, t.item] })]
);

export type ShootingSession = typeof shootingSessions.$inferSelect;
export type Shot = typeof shots.$inferSelect;
export type NewShot = typeof shots.$inferInsert;
export type ShotMeasure = typeof shotMeasures.$inferSelect;
export type FlashCalibration = typeof flashCalibrations.$inferSelect;
export type NewFlashCalibration = typeof flashCalibrations.$inferInsert;
export type StudioChecklist = typeof studioChecklists.$inferSelect;
export type SessionTick = typeof sessionTicks.$inferSelect;

/**
 * Object keys to delete: written for an upload that then failed while storage was unreachable, so they
 * could not be removed at once. The next upload removes them first (sweepStorageLeftovers), so no
 * object outlives its failed upload for long and none is ever shown without its row.
 */
export const storageLeftovers = pgTable('storage_leftovers', {
	key: text().primaryKey(),
	createdAt: writtenAt()
});
