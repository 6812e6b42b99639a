import { check, index, pgTable, text, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { belongsTo, inList, optionalRef, timestamptz, uuidKey, writtenAt } from './columns';
import { users } from './auth';

/**
 * Studio roles, kept as text with a check constraint rather than a Postgres enum. Workshop roles
 * (instructor, student) belong to one workshop: see workshop_members in workshops.ts.
 */
export const STUDIO_ROLES = ['owner', 'editor', 'viewer'] as const;
export type StudioRole = (typeof STUDIO_ROLES)[number];

export const studios = pgTable('studios', {
	id: uuidKey(),
	name: text().notNull(),
	/** Every user gets one personal studio when the account is made. */
	personalOwnerId: uuid().references(() => users.id, { onDelete: 'cascade' }).unique(),
	createdAt: writtenAt(),
	deletedAt: timestamptz()
});

export const memberships = pgTable(
	'memberships',
	{
		id: uuidKey(),
		studioId: belongsTo(() => studios.id),
		userId: belongsTo(() => users.id),
		role: text().$type<StudioRole>().notNull(),
		createdAt: writtenAt()
	},
	(t) => [
		uniqueIndex('memberships_studio_user_idx').on(t.studioId, t.userId),
		index('memberships_user_idx').on(t.userId),
		check('memberships_role_check', inList(t.role, STUDIO_ROLES))
	]
);

/**
 * An invitation by e-mail, to a studio or a workshop: it works once and until it expires, and may be
 * withdrawn. Only a sha-256 of the token in the link is kept; the token itself is only ever in the e-mail.
 */
export const invitationColumns = () => ({
	tokenHash: text().notNull().unique(),
	invitedById: optionalRef(() => users.id),
	expiresAt: timestamptz().notNull(),
	acceptedAt: timestamptz(),
	acceptedById: optionalRef(() => users.id),
	revokedAt: timestamptz(),
	createdAt: writtenAt()
});

export const invitations = pgTable(
	'invitations',
	{
		id: uuidKey(),
		studioId: belongsTo(() => studios.id),
		email: text().notNull(),
		role: text().$type<StudioRole>().notNull(),
		...invitationColumns()
	},
	(t) => [
		index('invitations_studio_idx').on(t.studioId),
		check('invitations_role_check', inList(t.role, STUDIO_ROLES))
	]
);

export type Studio = typeof studios.$inferSelect;
export type Membership = typeof memberships.$inferSelect;
export type Invitation = typeof invitations.$inferSelect;
