// The live fan-out on the real PostgreSQL: two hubs, each with its own LISTEN connection, stand for two
// app servers on one database. A NOTIFY reaches the followers of that workshop on both and nobody
// else; a follower never gets a position older than one it has; one that left gets nothing more; the
// heartbeat is a comment. (The database restarting under a live session: live.http.test.ts.)
import { afterAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import type { LivePosition } from '$lib/present/live-message';

if (!process.env.DATABASE_URL) {
	throw new Error('DATABASE_URL is not set: these tests run against the real PostgreSQL (run them through `npm test`).');
}
const databaseUrl = process.env.DATABASE_URL;
const { client } = await import('$lib/server/db');
const { LiveHub } = await import('./hub');
const { publishLivePosition } = await import('./publish');

const decoder = new TextDecoder();

/** A follower's stream that keeps what it was sent as text. */
function recorder() {
	const chunks: string[] = [];
	let closed = false;
	return {
		stream: { write: (c: Uint8Array) => void chunks.push(decoder.decode(c)), close: () => void (closed = true) },
		get text() {
			return chunks.join('');
		},
		get closed() {
			return closed;
		},
		/** The step ids of the events received, in order. */
		get steps() {
			return [...this.text.matchAll(/^data: (.*)$/gm)].map((m) => (JSON.parse(m[1]) as LivePosition).stepId);
		}
	};
}

async function until(check: () => boolean, what: string, ms = 5000) {
	const end = Date.now() + ms;
	while (!check()) {
		if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
		await new Promise((r) => setTimeout(r, 20));
	}
}

const hubs: InstanceType<typeof LiveHub>[] = [];
function makeHub(heartbeatMs?: number) {
	const hub = new LiveHub({ databaseUrl, readPositions: async () => [], heartbeatMs });
	hubs.push(hub);
	return hub;
}

afterAll(async () => {
	for (const hub of hubs) await hub.close();
	await client.end({ timeout: 5 });
});

describe('live fan-out through LISTEN/NOTIFY', () => {
	it('reaches the followers of the workshop on every app server, and only them', async () => {
		const [a, b] = [makeHub(), makeHub()];
		await Promise.all([a.listen(), b.listen()]);
		const workshop = randomUUID();
		const onA = recorder();
		const onB = recorder();
		const elsewhere = recorder();
		a.follow(workshop, onA.stream);
		b.follow(workshop, onB.stream);
		b.follow(randomUUID(), elsewhere.stream);

		const step = randomUUID();
		await publishLivePosition({ workshopId: workshop, lessonId: randomUUID(), stepId: step, at: Date.now() });
		await until(() => onA.steps.length === 1 && onB.steps.length === 1, 'both followers');
		expect(onA.steps).toEqual([step]);
		expect(onB.steps).toEqual([step]);
		expect(onA.text).toMatch(/^id: \d+\nevent: step\ndata: /);
		expect(elsewhere.text).toBe('');
	});

	it('never sends a follower an older position than one it has, and nothing once it has left', async () => {
		const hub = makeHub();
		await hub.listen();
		const workshop = randomUUID();
		const follower = recorder();
		const leave = hub.follow(workshop, follower.stream);
		const [older, newer, later] = [randomUUID(), randomUUID(), randomUUID()];
		const now = Date.now();
		hub.deliver({ workshopId: workshop, lessonId: null, stepId: newer, at: now });
		hub.deliver({ workshopId: workshop, lessonId: null, stepId: older, at: now - 1000 });
		expect(follower.steps).toEqual([newer]);
		leave();
		expect(hub.followerCount).toBe(0);
		hub.deliver({ workshopId: workshop, lessonId: null, stepId: later, at: now + 1000 });
		expect(follower.steps).toEqual([newer]);
	});

	it('keeps idle streams open with a heartbeat comment, and ends them when the server stops', async () => {
		const hub = makeHub(30);
		const follower = recorder();
		hub.follow(randomUUID(), follower.stream);
		await until(() => follower.text.includes(': heartbeat\n\n'), 'a heartbeat');
		hub.closeFollowers();
		expect(follower.closed).toBe(true);
		expect(hub.followerCount).toBe(0);
	});
});
