// Workshops bench. (a) Follow live: 200 followers hold Server-Sent Events streams of the seeded
// workshop; the instructor moves to the next step (POST, as the present view does) again and again;
// for each move, the time until every follower has it. Once with all followers on the bench's app
// server, once split across it and a second app server (the same build, its own port, the same
// database): the move is made on the first, so the second hears of it only through PostgreSQL's
// NOTIFY. Goal: p95 ≤ 250 ms for both. (b) The present view in Chromium: the time from a key press to
// the next animation frame after the new step's caption is in the page (no server round trip per
// step); the median is reported (goal: within one frame, 16.7 ms).
import http from 'node:http';
import { createHash, randomBytes } from 'node:crypto';
import path from 'node:path';
import postgres from 'postgres';
import { chromium } from '@playwright/test';
import { chromiumLaunchOptions } from '../lib/chromium.mjs';
import { startChild, waitForHttp, portInUse, root } from '../lib/bootstrap.mjs';
import { stopChild } from '../lib/stack.mjs';
import { median, percentile, round } from '../lib/stats.mjs';

const FOLLOWERS = Number(process.env.SQUARELAW_BENCH_FOLLOWERS ?? 200);
const MOVES = Number(process.env.SQUARELAW_BENCH_MOVES ?? 30);
const KEY_PRESSES = 40;
const GOAL_P95_MS = 250;
const FRAME_MS = 16.7;
/** The second app server's port: SQUARELAW_BENCH_SECOND_PORT, or the bench port + 50. */
const secondPort = (basePort) => Number(process.env.SQUARELAW_BENCH_SECOND_PORT ?? basePort + 50);

/** The seeded workshop (the demo's "Small Light, Big Detail"): its instructor, first lesson and steps. */
async function seededWorkshop(sql) {
	const [workshop] = await sql`select id, title from workshops where title = 'Small Light, Big Detail' limit 1`;
	if (!workshop) throw new Error('the seed has no workshop “Small Light, Big Detail”');
	const [lesson] = await sql`select id from workshop_lessons where workshop_id = ${workshop.id} order by position limit 1`;
	const steps = await sql`select id, caption from workshop_steps where lesson_id = ${lesson.id} order by position`;
	const [instructor] = await sql`
		select u.id from users u join memberships m on m.user_id = u.id
		join workshops w on w.studio_id = m.studio_id and w.id = ${workshop.id}
		where m.role in ('owner', 'editor') order by m.role limit 1`;
	if (steps.length < 2 || !instructor) throw new Error('the seeded workshop needs an instructor and at least two steps');
	return { workshopId: workshop.id, lessonId: lesson.id, steps: steps.map((s) => s.id), instructorId: instructor.id };
}

async function sessionCookie(sql, userId) {
	const token = randomBytes(32).toString('hex');
	// The sessions table keeps the SHA-256 of the cookie's token (see hashed-sessions.ts).
	const hash = createHash('sha256').update(token).digest('hex');
	await sql`insert into sessions (session_token, user_id, expires) values (${hash}, ${userId}, now() + interval '1 hour')`;
	return { token, cookie: `authjs.session-token=${token}` };
}

/** An SSE follower over plain HTTP: records when each step id arrives. */
function follower(origin, workshopId, cookie) {
	const url = new URL(`/workshops/${workshopId}/follow/events`, origin);
	const arrivals = new Map();
	let resolveOpen;
	let rejectOpen;
	const opened = new Promise((resolve, reject) => ((resolveOpen = resolve), (rejectOpen = reject)));
	const req = http.get(url, { headers: { cookie, accept: 'text/event-stream' }, agent: false }, (res) => {
		if (res.statusCode !== 200) return rejectOpen(new Error(`${url.pathname} answered ${res.statusCode}`));
		res.setEncoding('utf8');
		let buffer = '';
		res.on('data', (chunk) => {
			const now = performance.now();
			buffer += chunk;
			let end;
			while ((end = buffer.indexOf('\n\n')) >= 0) {
				const event = buffer.slice(0, end);
				buffer = buffer.slice(end + 2);
				const data = event.split('\n').find((l) => l.startsWith('data: '));
				if (!data) continue;
				const { stepId } = JSON.parse(data.slice(6));
				if (!arrivals.has(stepId)) arrivals.set(stepId, []);
				arrivals.get(stepId).push(now);
				resolveOpen();
			}
		});
	});
	req.on('error', (e) => rejectOpen(e));
	return { opened, arrivals, close: () => req.destroy() };
}

async function until(check, what, ms = 10_000) {
	const end = Date.now() + ms;
	while (!check()) {
		if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
		await new Promise((r) => setTimeout(r, 2));
	}
}

/** Moves the live step MOVES times and returns, per move, the time until the last follower had it. */
async function measureFanOut({ origins, presentOrigin, workshopId, steps, cookie, log, label }) {
	const followers = [];
	for (let i = 0; i < FOLLOWERS; i++) followers.push(follower(origins[i % origins.length], workshopId, cookie));
	await Promise.all(followers.map((f) => f.opened));
	const allMs = [];
	let stepIndex = 0;
	for (let move = 0; move < MOVES; move++) {
		stepIndex = (stepIndex + 1) % steps.length;
		const stepId = steps[stepIndex];
		const seenBefore = followers.map((f) => f.arrivals.get(stepId)?.length ?? 0);
		const t0 = performance.now();
		const res = await fetch(new URL(`/workshops/${workshopId}/present/live`, presentOrigin), {
			method: 'POST',
			headers: { cookie, 'content-type': 'application/json', origin: presentOrigin },
			body: JSON.stringify({ stepId })
		});
		if (!res.ok) throw new Error(`moving the live step answered ${res.status}: ${await res.text()}`);
		await until(() => followers.every((f, i) => (f.arrivals.get(stepId)?.length ?? 0) > seenBefore[i]), `every follower to get move ${move + 1}`);
		const last = Math.max(...followers.map((f) => f.arrivals.get(stepId).at(-1)));
		allMs.push(last - t0);
		await new Promise((r) => setTimeout(r, 50));
	}
	for (const f of followers) f.close();
	const p95 = round(percentile(allMs, 95));
	log(`${label}: ${FOLLOWERS} followers, ${MOVES} moves: every follower had the step after median ${round(median(allMs))} ms, p95 ${p95} ms (goal ≤ ${GOAL_P95_MS})`);
	return { followers: FOLLOWERS, moves: MOVES, medianMs: round(median(allMs)), p95Ms: p95, goalMet: p95 <= GOAL_P95_MS };
}

/** A second app server from the same build on the same database. */
async function startSecondServer(env, log) {
	const port = secondPort(Number(env.PORT));
	if (await portInUse(port, env.HOST)) throw new Error(`port ${port} for the second app server is taken (set SQUARELAW_BENCH_SECOND_PORT)`);
	const origin = `http://${env.HOST}:${port}`;
	const child = await startChild('app-2', process.execPath, [path.join(root, 'build')], { env: { ...env, PORT: String(port), ORIGIN: origin }, quiet: true });
	await waitForHttp(`${origin}/api/v1/health`);
	log(`second app server on ${origin}`);
	return { origin, child };
}

/** The present view's step change in Chromium: key press → the frame after the new caption is in the page. */
async function measureStepChange({ baseUrl, token, workshopId, lessonId, steps, log }) {
	const browser = await chromium.launch(chromiumLaunchOptions);
	try {
		const context = await browser.newContext({ viewport: { width: 1600, height: 900 } });
		await context.addCookies([{ name: 'authjs.session-token', value: token, url: baseUrl }]);
		const page = await context.newPage();
		await page.goto(new URL(`/workshops/${workshopId}/present/${lessonId}`, baseUrl).href);
		await page.getByTestId('present-caption').waitFor();
		await page.locator('[data-testid="plan-canvas"] canvas').first().waitFor();
		const times = [];
		let index = 0;
		for (let i = 0; i < KEY_PRESSES; i++) {
			// Back and forth through the lesson, so every press changes the step.
			const forward = index < steps.length - 1 && (index === 0 || Math.floor(i / (steps.length - 1)) % 2 === 0);
			index += forward ? 1 : -1;
			const ms = await page.evaluate((key) => {
				const caption = document.querySelector('[data-testid="present-caption"]');
				const before = caption.textContent;
				return new Promise((resolve) => {
					const t0 = performance.now();
					const observer = new MutationObserver(() => {
						if (caption.textContent === before) return;
						observer.disconnect();
						requestAnimationFrame(() => resolve(performance.now() - t0));
					});
					observer.observe(caption, { childList: true, characterData: true, subtree: true });
					(document.activeElement ?? document.body).dispatchEvent(new KeyboardEvent('keydown', { key, bubbles: true, cancelable: true }));
				});
			}, forward ? 'ArrowRight' : 'ArrowLeft');
			times.push(ms);
			await page.waitForTimeout(30);
		}
		const med = round(median(times));
		log(`present view: ${KEY_PRESSES} step changes: median ${med} ms, p95 ${round(percentile(times, 95))} ms (goal: median within one frame, ${FRAME_MS} ms)`);
		return { presses: KEY_PRESSES, medianMs: med, p95Ms: round(percentile(times, 95)), goalMet: med <= FRAME_MS };
	} finally {
		await browser.close();
	}
}

export async function run({ baseUrl, databaseUrl, env, log = console.log }) {
	const sql = postgres(databaseUrl, { max: 1, onnotice: () => {} });
	let second = null;
	try {
		const { workshopId, lessonId, steps, instructorId } = await seededWorkshop(sql);
		const { token, cookie } = await sessionCookie(sql, instructorId);
		const oneServer = await measureFanOut({ origins: [baseUrl], presentOrigin: baseUrl, workshopId, steps, cookie, log, label: 'one app server' });
		second = await startSecondServer(env, log);
		const twoServers = await measureFanOut({ origins: [baseUrl, second.origin], presentOrigin: baseUrl, workshopId, steps, cookie, log, label: 'two app servers' });
		await stopChild(second.child);
		second = null;
		const stepChange = await measureStepChange({ baseUrl, token, workshopId, lessonId, steps, log });
		return { followLive: { oneServer, twoServers }, presentStepChange: stepChange };
	} finally {
		if (second) await stopChild(second.child);
		await sql.end({ timeout: 5 });
	}
}
