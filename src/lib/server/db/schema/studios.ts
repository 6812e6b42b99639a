import { sql } from 'drizzle-orm';
import { check, index, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { users } from './auth';

/**
 * Studio roles, kept as text with a check constraint rather than a Postgres enum. Workshop roles
 * (instructor, student) belong to one workshop: see workshop_members in workshops.ts.
 */
export const STUDIO_ROLES = ['owner', 'editor', 'viewer'] as const;
export type StudioRole = (typeof STUDIO_ROLES)[number];

export const studios = pgTable('studios', {
	id: uuid().primaryKey().defaultRandom(),
	name: text().notNull(),
	/** Every user gets one personal studio when the account is made. */
	personalOwnerId: uuid().references(() => users.id, { onDelete: 'cascade' }).unique(),
	createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
	deletedAt: timestamp({ withTimezone: true })
});

export const memberships = pgTable(
	'memberships',
	{
		id: uuid().primaryKey().defaultRandom(),
		studioId: uuid()
			.notNull()
			.references(() => studios.id, { onDelete: 'cascade' }),
		userId: uuid()
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		role: text().$type<StudioRole>().notNull(),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		uniqueIndex('memberships_studio_user_idx').on(t.studioId, t.userId),
		index('memberships_user_idx').on(t.userId),
		check('memberships_role_check', sql`${t.role} in ('owner', 'editor', 'viewer')`)
	]
);

export const invitations = pgTable(
	'invitations',
	{
		id: uuid().primaryKey().defaultRandom(),
		studioId: uuid()
			.notNull()
			.references(() => studios.id, { onDelete: 'cascade' }),
		email: text().notNull(),
		role: text().$type<StudioRole>().notNull(),
		/** sha-256 of the token in the accept link; the token itself is only ever in the e-mail. */
		tokenHash: text().notNull().unique(),
		invitedById: uuid().references(() => users.id, { onDelete: 'set null' }),
		expiresAt: timestamp({ withTimezone: true }).notNull(),
		acceptedAt: timestamp({ withTimezone: true }),
		acceptedById: uuid().references(() => users.id, { onDelete: 'set null' }),
		revokedAt: timestamp({ withTimezone: true }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		index('invitations_studio_idx').on(t.studioId),
		check('invitations_role_check', sql`${t.role} in ('owner', 'editor', 'viewer')`)
	]
);

export type Studio = typeof studios.$inferSelect;
export type Membership = typeof memberships.$inferSelect;
export type Invitation = typeof invitations.$inferSelect;
