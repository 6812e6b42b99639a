// Requests for a sign-in link through the running app: the per-address limit with a clear message, a
// malformed address sent back to the form as typed, and the same answer whether or not an account exists.
import { afterAll, describe, expect, it } from 'vitest';
import { requireTestEnv } from '$lib/server/testing/running-app';
import { count, eq } from 'drizzle-orm';

requireTestEnv('DATABASE_URL', 'TEST_BASE_URL', 'DEV_MAIL_URL');
const BASE = process.env.TEST_BASE_URL!;

const { client, db } = await import('$lib/server/db');
const { rateLimitHits, users } = await import('$lib/server/db/schema');
const { address, makeUser, post, signInTraces } = await import('$lib/server/testing/studio-world');

afterAll(async () => {
	await client.end({ timeout: 5 });
});

describe('sign-in link requests', () => {
	it('the 6th request for one address within 15 minutes is refused and the page says why', async () => {
		const email = address('pebble.finch');
		for (let i = 1; i <= 5; i++) {
			const res = await post('/auth/signin/nodemailer', { email, callbackUrl: '/studios' });
			expect(res.status, `request ${i}`).toBe(302);
			expect(res.headers.get('location')).toMatch(/\/verify-request/);
		}
		const refused = await post('/auth/signin/nodemailer', { email, callbackUrl: '/studios' });
		expect(refused.status).toBe(303);
		const location = new URL(refused.headers.get('location')!, BASE);
		expect(location.pathname).toBe('/signin');
		expect(location.searchParams.get('error')).toBe('RateLimited');

		const page = await (await fetch(location)).text();
		expect(page).toContain('Too many sign-in links were asked for just now. Wait 15 minutes, then try again.');
		// The address is kept in the field, so nothing typed is lost.
		expect(page).toContain(`value="${email}"`);

		const traces = await signInTraces(email);
		expect(traces.tokens).toBe(5);
		expect(traces.mails).toBe(5);

		// The limit is per address: another address from the same machine still gets its link.
		const other = address('ines.marlow');
		const ok = await post('/auth/signin/nodemailer', { email: other, callbackUrl: '/studios' });
		expect(ok.status).toBe(302);
		expect(ok.headers.get('location')).toMatch(/\/verify-request/);
	});

	for (const bad of ['pebble.finch', 'pebble.finch@fernhill', 'pebble finch@fernhill.example', '']) {
		it(`a malformed address (${JSON.stringify(bad)}) gets a clear message and changes nothing`, async () => {
			const before = await signInTraces(bad.toLowerCase());
			const res = await post('/auth/signin/nodemailer', { email: bad, callbackUrl: '/invitations/abc' });
			expect(res.status).toBe(303);
			const location = new URL(res.headers.get('location')!, BASE);
			expect(location.pathname).toBe('/signin');
			expect(location.searchParams.get('error')).toBe('InvalidEmail');
			// Where the person was going is kept, so fixing the address still lands them there.
			expect(location.searchParams.get('callbackUrl')).toBe('/invitations/abc');
			const page = await (await fetch(location)).text();
			expect(page).toContain('That is not an e-mail address. It should look like name@example.org.');
			expect(page).toContain('value="/invitations/abc"');
			expect(await signInTraces(bad.toLowerCase())).toEqual(before);
		});
	}

	it('the answer is the same whether or not the address has an account', async () => {
		const known = await makeUser('mara.quill');
		const unknown = address('mara.quill');
		const answers = [];
		for (const email of [known.email, unknown]) {
			const res = await post('/auth/signin/nodemailer', { email, callbackUrl: '/studios' });
			answers.push({ status: res.status, location: res.headers.get('location'), body: await res.text() });
		}
		expect(answers[0]).toEqual(answers[1]);
		expect(answers[0].location).toMatch(/\/verify-request/);
		// Asking for a link makes no account; following it does.
		const [{ n }] = await db.select({ n: count() }).from(users).where(eq(users.email, unknown));
		expect(n).toBe(0);
	});

	it('a burst of simultaneous requests cannot get past the limit', async () => {
		const { hitRateLimits } = await import('$lib/server/db/queries/rate-limits');
		const bucket = `signin:addr:${address('pebble.finch')}`;
		const rules = [{ bucket, limit: 5, windowMs: 15 * 60_000 }];
		const answers = await Promise.all(Array.from({ length: 12 }, () => hitRateLimits(rules)));
		expect(answers.filter((a) => a.allowed)).toHaveLength(5);
		expect(answers.filter((a) => !a.allowed).every((a) => a.retryAfterS > 0)).toBe(true);
		const [{ n }] = await db.select({ n: count() }).from(rateLimitHits).where(eq(rateLimitHits.bucket, bucket));
		expect(n).toBe(5);
	});

	it('a form post from another origin is refused (403) and sends nothing', async () => {
		const email = address('pebble.finch');
		const res = await fetch(new URL('/auth/signin/nodemailer', BASE), {
			method: 'POST',
			redirect: 'manual',
			headers: { origin: 'http://evil.example', 'content-type': 'application/x-www-form-urlencoded' },
			body: new URLSearchParams({ email })
		});
		expect(res.status).toBe(403);
		expect(await signInTraces(email)).toEqual({ tokens: 0, rateLimitHits: 0, users: 0, mails: 0 });
	});
});
