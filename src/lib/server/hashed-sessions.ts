// Auth.js's database sessions, with two rules of our own (OWASP ASVS v4 §3.3): the sessions table keeps
// only a SHA-256 of each cookie's token, and a session ends a fixed time after sign-in however often it
// is used. Auth.js hands the adapter the token read from the cookie, so hashing it here, before every
// session call, is all it takes; the cookie still carries the plain token.
import type { Adapter, AdapterSession } from '@auth/sveltekit/adapters';
import { env } from '$env/dynamic/private';
import { hashSecret } from '$lib/server/tokens';

export const DEFAULT_SESSION_MAX_DAYS = 30;

/** How long a session may last from sign-in: `SQUARELAW_SESSION_MAX_DAYS` (a positive number of days) or 30. */
export function sessionMaxAgeMs(): number {
	const days = Number(env.SQUARELAW_SESSION_MAX_DAYS);
	return (Number.isFinite(days) && days > 0 ? days : DEFAULT_SESSION_MAX_DAYS) * 24 * 3600_000;
}

type SessionRow = AdapterSession & { createdAt?: Date };

export function withHashedSessions(adapter: Adapter, maxAgeMs: () => number): Adapter {
	const { createSession, getSessionAndUser, updateSession, deleteSession } = adapter;
	if (!createSession || !getSessionAndUser || !updateSession || !deleteSession) {
		throw new Error('withHashedSessions needs an adapter with database sessions.');
	}
	return {
		...adapter,
		async createSession(session) {
			const row = await createSession({ ...session, sessionToken: hashSecret(session.sessionToken) });
			// Auth.js writes the returned token into the cookie: give it back the plain one.
			return { ...row, sessionToken: session.sessionToken };
		},
		async getSessionAndUser(sessionToken) {
			const found = await getSessionAndUser(hashSecret(sessionToken));
			if (!found) return null;
			const createdAt = (found.session as SessionRow).createdAt;
			if (createdAt && createdAt.getTime() + maxAgeMs() <= Date.now()) {
				await deleteSession(hashSecret(sessionToken));
				return null;
			}
			return { ...found, session: { ...found.session, sessionToken } };
		},
		async updateSession(session) {
			const row = await updateSession({ ...session, sessionToken: hashSecret(session.sessionToken) });
			return row && { ...row, sessionToken: session.sessionToken };
		},
		async deleteSession(sessionToken) {
			await deleteSession(hashSecret(sessionToken));
		}
	};
}
