// Exercises and hand-ins: an exercise in a lesson pins a starting revision, a brief and targets; a
// student starts it (their own copy of the starting revision, one per student) and hands in a pinned
// revision of that copy, with shots and a note, in numbered versions that an instructor reviews.
import { sql } from 'drizzle-orm';
import { boolean, check, index, integer, jsonb, pgTable, text, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { belongsTo, inList, optionalRef, timestamps, timestamptz, uuidKey, writtenAt } from './columns';
import type { Target, TargetResult } from '$lib/light/targets';
import { users } from './auth';
import { pinnedRevisionKey, setups } from './setups';
import { workshopLessons, workshops } from './workshops';
import { HAND_IN_STATES, type HandInState } from '../../../exercises/states';

export { HAND_IN_STATES, type HandInState };

export const exercises = pgTable(
	'exercises',
	{
		id: uuidKey(),
		/** Kept beside the lesson so every exercise question of a workshop is one indexed look-up. */
		workshopId: belongsTo(() => workshops.id),
		lessonId: belongsTo(() => workshopLessons.id),
		title: text().notNull(),
		/** Markdown, rendered sanitised. */
		brief: text().notNull().default(''),
		/** The starting setup: one pinned revision. */
		setupId: belongsTo(() => setups.id),
		revisionNumber: integer().notNull(),
		dueAt: timestamptz().notNull(),
		/** Checked by $lib/scene/targets.ts before it is stored. */
		targets: jsonb().$type<Target[]>().notNull().default([]),
		createdById: optionalRef(() => users.id),
		...timestamps()
	},
	(t) => [
		index('exercises_workshop_idx').on(t.workshopId, t.dueAt),
		index('exercises_lesson_idx').on(t.lessonId),
		pinnedRevisionKey('exercises_revision_fk', t.setupId, t.revisionNumber)
	]
);

/** A student's own copy of the starting revision: one per student and exercise. */
export const exerciseStarts = pgTable(
	'exercise_starts',
	{
		id: uuidKey(),
		exerciseId: belongsTo(() => exercises.id),
		userId: belongsTo(() => users.id),
		setupId: belongsTo(() => setups.id),
		startedAt: writtenAt()
	},
	(t) => [
		uniqueIndex('exercise_starts_exercise_user_idx').on(t.exerciseId, t.userId),
		uniqueIndex('exercise_starts_setup_idx').on(t.setupId)
	]
);

export const handIns = pgTable(
	'hand_ins',
	{
		id: uuidKey(),
		exerciseId: belongsTo(() => exercises.id),
		userId: belongsTo(() => users.id),
		/** 1, 2, 3 … for each new hand-in of the same student and exercise. */
		version: integer().notNull(),
		setupId: belongsTo(() => setups.id),
		revisionNumber: integer().notNull(),
		/** Shots of the handed-in setup, in the order chosen. */
		shotIds: uuid().array().notNull().default(sql`'{}'::uuid[]`),
		note: text().notNull().default(''),
		late: boolean().notNull(),
		/** The targets as they were, evaluated on the server from the stored revision at hand-in. */
		targets: jsonb().$type<Target[]>().notNull(),
		targetResults: jsonb().$type<TargetResult[]>().notNull(),
		targetsMet: integer().notNull(),
		handedInAt: writtenAt(),
		state: text().$type<HandInState>().notNull().default('handed-in'),
		/** Markdown. */
		feedback: text().notNull().default(''),
		reviewedById: optionalRef(() => users.id),
		reviewedAt: timestamptz()
	},
	(t) => [
		uniqueIndex('hand_ins_version_idx').on(t.exerciseId, t.userId, t.version),
		index('hand_ins_user_idx').on(t.userId),
		check('hand_ins_state_check', inList(t.state, HAND_IN_STATES)),
		pinnedRevisionKey('hand_ins_revision_fk', t.setupId, t.revisionNumber)
	]
);

export type Exercise = typeof exercises.$inferSelect;
export type NewExercise = typeof exercises.$inferInsert;
export type ExerciseStart = typeof exerciseStarts.$inferSelect;
export type HandIn = typeof handIns.$inferSelect;
