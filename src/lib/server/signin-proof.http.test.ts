// Strangers cannot lock the owner of an address out of signing in: once a browser has used a sign-in
// link for an address, its requests for new links are counted apart from everyone else's. Runs
// against the app `npm test` starts, through the real mail flow (the local mail fake).
import { describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { post, requireTestEnv } from '$lib/server/testing/running-app';

requireTestEnv('TEST_BASE_URL');
const BASE = process.env.TEST_BASE_URL!;

const PROOF_COOKIE = 'squarelaw-signin-proof';

interface Mail {
	to: string;
	text: string;
	receivedAt: string;
}

/** The mailbox, read through the app's development route (open on the loopback-only test server). */
async function mailsTo(email: string): Promise<Mail[]> {
	const res = await fetch(new URL('/api/dev/mail', BASE));
	expect(res.status).toBe(200);
	return ((await res.json()) as Mail[]).filter((m) => m.to.includes(email));
}

/** Asks for a sign-in link as a browser without JavaScript posts the form. */
function askForLink(email: string, cookie?: string) {
	return post('/auth/signin/nodemailer', { email, callbackUrl: '/setups' }, cookie);
}

function accepted(res: Response): boolean {
	return res.status === 302 && /\/verify-request|\/signin\/check/.test(res.headers.get('location') ?? '');
}

function refused(res: Response): boolean {
	if (res.status !== 303) return false;
	return new URL(res.headers.get('location')!, BASE).searchParams.get('error') === 'RateLimited';
}

/** The newest sign-in link in the mailbox for `email`, waiting for it to arrive. */
async function newestLink(email: string, count: number): Promise<string> {
	for (let i = 0; i < 50; i++) {
		const mails = await mailsTo(email);
		if (mails.length >= count) return mails[0].text.match(/https?:\/\/\S+/)![0];
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error(`expected ${count} mails to ${email}`);
}

/** The owner of `email` signs in by link in a fresh browser; returns that browser's proof cookie. */
async function signInByLink(email: string): Promise<{ proof: string; setCookie: string }> {
	const before = (await mailsTo(email)).length;
	expect(accepted(await askForLink(email))).toBe(true);
	const link = await newestLink(email, before + 1);
	const res = await fetch(link, { redirect: 'manual' });
	expect(res.status).toBe(302);
	const cookies = res.headers.getSetCookie();
	expect(cookies.some((c) => /^authjs\.session-token=[^;]+/.test(c)), 'signed in').toBe(true);
	const setCookie = cookies.find((c) => c.startsWith(`${PROOF_COOKIE}=`));
	expect(setCookie, 'the proof cookie is set').toBeTruthy();
	return { proof: setCookie!.split(';')[0], setCookie: setCookie! };
}

const address = (name: string) => `${name}+${randomUUID().slice(0, 8)}@fernhill.example`;

/** A stranger asks for links for `email` until the address's limit refuses them. */
async function exhaust(email: string): Promise<number> {
	let sent = 0;
	for (let i = 0; i < 10; i++) {
		const res = await askForLink(email);
		if (refused(res)) return sent;
		expect(accepted(res), `request ${i + 1}`).toBe(true);
		sent += 1;
	}
	throw new Error('the per-address limit never refused the stranger');
}

describe('sign-in lock-out', () => {
	it('a stranger who uses up the address limit cannot keep its owner from getting a link', async () => {
		const email = address('mara.quill');
		const { proof, setCookie } = await signInByLink(email);
		expect(setCookie).toMatch(/; HttpOnly/);
		expect(setCookie).toMatch(/; SameSite=Lax/);
		expect(setCookie).toMatch(/; Path=\//);

		// The owner has used one of the address's five; the stranger uses the other four and is refused.
		expect(await exhaust(email)).toBe(4);
		expect(refused(await askForLink(email)), 'the stranger stays refused').toBe(true);

		// The owner, signed out (only the proof cookie left), still gets a link, and it arrives.
		const before = (await mailsTo(email)).length;
		const res = await askForLink(email, proof);
		expect(accepted(res), `the owner's request answered ${res.status} ${res.headers.get('location')}`).toBe(true);
		await newestLink(email, before + 1);

		// The owner's own requests are limited too (five in 15 minutes), so a stolen cookie cannot flood the mailbox.
		for (let i = 2; i <= 5; i++) expect(accepted(await askForLink(email, proof)), `owner request ${i}`).toBe(true);
		expect(refused(await askForLink(email, proof))).toBe(true);
	});

	it('a proof counts for its own address only, and a forged one for none', async () => {
		const owned = address('tobias.wren');
		const other = address('operator');
		const { proof } = await signInByLink(owned);
		await exhaust(other);
		expect(refused(await askForLink(other, proof)), 'a proof for another address').toBe(true);

		await exhaust(owned);
		const [name, value] = proof.split('=');
		const [expires, mac] = value.split('.');
		const forged = [
			`${name}=${Number(expires) + 86400}.${mac}`,
			`${name}=${expires}.${'A'.repeat(43)}`,
			`${name}=${expires}.${mac}`.replace(name, 'authjs.session-token')
		];
		for (const cookie of forged) expect(refused(await askForLink(owned, cookie)), cookie).toBe(true);
		// The real one still works.
		expect(accepted(await askForLink(owned, proof))).toBe(true);
	});
});
