import { bigserial, check, index, pgTable, text } from 'drizzle-orm/pg-core';
import { belongsTo, inList, timestamptz, uuidKey, writtenAt } from './columns';
import { users } from './auth';

export const TOKEN_SCOPES = ['read-only', 'read-write'] as const;
export type TokenScope = (typeof TOKEN_SCOPES)[number];

/** Personal access tokens for the API; only a sha-256 of the secret is kept. */
export const accessTokens = pgTable(
	'access_tokens',
	{
		id: uuidKey(),
		userId: belongsTo(() => users.id),
		name: text().notNull(),
		tokenHash: text().notNull().unique(),
		/** The first characters, shown in lists so the owner can tell tokens apart. */
		tokenPrefix: text().notNull(),
		createdAt: writtenAt(),
		/** Written at most once a minute while the token is in use. */
		lastUsedAt: timestamptz(),
		/** Null: never expires. */
		expiresAt: timestamptz(),
		/** 'read-only' tokens may only read (GET) the JSON API. Tokens made before scopes existed keep 'read-write'. */
		scope: text({ enum: TOKEN_SCOPES }).notNull().default('read-write'),
		revokedAt: timestamptz()
	},
	(t) => [
		index('access_tokens_user_idx').on(t.userId),
		check('access_tokens_scope_check', inList(t.scope, TOKEN_SCOPES))
	]
);

/**
 * One row per rate-limited request (sign-in links, invitations). Kept in PostgreSQL rather than
 * in memory so that several app servers behind a load balancer share the count.
 */
export const rateLimitHits = pgTable(
	'rate_limit_hits',
	{
		id: bigserial({ mode: 'number' }).primaryKey(),
		bucket: text().notNull(),
		createdAt: writtenAt()
	},
	(t) => [index('rate_limit_hits_bucket_idx').on(t.bucket, t.createdAt)]
);

export type AccessToken = typeof accessTokens.$inferSelect;
