// Setups and their revisions. A setup row is the catalogue card (title, subject, tags, where it came
// from); every save is a new, never-changed row in setup_revisions holding the whole document.
import { sql } from 'drizzle-orm';
import { customType, foreignKey, index, integer, jsonb, pgTable, text, uniqueIndex, uuid, type AnyPgColumn } from 'drizzle-orm/pg-core';
import { users } from './auth';
import { belongsTo, optionalRef, timestamps, timestamptz, uuidKey, writtenAt } from './columns';
import { studios } from './studios';

/** PNG bytes. postgres.js hands bytea over as a Buffer; the app works with Uint8Array. */
export const bytea = customType<{ data: Uint8Array; driverData: Buffer }>({
	dataType: () => 'bytea',
	toDriver: (value) => Buffer.from(value.buffer, value.byteOffset, value.byteLength),
	fromDriver: (value) => new Uint8Array(value)
});

export const setups = pgTable(
	'setups',
	{
		id: uuidKey(),
		studioId: belongsTo(() => studios.id),
		title: text().notNull(),
		subject: text().notNull().default(''),
		tags: text().array().notNull().default(sql`'{}'::text[]`),
		/** The number of the newest revision. Saves move it forward with a conditional update, which is
		 * what makes a stale save fail instead of overwriting (see saveRevision). */
		latestRevision: integer().notNull().default(1),
		/** Lineage: the setup and revision this one was duplicated from. */
		derivedFromSetupId: uuid(),
		derivedFromRevision: integer(),
		/** Gear the latest revision uses, for the gear filter of the list. */
		gearIds: uuid().array().notNull().default(sql`'{}'::uuid[]`),
		/** The newest revision that has a thumbnail of its plan, if any. */
		thumbnailRevision: integer(),
		/** Lower-case title, subject, tags and gear names, kept by the app on every write, for search. */
		searchText: text().notNull().default(''),
		createdById: optionalRef(() => users.id),
		...timestamps(),
		/** In the studio's trash since then; null when not deleted. */
		deletedAt: timestamptz(),
		deletedById: optionalRef(() => users.id)
	},
	(t) => [
		foreignKey({ columns: [t.derivedFromSetupId], foreignColumns: [t.id], name: 'setups_derived_from_fk' }).onDelete(
			'set null'
		),
		// The notebook list: one studio, newest first (a backward scan), not in the trash.
		index('setups_studio_updated_idx')
			.on(t.studioId, t.updatedAt, t.id)
			.where(sql`${t.deletedAt} is null`),
		index('setups_studio_title_idx')
			.on(t.studioId, t.title, t.id)
			.where(sql`${t.deletedAt} is null`),
		// The trash: one studio, most recently deleted first.
		index('setups_studio_trash_idx')
			.on(t.studioId, t.deletedAt)
			.where(sql`${t.deletedAt} is not null`),
		index('setups_derived_from_idx').on(t.derivedFromSetupId),
		index('setups_tags_idx').using('gin', t.tags),
		index('setups_gear_ids_idx').using('gin', t.gearIds),
		// Search: substring match on any word of title, subject, tags and gear names (pg_trgm).
		index('setups_search_trgm_idx').using('gin', sql`${t.searchText} gin_trgm_ops`)
	]
);

export const setupRevisions = pgTable(
	'setup_revisions',
	{
		id: uuidKey(),
		setupId: belongsTo(() => setups.id),
		number: integer().notNull(),
		/** The revision this one was saved on top of (null for the first). */
		parentNumber: integer(),
		/** Set when this revision is a restore: the revision whose document it copies. */
		restoredFromNumber: integer(),
		/** The setup document as saved, `{ schemaVersion, scene, plan, notes, gear }`; migrated on read. */
		document: jsonb().notNull(),
		/** The catalogue fields as they were at this revision. */
		title: text().notNull(),
		subject: text().notNull().default(''),
		tags: text().array().notNull().default(sql`'{}'::text[]`),
		authorId: optionalRef(() => users.id),
		message: text().notNull().default(''),
		thumbnailPng: bytea(),
		createdAt: writtenAt()
	},
	(t) => [uniqueIndex('setup_revisions_setup_number_idx').on(t.setupId, t.number)]
);

/**
 * A row that pins one revision of a setup (a workshop step, an exercise, a hand-in): the composite key
 * makes a revision that does not exist unstorable, and the row goes with the revision.
 */
export const pinnedRevisionKey = (name: string, setupId: AnyPgColumn, revisionNumber: AnyPgColumn) =>
	foreignKey({ columns: [setupId, revisionNumber], foreignColumns: [setupRevisions.setupId, setupRevisions.number], name }).onDelete('cascade');

/**
 * How many setups each studio has, live and in the trash, so the unfiltered notebook list answers its
 * total without counting rows (a count that would grow with the studio). Kept by statement-level
 * triggers on setups (drizzle/0001_notebook.sql), so every writer keeps it right, the app, the seed and
 * bulk SQL alike, inside the writer's own transaction.
 */
export const studioSetupCounts = pgTable('studio_setup_counts', {
	studioId: uuid().primaryKey(),
	live: integer().notNull().default(0),
	trashed: integer().notNull().default(0)
});

export type Setup = typeof setups.$inferSelect;
export type NewSetup = typeof setups.$inferInsert;
export type SetupRevision = typeof setupRevisions.$inferSelect;
export type NewSetupRevision = typeof setupRevisions.$inferInsert;
