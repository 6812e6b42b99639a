// Workshops: a course run by a studio, its dated sessions, lessons in order and steps that pin one
// revision of a setup, the people who run or follow it, invitations and requests to join.
import { sql } from 'drizzle-orm';
import { check, index, integer, pgTable, text, uniqueIndex, type AnyPgColumn } from 'drizzle-orm/pg-core';
import { belongsTo, inList, optionalRef, timestamps, timestamptz, uuidKey, writtenAt } from './columns';
import { users } from './auth';
import { invitationColumns, studios } from './studios';
import { pinnedRevisionKey, setups } from './setups';

import { WORKSHOP_STATES, type WorkshopState } from '../../../workshops/states';

export { WORKSHOP_STATES, type WorkshopState };

/**
 * Roles held in one workshop. Studio owners and editors run every workshop of their studio without a
 * row here; an instructor row lets someone else run this one, a student row lets someone follow it.
 */
export const WORKSHOP_ROLES = ['instructor', 'student'] as const;
export type WorkshopRole = (typeof WORKSHOP_ROLES)[number];

export const workshops = pgTable(
	'workshops',
	{
		id: uuidKey(),
		studioId: belongsTo(() => studios.id),
		/** The public page's address, /w/<slug>; unique across the site. */
		slug: text().notNull().unique(),
		title: text().notNull(),
		/** Markdown, rendered sanitised. */
		summary: text().notNull().default(''),
		/** Students at most (instructors not counted). */
		capacity: integer().notNull(),
		state: text().$type<WorkshopState>().notNull().default('draft'),
		/** A seat's price in the currency's minor units; 0 is a free workshop (joined by asking or invitation). */
		priceMinor: integer().notNull().default(0),
		/** ISO 4217 code in lower case, as the payment provider takes it (see $lib/seats/money). */
		currency: text().notNull().default('eur'),
		/** The live session's current position, moved by an instructor (setLiveStep); null when not live. */
		liveLessonId: optionalRef((): AnyPgColumn => workshopLessons.id),
		liveStepId: optionalRef((): AnyPgColumn => workshopSteps.id),
		liveUpdatedAt: timestamptz(),
		createdById: optionalRef(() => users.id),
		...timestamps()
	},
	(t) => [
		index('workshops_studio_idx').on(t.studioId),
		check('workshops_state_check', inList(t.state, WORKSHOP_STATES)),
		check('workshops_capacity_check', sql`${t.capacity} between 1 and 10000`),
		check('workshops_price_check', sql`${t.priceMinor} >= 0`)
	]
);

/** One dated meeting of a workshop, with its place. */
export const workshopSessions = pgTable(
	'workshop_sessions',
	{
		id: uuidKey(),
		workshopId: belongsTo(() => workshops.id),
		startsAt: timestamptz().notNull(),
		endsAt: timestamptz().notNull(),
		place: text().notNull()
	},
	(t) => [
		index('workshop_sessions_workshop_idx').on(t.workshopId, t.startsAt),
		check('workshop_sessions_order_check', sql`${t.endsAt} > ${t.startsAt}`)
	]
);

export const workshopLessons = pgTable(
	'workshop_lessons',
	{
		id: uuidKey(),
		workshopId: belongsTo(() => workshops.id),
		/** Order within the workshop, from 0; rewritten whole by a reorder. */
		position: integer().notNull(),
		title: text().notNull(),
		/** Markdown for students. */
		studentNotes: text().notNull().default(''),
		/** Markdown for the presenter only: never sent to a student. */
		presenterNotes: text().notNull().default(''),
		createdAt: writtenAt()
	},
	(t) => [index('workshop_lessons_workshop_idx').on(t.workshopId, t.position)]
);

/**
 * A step shows one pinned revision of a setup (the composite key makes a revision that does not exist
 * unstorable) with some of its elements hidden, and a caption.
 */
export const workshopSteps = pgTable(
	'workshop_steps',
	{
		id: uuidKey(),
		lessonId: belongsTo(() => workshopLessons.id),
		position: integer().notNull(),
		setupId: belongsTo(() => setups.id),
		revisionNumber: integer().notNull(),
		/** Plan element ids left out of this step's drawing and exposure; the rest is shown. */
		hiddenElementIds: text().array().notNull().default(sql`'{}'::text[]`),
		caption: text().notNull().default(''),
		createdAt: writtenAt()
	},
	(t) => [
		index('workshop_steps_lesson_idx').on(t.lessonId, t.position),
		index('workshop_steps_setup_idx').on(t.setupId),
		pinnedRevisionKey('workshop_steps_revision_fk', t.setupId, t.revisionNumber)
	]
);

/** Instructors added by the studio, and students. */
export const workshopMembers = pgTable(
	'workshop_members',
	{
		id: uuidKey(),
		workshopId: belongsTo(() => workshops.id),
		userId: belongsTo(() => users.id),
		role: text().$type<WorkshopRole>().notNull(),
		joinedAt: writtenAt(),
		/** Noted at most once a minute while they open the workshop. */
		lastSeenAt: timestamptz()
	},
	(t) => [
		uniqueIndex('workshop_members_workshop_user_idx').on(t.workshopId, t.userId),
		index('workshop_members_user_idx').on(t.userId),
		check('workshop_members_role_check', inList(t.role, WORKSHOP_ROLES))
	]
);

/** Single-use, expiring invitations by e-mail; only a sha-256 of the link's token is kept. */
export const workshopInvitations = pgTable(
	'workshop_invitations',
	{
		id: uuidKey(),
		workshopId: belongsTo(() => workshops.id),
		email: text().notNull(),
		role: text().$type<WorkshopRole>().notNull().default('student'),
		...invitationColumns()
	},
	(t) => [
		index('workshop_invitations_workshop_idx').on(t.workshopId),
		check('workshop_invitations_role_check', inList(t.role, WORKSHOP_ROLES))
	]
);

export const JOIN_DECISIONS = ['accepted', 'declined'] as const;
export type JoinDecision = (typeof JOIN_DECISIONS)[number];

/** "Ask to join" from the public page; an instructor accepts or declines it on the roster. */
export const workshopJoinRequests = pgTable(
	'workshop_join_requests',
	{
		id: uuidKey(),
		workshopId: belongsTo(() => workshops.id),
		userId: belongsTo(() => users.id),
		message: text().notNull().default(''),
		createdAt: writtenAt(),
		decision: text().$type<JoinDecision>(),
		decidedAt: timestamptz(),
		decidedById: optionalRef(() => users.id)
	},
	(t) => [
		// One open request per person and workshop.
		uniqueIndex('workshop_join_requests_open_idx')
			.on(t.workshopId, t.userId)
			.where(sql`${t.decision} is null`),
		check('workshop_join_requests_decision_check', sql`${t.decision} is null or ${t.decision} in ('accepted', 'declined')`)
	]
);

export type Workshop = typeof workshops.$inferSelect;
export type NewWorkshop = typeof workshops.$inferInsert;
export type WorkshopSession = typeof workshopSessions.$inferSelect;
export type WorkshopLesson = typeof workshopLessons.$inferSelect;
export type WorkshopStep = typeof workshopSteps.$inferSelect;
export type WorkshopMember = typeof workshopMembers.$inferSelect;
export type WorkshopInvitation = typeof workshopInvitations.$inferSelect;
export type WorkshopJoinRequest = typeof workshopJoinRequests.$inferSelect;
