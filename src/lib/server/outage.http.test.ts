// A database outage through the running app: `npm test` hands over how to stop and start the test
// cluster (SQUARELAW_TEST_CLUSTER); this file stops it under a bounded load of signed-in requests and
// checks that every answer is a fast 503 in our words, never a sign-out (401, a redirect to /signin)
// nor a 500, that the session cookie is left alone, that the calculation API keeps answering, and that
// everything recovers by itself once the cluster is back. The cluster is started again whatever
// happens. Vitest runs files one after another (`fileParallelism: false` in vite.config.ts), so no
// other test is running while the cluster is down.
import { afterAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { client } from '$lib/server/db';
import { baseUrl, makeUser, type TestUser } from '$lib/server/testing/notebook-fixtures';
import { OUTAGE_REASON, OUTAGE_TITLE } from '$lib/outage';

const clusterSetting = process.env.SQUARELAW_TEST_CLUSTER;
if (!clusterSetting) {
	throw new Error(
		'SQUARELAW_TEST_CLUSTER is not set: this test stops and starts the local test cluster, which `npm test` makes (not with DATABASE_URL).'
	);
}
const cluster = JSON.parse(clusterSetting) as { start: string[]; stop: string[] };

function pgCtl(args: string[]) {
	const r = spawnSync(args[0], args.slice(1), { cwd: '/', encoding: 'utf8' });
	if (r.status !== 0) throw new Error(`${args.join(' ')} failed (${r.status}): ${r.stderr}${r.stdout}`);
}

let clusterStopped = false;

function stopCluster() {
	clusterStopped = true;
	pgCtl(cluster.stop);
}

function startCluster() {
	if (!clusterStopped) return;
	pgCtl(cluster.start);
	clusterStopped = false;
}

afterAll(async () => {
	// Also when the test itself timed out before its `finally`: the next file needs the database.
	startCluster();
	await client.end({ timeout: 5 });
});

/** An answer to one request, timed. */
interface Answer {
	name: string;
	status: number;
	ms: number;
	contentType: string;
	setCookie: string[];
	retryAfter: string | null;
	body: string;
}

type Probe = { name: string; path: string; method?: string; headers: Record<string, string>; body?: string };

function probesFor(person: TestUser): Probe[] {
	return [
		{ name: 'signed-in page', path: '/setups', headers: { cookie: person.cookie, accept: 'text/html' } },
		{ name: 'cookie JSON', path: '/api/v1/setups', headers: { cookie: person.cookie, accept: 'application/json' } },
		{ name: 'token JSON', path: '/api/v1/setups', headers: { authorization: `Bearer ${person.token}` } }
	];
}

async function ask(probe: Probe): Promise<Answer> {
	const started = performance.now();
	const res = await fetch(`${baseUrl()}${probe.path}`, {
		method: probe.method ?? 'GET',
		headers: probe.headers,
		body: probe.body,
		redirect: 'manual',
		// A request held for as long as the database is away fails here rather than hanging the suite.
		signal: AbortSignal.timeout(15_000)
	});
	const body = await res.text();
	return {
		name: probe.name,
		status: res.status,
		ms: performance.now() - started,
		contentType: res.headers.get('content-type') ?? '',
		setCookie: res.headers.getSetCookie(),
		retryAfter: res.headers.get('retry-after'),
		body
	};
}

/** The calculation API needs no database: it answers for a signed-in caller as for anyone. */
const colour = (person: TestUser): Probe => ({
	name: 'calculation with a session cookie',
	path: '/api/v1/calc/colour',
	method: 'POST',
	headers: { cookie: person.cookie, 'content-type': 'application/json' },
	body: JSON.stringify({ fromKelvin: 5500, toKelvin: 3200 })
});

/** Within about two seconds: the bound that says the request did not wait for the database. */
const FAST_MS = 2500;

describe('a database outage', () => {
	it('answers 503 fast in our words, keeps the session, and recovers by itself', async () => {
		const person = await makeUser('outage');
		const probes = probesFor(person);
		for (const probe of probes) expect((await ask(probe)).status, `${probe.name} before the outage`).toBe(200);

		try {
			stopCluster();

			// A bounded load: twenty of each at once.
			const load = probes.flatMap((p) => Array.from({ length: 20 }, () => p));
			const answers = await Promise.all(load.map(ask));
			for (const a of answers) {
				const where = `${a.name}: ${a.status} in ${Math.round(a.ms)} ms`;
				expect(a.status, where).toBe(503);
				expect(a.ms, where).toBeLessThan(FAST_MS);
				expect(a.retryAfter, where).toBeTruthy();
				// Nothing touches the session cookie: not cleared, not replaced.
				expect(a.setCookie.filter((c) => /session-token/.test(c)), where).toEqual([]);
			}
			const page = answers.find((a) => a.name === 'signed-in page')!;
			expect(page.contentType).toMatch(/text\/html/);
			expect(page.body).toContain(OUTAGE_TITLE);
			expect(page.body).toContain('You are still signed in');
			expect(page.body).toContain('html.dark');
			for (const json of answers.filter((a) => a.name !== 'signed-in page')) {
				expect(json.contentType).toMatch(/application\/json/);
				const body = JSON.parse(json.body);
				expect(body.error.message).toContain(OUTAGE_TITLE);
				expect(body.error.issues).toEqual([]);
			}

			// A client-side navigation gets SvelteKit's error shape, which the error page shows.
			const data = await ask({ name: 'navigation', path: '/setups/__data.json', headers: { cookie: person.cookie } });
			expect(data.status).toBe(503);
			expect(JSON.parse(data.body)).toMatchObject({ reason: OUTAGE_REASON });

			// A form sent by `use:enhance` gets an action result the page can show.
			const action = await ask({
				name: 'enhanced form',
				path: '/account?/rename',
				method: 'POST',
				headers: {
					cookie: person.cookie,
					origin: baseUrl(),
					accept: 'application/json',
					'x-sveltekit-action': 'true',
					'content-type': 'application/x-www-form-urlencoded'
				},
				body: 'name=Pebble'
			});
			expect(action.status).toBe(503);
			expect(JSON.parse(action.body)).toMatchObject({ type: 'error', error: { reason: OUTAGE_REASON } });

			// An anonymous page whose load needs the database: the same page, not a 500.
			const invitation = await ask({ name: 'invitation', path: `/invitations/${randomBytes(16).toString('hex')}`, headers: { accept: 'text/html' } });
			expect(invitation.status).toBe(503);
			expect(invitation.body).toContain(OUTAGE_TITLE);

			// The calculation API keeps working, also for a signed-in caller; health says the database is down.
			const calc = await ask(colour(person));
			expect(calc.status, calc.body).toBe(200);
			expect(JSON.parse(calc.body).miredShift).toBeCloseTo(1e6 / 3200 - 1e6 / 5500, 6);
			const health = await ask({ name: 'health', path: '/api/v1/health', headers: {} });
			expect(health.status).toBe(503);
			expect(JSON.parse(health.body)).toEqual({ ok: true, db: 'down' });
		} finally {
			startCluster();
		}

		// Back: the same cookie and token work again without anyone signing in, within a bounded wait.
		for (const probe of probes) {
			let last: Answer | null = null;
			for (let i = 0; i < 40 && last?.status !== 200; i++) {
				if (last) await new Promise((r) => setTimeout(r, 250));
				last = await ask(probe);
			}
			expect(last!.status, `${probe.name} after the outage`).toBe(200);
			expect(last!.setCookie.filter((c) => /session-token=;/.test(c))).toEqual([]);
		}
		const page = await ask(probes[0]);
		expect(page.body).not.toContain(OUTAGE_TITLE);
	}, 90_000);
});
