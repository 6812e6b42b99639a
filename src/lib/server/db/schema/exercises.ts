// Exercises and hand-ins: an exercise in a lesson pins a starting revision, a brief and targets; a
// student starts it (their own copy of the starting revision, one per student) and hands in a pinned
// revision of that copy, with shots and a note, in numbered versions that an instructor reviews.
import { sql } from 'drizzle-orm';
import { boolean, check, foreignKey, index, integer, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import type { Target, TargetResult } from '$lib/light/targets';
import { users } from './auth';
import { setupRevisions, setups } from './setups';
import { workshopLessons, workshops } from './workshops';
import { HAND_IN_STATES, type HandInState } from '../../../exercises/states';

export { HAND_IN_STATES, type HandInState };

export const exercises = pgTable(
	'exercises',
	{
		id: uuid().primaryKey().defaultRandom(),
		/** Kept beside the lesson so every exercise question of a workshop is one indexed look-up. */
		workshopId: uuid()
			.notNull()
			.references(() => workshops.id, { onDelete: 'cascade' }),
		lessonId: uuid()
			.notNull()
			.references(() => workshopLessons.id, { onDelete: 'cascade' }),
		title: text().notNull(),
		/** Markdown, rendered sanitised. */
		brief: text().notNull().default(''),
		/** The starting setup: one pinned revision. */
		setupId: uuid()
			.notNull()
			.references(() => setups.id, { onDelete: 'cascade' }),
		revisionNumber: integer().notNull(),
		dueAt: timestamp({ withTimezone: true }).notNull(),
		/** Checked by $lib/scene/targets.ts before it is stored. */
		targets: jsonb().$type<Target[]>().notNull().default([]),
		createdById: uuid().references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
		updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		index('exercises_workshop_idx').on(t.workshopId, t.dueAt),
		index('exercises_lesson_idx').on(t.lessonId),
		foreignKey({
			columns: [t.setupId, t.revisionNumber],
			foreignColumns: [setupRevisions.setupId, setupRevisions.number],
			name: 'exercises_revision_fk'
		}).onDelete('cascade')
	]
);

/** A student's own copy of the starting revision: one per student and exercise. */
export const exerciseStarts = pgTable(
	'exercise_starts',
	{
		id: uuid().primaryKey().defaultRandom(),
		exerciseId: uuid()
			.notNull()
			.references(() => exercises.id, { onDelete: 'cascade' }),
		userId: uuid()
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		setupId: uuid()
			.notNull()
			.references(() => setups.id, { onDelete: 'cascade' }),
		startedAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		uniqueIndex('exercise_starts_exercise_user_idx').on(t.exerciseId, t.userId),
		uniqueIndex('exercise_starts_setup_idx').on(t.setupId)
	]
);

export const handIns = pgTable(
	'hand_ins',
	{
		id: uuid().primaryKey().defaultRandom(),
		exerciseId: uuid()
			.notNull()
			.references(() => exercises.id, { onDelete: 'cascade' }),
		userId: uuid()
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		/** 1, 2, 3 … for each new hand-in of the same student and exercise. */
		version: integer().notNull(),
		setupId: uuid()
			.notNull()
			.references(() => setups.id, { onDelete: 'cascade' }),
		revisionNumber: integer().notNull(),
		/** Shots of the handed-in setup, in the order chosen. */
		shotIds: uuid().array().notNull().default(sql`'{}'::uuid[]`),
		note: text().notNull().default(''),
		late: boolean().notNull(),
		/** The targets as they were, evaluated on the server from the stored revision at hand-in. */
		targets: jsonb().$type<Target[]>().notNull(),
		targetResults: jsonb().$type<TargetResult[]>().notNull(),
		targetsMet: integer().notNull(),
		handedInAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
		state: text().$type<HandInState>().notNull().default('handed-in'),
		/** Markdown. */
		feedback: text().notNull().default(''),
		reviewedById: uuid().references(() => users.id, { onDelete: 'set null' }),
		reviewedAt: timestamp({ withTimezone: true })
	},
	(t) => [
		uniqueIndex('hand_ins_version_idx').on(t.exerciseId, t.userId, t.version),
		index('hand_ins_user_idx').on(t.userId),
		check('hand_ins_state_check', sql`${t.state} in (${sql.raw(HAND_IN_STATES.map((s) => `'${s}'`).join(', '))})`),
		foreignKey({
			columns: [t.setupId, t.revisionNumber],
			foreignColumns: [setupRevisions.setupId, setupRevisions.number],
			name: 'hand_ins_revision_fk'
		}).onDelete('cascade')
	]
);

export type Exercise = typeof exercises.$inferSelect;
export type NewExercise = typeof exercises.$inferInsert;
export type ExerciseStart = typeof exerciseStarts.$inferSelect;
export type HandIn = typeof handIns.$inferSelect;
