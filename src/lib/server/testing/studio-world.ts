// Studios and people for the studio and sign-in tests, on the real database and through the running
// app (TEST_BASE_URL) and its mail fake (DEV_MAIL_URL), both set by `npm test`. Random addresses, so no
// test leans on another or on the seed.
import { isHttpError } from '@sveltejs/kit';
import { randomUUID } from 'node:crypto';
import { asc, count, eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { memberships, rateLimitHits, sessions, studios, users, verificationTokens, type StudioRole } from '$lib/server/db/schema';
import { ensurePersonalStudio } from '$lib/server/db/queries/studios';
import { toSessionUser } from '$lib/server/db/queries/users';
import { RuleViolation } from '$lib/server/errors';
import { hashSecret } from '$lib/server/tokens';
import type { SessionUser } from '$lib/server/session';

export { post } from './running-app';

const BASE = process.env.TEST_BASE_URL;

type Refusal = InstanceType<typeof RuleViolation> | Error;

export const tag = () => randomUUID().slice(0, 8);
export const address = (name: string) => `${name}+${tag()}@fernhill.example`;
export const context = () => ({ origin: BASE!, ip: `studios-test-${randomUUID()}` });

export async function makeUser(name: string): Promise<SessionUser> {
	const [row] = await db.insert(users).values({ email: address(name), name, emailVerified: new Date() }).returning();
	await ensurePersonalStudio(row.id, name);
	return toSessionUser(row);
}

/** A shared studio whose members have the given roles, in order. */
export async function makeStudio(roles: StudioRole[]) {
	const [studio] = await db.insert(studios).values({ name: `Fernhill Geology Circle ${tag()}` }).returning();
	const people: { user: SessionUser; membershipId: string }[] = [];
	for (const [i, role] of roles.entries()) {
		const user = await makeUser(['mara.quill', 'tobias.wren', 'ines.marlow', 'pebble.finch'][i % 4]);
		const [m] = await db.insert(memberships).values({ studioId: studio.id, userId: user.id, role }).returning();
		people.push({ user, membershipId: m.id });
	}
	return { studioId: studio.id, people };
}

export async function membersOf(studioId: string) {
	return db
		.select({ id: memberships.id, userId: memberships.userId, role: memberships.role })
		.from(memberships)
		.where(eq(memberships.studioId, studioId))
		.orderBy(asc(memberships.id));
}

export async function ownersOf(studioId: string) {
	return (await membersOf(studioId)).filter((m) => m.role === 'owner').length;
}

export async function refusal(work: () => Promise<unknown>): Promise<Refusal> {
	try {
		await work();
	} catch (e) {
		if (e instanceof RuleViolation || isHttpError(e)) return e as Error;
		throw e;
	}
	throw new Error('expected the request to be refused, but it went through');
}

/** The invitation token as the invitee would read it in the mail fake. */
export async function invitationLink(email: string): Promise<string> {
	for (let i = 0; i < 50; i++) {
		const messages = (await (await fetch(`${process.env.DEV_MAIL_URL}/messages`)).json()) as { to: string; text: string }[];
		const hit = messages.find((m) => m.to.includes(email) && m.text.includes('/invitations/'));
		if (hit) return hit.text.match(/https?:\/\/\S+\/invitations\/(\S+)/)![1];
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error(`no invitation mail to ${email}`);
}

export async function mailsTo(email: string): Promise<number> {
	const messages = (await (await fetch(`${process.env.DEV_MAIL_URL}/messages`)).json()) as { to: string }[];
	return messages.filter((m) => m.to.includes(email)).length;
}

export async function sessionCookie(user: SessionUser): Promise<string> {
	const token = randomUUID();
	await db.insert(sessions).values({ sessionToken: hashSecret(token), userId: user.id, expires: new Date(Date.now() + 3600_000) });
	return `authjs.session-token=${token}`;
}

export async function signInTraces(email: string) {
	const [tokens] = await db.select({ n: count() }).from(verificationTokens).where(eq(verificationTokens.identifier, email));
	const [hits] = await db.select({ n: count() }).from(rateLimitHits).where(eq(rateLimitHits.bucket, `signin:addr:${email}`));
	const [accounts] = await db.select({ n: count() }).from(users).where(eq(users.email, email));
	return { tokens: tokens.n, rateLimitHits: hits.n, users: accounts.n, mails: await mailsTo(email) };
}

