import { and, desc, eq, gt, isNull, or, sql } from 'drizzle-orm';
import { db } from '../index';
import { accessTokens, users, type TokenScope } from '../schema';
import { hashSecret, newSecret } from '$lib/server/tokens';
import { toSessionUser } from './users';

export const TOKEN_PREFIX = 'slw_';

/** Use is written at most this often, so a busy script does not write on every call. */
export const LAST_USE_RESOLUTION_MS = 60_000;

export async function createAccessToken(
	userId: string,
	name: string,
	{ scope = 'read-write', expiresAt = null }: { scope?: TokenScope; expiresAt?: Date | null } = {}
) {
	const secret = newSecret(TOKEN_PREFIX);
	const [row] = await db
		.insert(accessTokens)
		.values({ userId, name, tokenHash: hashSecret(secret), tokenPrefix: secret.slice(0, 10), scope, expiresAt })
		.returning({
			id: accessTokens.id,
			name: accessTokens.name,
			scope: accessTokens.scope,
			expiresAt: accessTokens.expiresAt,
			createdAt: accessTokens.createdAt
		});
	return { ...row, secret };
}

export async function listAccessTokens(userId: string) {
	return db
		.select({
			id: accessTokens.id,
			name: accessTokens.name,
			tokenPrefix: accessTokens.tokenPrefix,
			scope: accessTokens.scope,
			createdAt: accessTokens.createdAt,
			lastUsedAt: accessTokens.lastUsedAt,
			expiresAt: accessTokens.expiresAt
		})
		.from(accessTokens)
		.where(and(eq(accessTokens.userId, userId), isNull(accessTokens.revokedAt)))
		.orderBy(desc(accessTokens.createdAt));
}

export async function revokeAccessToken(userId: string, tokenId: string): Promise<boolean> {
	const rows = await db
		.update(accessTokens)
		.set({ revokedAt: new Date() })
		.where(and(eq(accessTokens.id, tokenId), eq(accessTokens.userId, userId), isNull(accessTokens.revokedAt)))
		.returning({ id: accessTokens.id });
	return rows.length > 0;
}

/** The user behind a bearer token and what the token may do, or null for an unknown, revoked or expired one. */
export async function userForAccessToken(secret: string) {
	if (!secret.startsWith(TOKEN_PREFIX)) return null;
	const [row] = await db
		.select({ user: users, tokenId: accessTokens.id, lastUsedAt: accessTokens.lastUsedAt, scope: accessTokens.scope })
		.from(accessTokens)
		.innerJoin(users, eq(users.id, accessTokens.userId))
		.where(
			and(
				eq(accessTokens.tokenHash, hashSecret(secret)),
				isNull(accessTokens.revokedAt),
				or(isNull(accessTokens.expiresAt), gt(accessTokens.expiresAt, sql`now()`))
			)
		);
	if (!row) return null;
	if (!row.lastUsedAt || Date.now() - row.lastUsedAt.getTime() > LAST_USE_RESOLUTION_MS) {
		await db.update(accessTokens).set({ lastUsedAt: new Date() }).where(eq(accessTokens.id, row.tokenId));
	}
	return { user: toSessionUser(row.user), scope: row.scope };
}
