// The tables Auth.js's Drizzle adapter needs, with our naming (plural tables, snake_case columns).
import { boolean, index, integer, pgTable, primaryKey, text, timestamp } from 'drizzle-orm/pg-core';
import { belongsTo, uuidKey, writtenAt } from './columns';

export const users = pgTable('users', {
	id: uuidKey(),
	name: text(),
	email: text().notNull().unique(),
	emailVerified: timestamp({ mode: 'date', withTimezone: true }),
	image: text(),
	/** The operator's flag: sees and manages every studio. */
	isAdmin: boolean().notNull().default(false),
	unitSystem: text({ enum: ['metric', 'imperial'] }).notNull().default('metric'),
	createdAt: writtenAt()
});

export const accounts = pgTable(
	'accounts',
	{
		userId: belongsTo(() => users.id),
		type: text().notNull(),
		provider: text().notNull(),
		providerAccountId: text().notNull(),
		refresh_token: text(),
		access_token: text(),
		expires_at: integer(),
		token_type: text(),
		scope: text(),
		id_token: text(),
		session_state: text()
	},
	(t) => [primaryKey({ columns: [t.provider, t.providerAccountId] })]
);

/**
 * Database sessions. `sessionToken` holds the SHA-256 (hex) of the cookie's token, never the token itself
 * (`src/lib/server/hashed-sessions.ts` hashes it before every adapter call). `expires` is the idle limit,
 * moved forward as the session is used; `createdAt` (sign-in) bounds its whole life.
 */
export const sessions = pgTable(
	'sessions',
	{
		sessionToken: text().primaryKey(),
		userId: belongsTo(() => users.id),
		expires: timestamp({ mode: 'date', withTimezone: true }).notNull(),
		createdAt: timestamp({ mode: 'date', withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('sessions_user_idx').on(t.userId)]
);

export const verificationTokens = pgTable(
	'verification_tokens',
	{
		identifier: text().notNull(),
		token: text().notNull(),
		expires: timestamp({ mode: 'date', withTimezone: true }).notNull()
	},
	(t) => [primaryKey({ columns: [t.identifier, t.token] })]
);

export type User = typeof users.$inferSelect;
export type NewUser = typeof users.$inferInsert;
