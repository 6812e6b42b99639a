// Following live through the running app: a student's Server-Sent Events stream gets the current step
// on connect and every move the instructor makes, a reconnecting browser's Last-Event-ID is honoured,
// strangers get 404; and the database restarting under a live session: the follower's stream stays
// open, a browser that connects meanwhile gets a 503 (its page opens a new stream after the pause),
// and once the database is back the next move reaches the follower on the stream it already had (the
// hub LISTENs again and catches up). `npm test` hands over how to stop and start the test cluster
// (SQUARELAW_TEST_CLUSTER), as for outage.http.test.ts; vitest runs files one after another.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import type { LivePosition } from '$lib/present/live-message';

const clusterSetting = process.env.SQUARELAW_TEST_CLUSTER;
if (!process.env.DATABASE_URL || !process.env.TEST_BASE_URL || !clusterSetting) {
	throw new Error('DATABASE_URL, TEST_BASE_URL and SQUARELAW_TEST_CLUSTER are not set: run this through `npm test`.');
}
const cluster = JSON.parse(clusterSetting) as { start: string[]; stop: string[] };
const { client, db } = await import('$lib/server/db');
const { workshopMembers } = await import('$lib/server/db/schema');
const { baseUrl, makeUser, sampleDocument } = await import('$lib/server/testing/notebook-fixtures');
const { createSetup } = await import('$lib/server/setups');
const { setupCreateSchema } = await import('$lib/scene/inputs');
const { createWorkshop, addLesson, addStep } = await import('$lib/server/workshops');

function pgCtl(args: string[]) {
	const r = spawnSync(args[0], args.slice(1), { cwd: '/', encoding: 'utf8' });
	if (r.status !== 0) throw new Error(`${args.join(' ')} failed (${r.status}): ${r.stderr}${r.stdout}`);
}
let clusterStopped = false;
function startCluster() {
	if (!clusterStopped) return;
	pgCtl(cluster.start);
	clusterStopped = false;
}

/** A follower's stream read as the browser would: events as they come. */
async function follow(workshopId: string, cookie: string, lastEventId?: string) {
	const controller = new AbortController();
	const res = await fetch(`${baseUrl()}/workshops/${workshopId}/follow/events`, {
		headers: { cookie, accept: 'text/event-stream', ...(lastEventId ? { 'last-event-id': lastEventId } : {}) },
		signal: controller.signal
	});
	const events: { id: string; position: LivePosition }[] = [];
	let text = '';
	let ended = false;
	if (res.status === 200 && res.body) {
		const reader = res.body.pipeThrough(new TextDecoderStream()).getReader();
		void (async () => {
			try {
				for (;;) {
					const { value, done } = await reader.read();
					if (done) break;
					text += value;
					let end;
					while ((end = text.indexOf('\n\n')) >= 0) {
						const block = text.slice(0, end);
						text = text.slice(end + 2);
						const id = block.match(/^id: (.*)$/m)?.[1];
						const data = block.match(/^data: (.*)$/m)?.[1];
						if (id && data) events.push({ id, position: JSON.parse(data) });
					}
				}
			} catch {
				// aborted
			}
			ended = true;
		})();
	}
	return {
		status: res.status,
		contentType: res.headers.get('content-type'),
		events,
		get ended() {
			return ended;
		},
		close: () => controller.abort()
	};
}

async function until(check: () => boolean, what: string, ms = 10_000) {
	const end = Date.now() + ms;
	while (!check()) {
		if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
		await new Promise((r) => setTimeout(r, 25));
	}
}

/** The instructor's projector moves to a step (as the present view does). */
function move(workshopId: string, cookie: string, stepId: string | null) {
	return fetch(`${baseUrl()}/workshops/${workshopId}/present/live`, {
		method: 'POST',
		headers: { cookie, 'content-type': 'application/json', origin: baseUrl() },
		body: JSON.stringify({ stepId }),
		signal: AbortSignal.timeout(10_000)
	});
}

let world: {
	workshopId: string;
	steps: string[];
	instructor: Awaited<ReturnType<typeof makeUser>>;
	student: Awaited<ReturnType<typeof makeUser>>;
	stranger: Awaited<ReturnType<typeof makeUser>>;
};

beforeAll(async () => {
	const instructor = await makeUser('live-instructor');
	const student = await makeUser('live-student');
	const stranger = await makeUser('live-stranger');
	const setup = await createSetup(
		instructor.user,
		setupCreateSchema.parse({ studioId: instructor.personalStudioId, title: 'Quartz for the live test', subject: 'Quartz cluster', document: sampleDocument() })
	);
	const workshop = await createWorkshop(instructor.user, { studioId: instructor.personalStudioId, title: 'Live test workshop', summary: '', capacity: 12 });
	const lesson = await addLesson(instructor.user, workshop.id, { title: 'Key and card', studentNotes: '', presenterNotes: 'Say why the card helps.' });
	const one = await addStep(instructor.user, workshop.id, lesson.id, { setupId: setup.id, revisionNumber: 1, hiddenElementIds: ['card'], caption: 'The key alone' });
	const two = await addStep(instructor.user, workshop.id, lesson.id, { setupId: setup.id, revisionNumber: 1, hiddenElementIds: [], caption: 'Add the card' });
	await db.insert(workshopMembers).values({ workshopId: workshop.id, userId: student.user.id, role: 'student' });
	world = { workshopId: workshop.id, steps: [one.id, two.id], instructor, student, stranger };
});

afterAll(async () => {
	startCluster();
	await client.end({ timeout: 5 });
});

describe('following live', () => {
	it('lets only the workshop’s people follow: a stranger gets 404, nobody signed in 401', async () => {
		const stranger = await follow(world.workshopId, world.stranger.cookie);
		expect(stranger.status).toBe(404);
		const anonymous = await follow(world.workshopId, '');
		expect(anonymous.status).toBe(401);
		const refused = await move(world.workshopId, world.student.cookie, world.steps[0]);
		expect(refused.status).toBe(403);
	});

	it('sends the current step on connect and every move after, and honours Last-Event-ID', async () => {
		const first = await follow(world.workshopId, world.student.cookie);
		expect(first.status).toBe(200);
		expect(first.contentType).toMatch(/^text\/event-stream/);
		await until(() => first.events.length === 1, 'the current position');
		expect(first.events[0].position.workshopId).toBe(world.workshopId);

		expect((await move(world.workshopId, world.instructor.cookie, world.steps[0])).status).toBe(200);
		await until(() => first.events.at(-1)?.position.stepId === world.steps[0], 'the first step');
		const seen = first.events.at(-1)!.id;

		// A browser that reconnects with the last id it had is not sent that step again…
		const again = await follow(world.workshopId, world.student.cookie, seen);
		await new Promise((r) => setTimeout(r, 300));
		expect(again.events).toEqual([]);
		// …but gets the next move, as does the first stream.
		expect((await move(world.workshopId, world.instructor.cookie, world.steps[1])).status).toBe(200);
		await until(() => again.events.length === 1 && first.events.at(-1)?.position.stepId === world.steps[1], 'the second step on both');
		expect(again.events[0].position.stepId).toBe(world.steps[1]);
		// A browser that missed a move (an older id) gets the current step on connect.
		const late = await follow(world.workshopId, world.student.cookie, seen);
		await until(() => late.events.length === 1, 'the current step for a late reconnect');
		expect(late.events[0].position.stepId).toBe(world.steps[1]);
		for (const s of [first, again, late]) s.close();
	});

	it('recovers when the database restarts during a live session, on the stream the follower already has', async () => {
		expect((await move(world.workshopId, world.instructor.cookie, world.steps[0])).status).toBe(200);
		const follower = await follow(world.workshopId, world.student.cookie);
		await until(() => follower.events.at(-1)?.position.stepId === world.steps[0], 'the step before the restart');
		try {
			clusterStopped = true;
			pgCtl(cluster.stop);
			await new Promise((r) => setTimeout(r, 1500));
			// A browser that connects now is answered 503 quickly (its page tries again after the pause).
			const meanwhile = await follow(world.workshopId, world.student.cookie);
			expect(meanwhile.status).toBe(503);
			expect(follower.ended).toBe(false);
		} finally {
			startCluster();
		}
		// The instructor's projector sends its next step again until the app answers (as LivePublisher does).
		const deadline = Date.now() + 20_000;
		for (;;) {
			const res = await move(world.workshopId, world.instructor.cookie, world.steps[1]).catch(() => null);
			if (res?.status === 200) break;
			if (Date.now() > deadline) throw new Error(`the move was not taken after the restart (last: ${res?.status})`);
			await new Promise((r) => setTimeout(r, 250));
		}
		await until(() => follower.events.at(-1)?.position.stepId === world.steps[1], 'the step after the restart, on the same stream', 15_000);
		expect(follower.ended).toBe(false);
		follower.close();
	}, 60_000);
});
