import { describe, expect, it } from 'vitest';
import { formatLiveEvent, type LivePosition } from './live-message';
import { FollowLive } from './follow.svelte';

const W = '3c0d6a41-8b2e-4d7f-a1c3-5e9f00000101';
const L = '3c0d6a41-8b2e-4d7f-a1c3-5e9f00000102';
const S1 = '3c0d6a41-8b2e-4d7f-a1c3-5e9f00000111';
const S2 = '3c0d6a41-8b2e-4d7f-a1c3-5e9f00000112';
const S3 = '3c0d6a41-8b2e-4d7f-a1c3-5e9f00000113';

/** Stands in for the browser's EventSource: the test opens, fails and sends as the server would. */
class FakeSource {
	static made: FakeSource[] = [];
	readyState = 0;
	onopen: ((ev: Event) => unknown) | null = null;
	onerror: ((ev: Event) => unknown) | null = null;
	closed = false;
	#listeners: ((ev: MessageEvent) => void)[] = [];
	constructor(readonly url: string) {
		FakeSource.made.push(this);
	}
	addEventListener(_name: string, fn: (ev: MessageEvent) => void) {
		this.#listeners.push(fn);
	}
	close() {
		this.closed = true;
		this.readyState = 2;
	}
	open() {
		this.readyState = 1;
		this.onopen?.(new Event('open'));
	}
	send(position: LivePosition) {
		const data = formatLiveEvent(position).match(/^data: (.*)$/m)![1];
		for (const fn of this.#listeners) fn(new MessageEvent('step', { data }));
	}
	fail(giveUp: boolean) {
		this.readyState = giveUp ? 2 : 0;
		this.onerror?.(new Event('error'));
	}
}

function follower() {
	FakeSource.made = [];
	const unknown: LivePosition[] = [];
	const f = new FollowLive({
		url: `/workshops/${W}/follow/events`,
		knownStepIds: () => new Set([S1, S2, S3]),
		onunknown: (p) => unknown.push(p),
		eventSource: FakeSource,
		retryMs: 5
	});
	f.connect();
	return { f, unknown, source: () => FakeSource.made.at(-1)! };
}

const at = (stepId: string | null, t: number): LivePosition => ({ workshopId: W, lessonId: L, stepId, at: t });

describe('following the instructor', () => {
	it('shows the live step as it moves', () => {
		const { f, source } = follower();
		source().open();
		expect(f.connection).toBe('open');
		source().send(at(S1, 1));
		expect(f.shownStepId).toBe(S1);
		source().send(at(S2, 2));
		expect(f.shownStepId).toBe(S2);
		expect(f.received).toBe(2);
	});

	it('lets a student look around and rejoin on the current step', () => {
		const { f, source } = follower();
		source().send(at(S1, 1));
		f.show(S3);
		source().send(at(S2, 2));
		expect(f.shownStepId).toBe(S3);
		expect(f.liveStepId).toBe(S2);
		f.rejoin();
		expect(f.shownStepId).toBe(S2);
		f.leave();
		source().send(at(S1, 3));
		expect(f.shownStepId).toBe(S2);
	});

	it('ignores a position older than the one it has (a late event after a reconnect)', () => {
		const { f, source } = follower();
		source().send(at(S2, 5));
		source().send(at(S1, 4));
		expect(f.shownStepId).toBe(S2);
	});

	it('asks for fresh data when the live step is one it has not loaded', () => {
		const { unknown, source } = follower();
		const added = '3c0d6a41-8b2e-4d7f-a1c3-5e9f00000199';
		source().send(at(added, 1));
		expect(unknown.map((p) => p.stepId)).toEqual([added]);
	});

	it('leaves a dropped connection to the browser, and opens a new one when the browser gave up (a 503)', async () => {
		const { f, source } = follower();
		source().fail(false);
		expect(f.connection).toBe('reconnecting');
		expect(FakeSource.made).toHaveLength(1);
		source().fail(true);
		await new Promise((r) => setTimeout(r, 20));
		expect(FakeSource.made).toHaveLength(2);
		expect(FakeSource.made[0].closed).toBe(true);
		source().open();
		source().send(at(S3, 9));
		expect(f.shownStepId).toBe(S3);
		f.destroy();
		expect(source().closed).toBe(true);
	});
});
