// Sign-in, kept in one file so the provider can be swapped later. E-mail links through Auth.js's
// Nodemailer provider, database sessions through the Drizzle adapter.
import { SvelteKitAuth } from '@auth/sveltekit';
import Nodemailer from '@auth/sveltekit/providers/nodemailer';
import { DrizzleAdapter } from '@auth/drizzle-adapter';
import { env } from '$env/dynamic/private';
import { db } from '$lib/server/db';
import { accounts, sessions, users, verificationTokens } from '$lib/server/db/schema';
import { ensurePersonalStudio } from '$lib/server/db/queries/studios';
import { sendMail } from '$lib/server/mail';
import { sessionMaxAgeMs, withHashedSessions } from '$lib/server/hashed-sessions';
import { signInLetter } from '$lib/server/mail/letters';
import { noteIfUnreachable } from '$lib/server/outage';
import { toSessionUser } from '$lib/server/db/queries/users';
import type { User } from '$lib/server/db/schema';
import type { SessionUser } from '$lib/server/session';

declare module '@auth/core/types' {
	interface Session {
		/** The signed-in user as `locals.user` holds them (see `identify` in hooks.server.ts). */
		caller?: SessionUser;
	}
}

export const SIGN_IN_LINK_MINUTES = 15;

const secureCookies = (env.ORIGIN ?? '').startsWith('https://');

export const { handle: authHandle, signIn, signOut } = SvelteKitAuth({
	// Session rows hold a hash of the cookie's token and end SQUARELAW_SESSION_MAX_DAYS (30) after sign-in.
	adapter: withHashedSessions(
		DrizzleAdapter(db, {
			usersTable: users,
			accountsTable: accounts,
			sessionsTable: sessions,
			verificationTokensTable: verificationTokens
		}),
		sessionMaxAgeMs
	),
	providers: [
		Nodemailer({
			server: env.EMAIL_SERVER || 'smtp://127.0.0.1:2525',
			from: env.EMAIL_FROM || 'Squarelaw <no-reply@squarelaw.localhost>',
			maxAge: SIGN_IN_LINK_MINUTES * 60,
			async sendVerificationRequest({ identifier, url }) {
				await sendMail(signInLetter(identifier, url, new URL(url).host));
			}
		})
	],
	// maxAge is the idle limit: a session unused for 7 days ends. The absolute limit (30 days from sign-in)
	// is kept by withHashedSessions; were the idle limit as long, it could never end a session first.
	session: { strategy: 'database', maxAge: 7 * 24 * 3600, updateAge: 24 * 3600 },
	secret: env.AUTH_SECRET,
	// A production build ignores AUTH_TRUST_HOST; ORIGIN fixes the host anyway.
	trustHost: true,
	useSecureCookies: secureCookies,
	pages: { signIn: '/signin', verifyRequest: '/signin/check', error: '/signin/error' },
	logger: {
		// Auth.js logs and swallows its lookups' errors: a session lookup that failed reads as "no
		// session". Marking the request lets the hooks answer an outage with 503 instead of a sign-out.
		error(error) {
			if (noteIfUnreachable(error)) console.error(`[auth][error] ${error.name}: the database is unreachable`);
			else console.error(`[auth][error] ${error.name}: ${error.message}`, error.cause ?? '');
		}
	},
	callbacks: {
		// The session lookup already joined the user's row: the caller as every route knows them rides
		// along as `caller`, so `identify` needs no second query.
		session({ session, user }) {
			return { ...session, user: { ...session.user, id: user.id }, caller: toSessionUser(user as User) };
		}
	},
	events: {
		async createUser({ user }) {
			if (user.id) await ensurePersonalStudio(user.id, user.name || user.email?.split('@')[0] || 'My');
		}
	}
});
