// Personal access tokens and browser sessions through the running app (TEST_BASE_URL) and the real
// database (DATABASE_URL). Tokens: only the JSON API takes them, a read-only token cannot write, an expired
// one is 401, use is noted at most once a minute. Sessions (OWASP ASVS v4 §3.3): an absolute limit from
// sign-in, sign out everywhere, and a table that never holds a cookie's token. Nothing is mocked.
import { beforeAll, describe, expect, it } from 'vitest';
import { createHash, randomBytes } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { and, count, eq, sql, TransactionRollbackError } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { accessTokens, sessions, setups, studios, users } from '$lib/server/db/schema';
import { createAccessToken } from '$lib/server/db/queries/tokens';
import {
	api,
	baseUrl,
	expectErrorBody,
	makeStudio,
	makeUser,
	openSession,
	sampleDocument,
	type TestUser
} from '$lib/server/testing/notebook-fixtures';

const DAY_MS = 24 * 3600_000;

beforeAll(() => {
	baseUrl(); // fails at once when the app is not running
	if (!process.env.DEV_MAIL_URL) throw new Error('DEV_MAIL_URL is not set: run these tests through `npm test`.');
});

/** A form post as a browser sends it, from this site's origin (so Kit's origin check lets it through). */
function postForm(path: string, form: Record<string, string>, headers: Record<string, string>) {
	return fetch(`${baseUrl()}${path}`, {
		method: 'POST',
		redirect: 'manual',
		headers: { origin: baseUrl(), accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded', ...headers },
		body: new URLSearchParams(form)
	});
}

function getPage(path: string, headers: Record<string, string>) {
	return fetch(`${baseUrl()}${path}`, { redirect: 'manual', headers });
}

const bearer = (secret: string) => ({ authorization: `Bearer ${secret}` });

async function tokenCount(userId: string) {
	const [{ n }] = await db.select({ n: count() }).from(accessTokens).where(eq(accessTokens.userId, userId));
	return n;
}

async function tokenRow(secret: string) {
	const hash = createHash('sha256').update(secret).digest('hex');
	const [row] = await db.select().from(accessTokens).where(eq(accessTokens.tokenHash, hash));
	return row;
}

function newSetupBody(studioId: string) {
	return { studioId, title: 'Token scope check', subject: 'Quartz cluster', document: sampleDocument() };
}

describe('personal access tokens are for the JSON API only', () => {
	it('a form action posted with a bearer token is refused (401 JSON) and changes nothing', async () => {
		const u = await makeUser('token-forms');
		const before = await tokenCount(u.user.id);
		const res = await postForm('/account?/createToken', { tokenName: 'made by a token', scope: 'read-write', expiresInDays: 'never' }, bearer(u.token));
		expectErrorBody({ status: res.status, body: await res.json(), headers: res.headers }, 401);
		expect(await tokenCount(u.user.id)).toBe(before);

		const { studioId, people } = await makeStudio('Token forms');
		const del = await postForm(`/studios/${studioId}?/delete`, { confirm: 'delete' }, bearer(people.owner.token));
		expect(del.status).toBe(401);
		const [studio] = await db.select().from(studios).where(eq(studios.id, studioId));
		expect(studio.deletedAt).toBeNull();
	});

	it('a page loaded with a bearer token is not a signed-in page', async () => {
		const u = await makeUser('token-pages');
		const res = await getPage('/account', bearer(u.token));
		expect(res.status).toBe(401);
		expect(await res.text()).not.toContain(u.user.email);
	});

	it('the same form action with the session cookie still works', async () => {
		const u = await makeUser('cookie-forms');
		const before = await tokenCount(u.user.id);
		const res = await postForm('/account?/createToken', { tokenName: 'made in the browser', scope: 'read-write', expiresInDays: '30' }, { cookie: u.cookie });
		expect(res.status).toBe(200);
		expect(await tokenCount(u.user.id)).toBe(before + 1);
	});
});

describe('token scope and expiry', () => {
	let owner: TestUser;
	let studioId: string;
	beforeAll(async () => {
		const studio = await makeStudio('Token scopes');
		owner = studio.people.owner;
		studioId = studio.studioId;
	});

	it('the account page makes a read-only token that expires when chosen', async () => {
		const res = await postForm('/account?/createToken', { tokenName: 'catalogue reader', scope: 'read-only', expiresInDays: '7' }, { cookie: owner.cookie });
		expect(res.status).toBe(200);
		const secret = (await res.text()).match(/data-testid="new-token"[^>]*>(slw_[A-Za-z0-9_-]+)</)?.[1];
		expect(secret).toBeDefined();
		const row = await tokenRow(secret!);
		expect(row.scope).toBe('read-only');
		expect(Math.abs(row.expiresAt!.getTime() - (Date.now() + 7 * DAY_MS))).toBeLessThan(60_000);

		expect((await api('GET', '/api/v1/setups', { auth: { kind: 'anonymous' }, headers: bearer(secret!) })).status).toBe(200);
		const write = await api('POST', '/api/v1/setups', { auth: { kind: 'anonymous' }, headers: bearer(secret!), body: newSetupBody(studioId) });
		expectErrorBody(write, 403);
		expect(write.body.error.message).toMatch(/read-only/);
	});

	it('a scope or an expiry that is not offered is a 400 naming the field, and no token is made', async () => {
		const before = await tokenCount(owner.user.id);
		const badScope = await postForm('/account?/createToken', { tokenName: 'x', scope: 'admin', expiresInDays: '7' }, { cookie: owner.cookie });
		expect(badScope.status).toBe(400);
		expect(await badScope.text()).toContain('Choose read-only or read-write.');
		const badExpiry = await postForm('/account?/createToken', { tokenName: 'x', scope: 'read-only', expiresInDays: '100000' }, { cookie: owner.cookie });
		expect(badExpiry.status).toBe(400);
		expect(await badExpiry.text()).toContain('Choose when the token expires.');
		expect(await tokenCount(owner.user.id)).toBe(before);
	});

	it('a read-only token gets 403 on every write method and nothing changes', async () => {
		const { secret } = await createAccessToken(owner.user.id, 'read-only script', { scope: 'read-only' });
		const auth = { kind: 'anonymous' as const };
		const created = await api('POST', '/api/v1/setups', { auth: { kind: 'token', who: owner }, body: newSetupBody(studioId) });
		expect(created.status).toBe(201);
		const id = created.body.id as string;
		const [before] = await db.select().from(setups).where(eq(setups.id, id));

		expect((await api('GET', `/api/v1/setups/${id}`, { auth, headers: bearer(secret) })).status).toBe(200);
		expectErrorBody(await api('POST', '/api/v1/setups', { auth, headers: bearer(secret), body: newSetupBody(studioId) }), 403);
		expectErrorBody(await api('PUT', `/api/v1/setups/${id}`, { auth, headers: bearer(secret), body: { baseRevision: 1, document: sampleDocument({ notes: 'changed' }) } }), 403);
		expectErrorBody(await api('PATCH', `/api/v1/setups/${id}`, { auth, headers: bearer(secret), body: { title: 'changed' } }), 403);
		expectErrorBody(await api('DELETE', `/api/v1/setups/${id}`, { auth, headers: bearer(secret) }), 403);
		const [after] = await db.select().from(setups).where(eq(setups.id, id));
		expect(after).toEqual(before);
	});

	it('an expired token is 401; one that has not expired yet works', async () => {
		const live = await createAccessToken(owner.user.id, 'live', { expiresAt: new Date(Date.now() + 60_000) });
		expect((await api('GET', '/api/v1/setups', { auth: { kind: 'anonymous' }, headers: bearer(live.secret) })).status).toBe(200);
		const old = await createAccessToken(owner.user.id, 'old', { expiresAt: new Date(Date.now() + 60_000) });
		await db.update(accessTokens).set({ expiresAt: sql`now() - interval '1 second'` }).where(eq(accessTokens.id, old.id));
		const res = await api('GET', '/api/v1/setups', { auth: { kind: 'anonymous' }, headers: bearer(old.secret) });
		expectErrorBody(res, 401);
		expect(res.body.error.message).toMatch(/expired/);
	});

	it('use is noted at most once a minute, and the account page shows it with the expiry', async () => {
		const { id, secret } = await createAccessToken(owner.user.id, 'nightly export', { expiresAt: new Date(Date.now() + 30 * DAY_MS) });
		const call = () => api('GET', '/api/v1/setups', { auth: { kind: 'anonymous' }, headers: bearer(secret) });
		const lastUsed = async () => (await db.select().from(accessTokens).where(eq(accessTokens.id, id)))[0].lastUsedAt;

		expect(await lastUsed()).toBeNull();
		await call();
		const first = await lastUsed();
		expect(first).not.toBeNull();
		await call();
		expect(await lastUsed()).toEqual(first);

		const twoMinutesAgo = new Date(Date.now() - 120_000);
		await db.update(accessTokens).set({ lastUsedAt: twoMinutesAgo }).where(eq(accessTokens.id, id));
		await call();
		expect((await lastUsed())!.getTime()).toBeGreaterThan(twoMinutesAgo.getTime() + 60_000);

		const page = await (await getPage('/account', { cookie: owner.cookie })).text();
		const row = page.slice(page.indexOf('nightly export'), page.indexOf('Revoke nightly export'));
		expect(row).toContain('read and write');
		// Times are written as <time datetime> (shown in the reader's own zone once the page is live).
		expect(row).toContain(`datetime="${(await lastUsed())!.toISOString()}"`);
		expect(row).toContain(`datetime="${new Date(Date.now() + 30 * DAY_MS).toISOString().slice(0, 10)}`);
	});
});

describe('browser sessions', () => {
	it('end at the absolute limit after sign-in even when used a moment ago', async () => {
		const u = await makeUser('absolute');
		// Signed in 31 days ago and used a minute ago: the idle limit (7 days) alone would keep it for a week.
		const stale = await openSession(u.user.id, { createdAt: new Date(Date.now() - 31 * DAY_MS), expires: new Date(Date.now() + 7 * DAY_MS - 60_000) });
		const res = await getPage('/account', { cookie: stale });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toMatch(/^\/signin/);
		expectErrorBody(await api('GET', '/api/v1/setups', { auth: { kind: 'anonymous' }, headers: { cookie: stale } }), 401);
		const left = await db.select().from(sessions).where(eq(sessions.userId, u.user.id));
		expect(left.length).toBe(1); // only makeUser's own, fresh session; the stale one was deleted

		const recent = await openSession(u.user.id, { createdAt: new Date(Date.now() - 29 * DAY_MS), expires: new Date(Date.now() + DAY_MS) });
		expect((await getPage('/account', { cookie: recent })).status).toBe(200);
	});

	it('sign out everywhere ends every session of the account, lands on a signed-out page, and leaves tokens working', async () => {
		const u = await makeUser('everywhere');
		const other = await openSession(u.user.id);
		const bystander = await makeUser('bystander');

		const res = await postForm('/account?/signOutEverywhere', { redirectTo: '/signed-out' }, { cookie: u.cookie });
		expect([302, 303]).toContain(res.status);
		expect(new URL(res.headers.get('location')!, baseUrl()).pathname).toBe('/signed-out');
		expect(res.headers.getSetCookie().some((c) => /^authjs\.session-token=;/.test(c))).toBe(true);
		const landing = await getPage('/signed-out', {});
		expect(landing.status).toBe(200);
		expect(await landing.text()).toContain('You are signed out everywhere');

		expect(await db.select().from(sessions).where(eq(sessions.userId, u.user.id))).toEqual([]);
		for (const cookie of [u.cookie, other]) {
			expect((await getPage('/account', { cookie })).status).toBe(303);
		}
		expect((await getPage('/account', { cookie: bystander.cookie })).status).toBe(200);
		expect((await api('GET', '/api/v1/setups', { auth: { kind: 'token', who: u } })).status).toBe(200);
	});

	it('the sessions table never holds the token a browser carries in its cookie', async () => {
		const email = `hashed-${Date.now()}@test.example`;
		const ask = await postForm('/auth/signin/nodemailer', { email, callbackUrl: '/account' }, {});
		expect(ask.status).toBe(302);
		const link = await signInLinkFromMail(email);
		const callback = await getPage(new URL(link).pathname + new URL(link).search, {});
		expect(callback.status).toBe(302);
		const cookieToken = callback.headers
			.getSetCookie()
			.map((c) => c.match(/^authjs\.session-token=([^;]+)/)?.[1])
			.find(Boolean);
		expect(cookieToken).toBeDefined();

		const [user] = await db.select().from(users).where(eq(users.email, email));
		const rows = await db.select().from(sessions).where(eq(sessions.userId, user.id));
		expect(rows.map((r) => r.sessionToken)).toEqual([createHash('sha256').update(cookieToken!).digest('hex')]);
		const [{ n }] = await db.select({ n: count() }).from(sessions).where(eq(sessions.sessionToken, cookieToken!));
		expect(n).toBe(0);
		const [{ plain }] = await db
			.select({ plain: count() })
			.from(sessions)
			.where(and(eq(sessions.userId, user.id), sql`${sessions.sessionToken} like ${'%' + cookieToken!.slice(0, 12) + '%'}`));
		expect(plain).toBe(0);

		const account = await getPage('/account', { cookie: `authjs.session-token=${cookieToken}` });
		expect(account.status).toBe(200);
		expect(await account.text()).toContain(email);
	});
});

describe('migration 0002_hardening', () => {
	it('hashes a session open at migration time the way the app looks it up', async () => {
		const migration = readFileSync('drizzle/0002_hardening.sql', 'utf8');
		const update = migration.split('--> statement-breakpoint').map((s) => s.trim()).find((s) => /UPDATE "sessions"/.test(s));
		expect(update).toBeDefined();
		const u = await makeUser('migration');
		const plain = randomBytes(32).toString('hex');
		let hashed: string | undefined;
		// Run the migration's statement on a session stored the old way, then undo everything.
		await db
			.transaction(async (tx) => {
				await tx.insert(sessions).values({ sessionToken: plain, userId: u.user.id, expires: new Date(Date.now() + DAY_MS) });
				await tx.execute(sql.raw(update!.replace(/^--.*$/gm, '')));
				const rows = await tx.select().from(sessions).where(eq(sessions.userId, u.user.id));
				hashed = rows.map((r) => r.sessionToken).find((t) => t === createHash('sha256').update(plain).digest('hex'));
				tx.rollback();
			})
			.catch((e) => {
				if (!(e instanceof TransactionRollbackError)) throw e;
			});
		expect(hashed).toBe(createHash('sha256').update(plain).digest('hex'));
	});
});

async function signInLinkFromMail(email: string): Promise<string> {
	for (let i = 0; i < 50; i++) {
		const messages = (await (await fetch(`${process.env.DEV_MAIL_URL}/messages`)).json()) as { to: string; text: string }[];
		const hit = messages.find((m) => m.to.includes(email) && m.text.includes('/auth/callback/'));
		if (hit) return hit.text.match(/https?:\/\/\S+\/auth\/callback\/\S+/)![0];
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error(`no sign-in mail to ${email}`);
}
