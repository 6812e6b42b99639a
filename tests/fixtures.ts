// Shared Playwright fixtures. Every test gets a page whose requests are watched: any request to a host
// other than this machine fails the test, so fonts, styles and scripts must all be served by the app.
import fs from 'node:fs';
import { randomUUID } from 'node:crypto';
import path from 'node:path';
import { test as base, expect, type Browser, type BrowserContext, type Cookie, type Page } from '@playwright/test';

const LOCAL_HOSTS = new Set(['127.0.0.1', 'localhost', '[::1]']);

/** Records every request of `context` that goes to a host other than this machine. */
function watchOffsite(context: BrowserContext, offsite: string[]) {
	context.on('request', (request) => {
		const url = new URL(request.url());
		if (url.protocol === 'data:' || url.protocol === 'blob:' || url.protocol === 'about:') return;
		if (!LOCAL_HOSTS.has(url.hostname)) offsite.push(request.url());
	});
}

export const test = base.extend<{ offsiteRequests: string[]; newPage: () => Promise<Page> }>({
	offsiteRequests: [
		async ({ context }, use) => {
			const offsite: string[] = [];
			watchOffsite(context, offsite);
			await use(offsite);
			expect(offsite, 'requests that left 127.0.0.1').toEqual([]);
		},
		{ auto: true }
	],
	/** A page in a fresh browser context (a second person, with their own cookies), watched the same way. */
	newPage: async ({ browser, baseURL, offsiteRequests }, use) => {
		const contexts: BrowserContext[] = [];
		await use(async () => {
			const context = await browser.newContext({ baseURL });
			watchOffsite(context, offsiteRequests);
			contexts.push(context);
			return context.newPage();
		});
		for (const context of contexts) await context.close();
	}
});

export { expect };

interface MailMessage {
	to: string;
	subject: string;
	text: string;
	receivedAt: string;
}

/** The newest message to `to` whose subject matches, read from the local mail fake. */
export async function waitForMail(page: Page, to: string, subject: RegExp, after = 0): Promise<MailMessage> {
	for (let i = 0; i < 50; i++) {
		const res = await page.request.get('/api/dev/mail');
		expect(res.status()).toBe(200);
		const messages = (await res.json()) as MailMessage[];
		const hit = messages.find(
			(m) => m.to.includes(to) && subject.test(m.subject) && Date.parse(m.receivedAt) >= after
		);
		if (hit) return hit;
		await page.waitForTimeout(200);
	}
	throw new Error(`no mail to ${to} matching ${subject}`);
}

export function firstLink(text: string): string {
	const match = text.match(/https?:\/\/\S+/);
	if (!match) throw new Error('the message holds no link');
	return match[0];
}

/** Asks for a sign-in link through the form and returns the link from the mail fake, unopened. */
export async function requestSignInLink(page: Page, email: string, returnTo = '/studios'): Promise<string> {
	const before = Date.now() - 1000;
	await page.goto(`/signin?callbackUrl=${encodeURIComponent(returnTo)}`);
	await page.getByLabel('E-mail address').fill(email);
	await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
	await expect(page.getByRole('heading', { name: 'Check your mail' })).toBeVisible();
	const mail = await waitForMail(page, email, /sign-in link/i, before);
	return firstLink(mail.text);
}

/** Signs in through the real e-mail link flow: the form, the mail fake, the link. Returns the used link. */
export async function signIn(page: Page, email: string, returnTo = '/studios'): Promise<string> {
	const link = await requestSignInLink(page, email, returnTo);
	await page.goto(link);
	return link;
}

/**
 * Sign-in links are rate-limited per address, so each demo user signs in once for the run and tests
 * reuse the session cookie (kept in the test output folder, so a new worker after a failure reuses it
 * too; a cookie the server no longer knows is replaced by a fresh sign-in).
 */
export async function signedInAs(context: BrowserContext, browser: Browser, baseURL: string | undefined, email: string) {
	const file = path.join(test.info().project.outputDir, '.sessions', `${email}.json`);
	if (fs.existsSync(file)) {
		await context.addCookies(JSON.parse(fs.readFileSync(file, 'utf8')) as Cookie[]);
		const probe = await context.request.get('/api/v1/setups?pageSize=1');
		if (probe.status() === 200) return;
		await context.clearCookies();
	}
	const ctx = await browser.newContext({ baseURL });
	const page = await ctx.newPage();
	await signIn(page, email, '/setups');
	await expect(page.getByRole('heading', { level: 1, name: 'Notebook' })).toBeVisible();
	const cookies = await ctx.cookies();
	await ctx.close();
	fs.mkdirSync(path.dirname(file), { recursive: true });
	fs.writeFileSync(file, JSON.stringify(cookies));
	await context.addCookies(cookies);
}

/**
 * A new setup in the signed-in user's first studio: a quartz cluster with one flash 30 cm to its left,
 * at f/16, 1:2, ISO 100, the flash at 1/8 of guide number 40. `label` goes into the title and subject.
 */
export async function createQuartzSetup(page: Page, label: string): Promise<string> {
	const list = await (await page.request.get('/api/v1/setups?pageSize=1')).json();
	const res = await page.request.post('/api/v1/setups', {
		data: {
			studioId: list.items[0].studioId as string,
			title: `${label} ${randomUUID().slice(0, 8)}`,
			subject: `Quartz cluster (${label.toLowerCase()})`,
			document: {
				schemaVersion: 1,
				scene: {
					camera: { iso: 100, aperture: 16, shutter: 1 / 160, magnification: 0.5 },
					// The face the tests read is turned to the key (the editor's camera stands in front, and a face
					// toward it would get the 90° key at grazing incidence: nothing, by Lambert's cosine law).
					subject: { position: [0, 0, 0.03], normal: [-1, 0, 0] },
					lights: [{ id: 'key', kind: 'flash', position: [-0.3, 0, 0.03], guideNumber: 40, power: 0.125 }]
				},
				plan: {},
				notes: ''
			}
		}
	});
	expect(res.status()).toBe(201);
	return ((await res.json()) as { id: string }).id;
}
