import { and, desc, eq, isNull } from 'drizzle-orm';
import { db } from '../index';
import { accessTokens, users } from '../schema';
import { hashSecret, newSecret } from '$lib/server/tokens';
import { toSessionUser } from './users';

export const TOKEN_PREFIX = 'slw_';

export async function createAccessToken(userId: string, name: string) {
	const secret = newSecret(TOKEN_PREFIX);
	const [row] = await db
		.insert(accessTokens)
		.values({ userId, name, tokenHash: hashSecret(secret), tokenPrefix: secret.slice(0, 10) })
		.returning({ id: accessTokens.id, name: accessTokens.name, createdAt: accessTokens.createdAt });
	return { ...row, secret };
}

export async function listAccessTokens(userId: string) {
	return db
		.select({
			id: accessTokens.id,
			name: accessTokens.name,
			tokenPrefix: accessTokens.tokenPrefix,
			createdAt: accessTokens.createdAt,
			lastUsedAt: accessTokens.lastUsedAt
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

/** The user behind a bearer token, or null for an unknown or revoked one. */
export async function userForAccessToken(secret: string) {
	if (!secret.startsWith(TOKEN_PREFIX)) return null;
	const [row] = await db
		.select({ user: users, tokenId: accessTokens.id, lastUsedAt: accessTokens.lastUsedAt })
		.from(accessTokens)
		.innerJoin(users, eq(users.id, accessTokens.userId))
		.where(and(eq(accessTokens.tokenHash, hashSecret(secret)), isNull(accessTokens.revokedAt)));
	if (!row) return null;
	// Record use at most once a minute, so a busy script does not write on every call.
	if (!row.lastUsedAt || Date.now() - row.lastUsedAt.getTime() > 60_000) {
		await db.update(accessTokens).set({ lastUsedAt: new Date() }).where(eq(accessTokens.id, row.tokenId));
	}
	return toSessionUser(row.user);
}
