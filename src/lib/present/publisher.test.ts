import { describe, expect, it } from 'vitest';
import { LivePublisher, type SendOutcome } from './publisher';

/** A send that answers each call when the test says so. */
function controlledSend() {
	const calls: { stepId: string | null; answer: (o: SendOutcome) => void }[] = [];
	return {
		calls,
		send: (stepId: string | null) => new Promise<SendOutcome>((answer) => calls.push({ stepId, answer })),
		async waitForCalls(n: number) {
			for (let i = 0; i < 100 && calls.length < n; i++) await new Promise((r) => setTimeout(r, 1));
			expect(calls.length).toBe(n);
		}
	};
}

const instant = () => Promise.resolve();

describe('publishing the live step', () => {
	it('sends the newest step only: steps passed over while a request was out are skipped', async () => {
		const s = controlledSend();
		const p = new LivePublisher({ send: s.send, wait: instant });
		p.publish('a');
		p.publish('b');
		p.publish('c');
		await s.waitForCalls(1);
		s.calls[0].answer({ ok: true });
		await s.waitForCalls(2);
		expect(s.calls.map((c) => c.stepId)).toEqual(['a', 'c']);
		s.calls[1].answer({ ok: true });
		await p.settled();
		expect(p.state).toBe('idle');
	});

	it('sends a step again after a 503 or a network error until it goes through', async () => {
		const s = controlledSend();
		const p = new LivePublisher({ send: s.send, wait: instant });
		p.publish('a');
		await s.waitForCalls(1);
		s.calls[0].answer({ ok: false, retry: true, message: 'The database is restarting' });
		await s.waitForCalls(2);
		expect(s.calls[1].stepId).toBe('a');
		s.calls[1].answer({ ok: true });
		await p.settled();
		expect(p.state).toBe('idle');
	});

	it('retries the newer step, not the failed one, when the instructor moved on meanwhile', async () => {
		const s = controlledSend();
		let release!: () => void;
		const p = new LivePublisher({ send: s.send, wait: () => new Promise<void>((r) => (release = r)) });
		p.publish('a');
		await s.waitForCalls(1);
		s.calls[0].answer({ ok: false, retry: true, message: 'offline' });
		await new Promise((r) => setTimeout(r, 5));
		expect(p.state).toBe('retrying');
		p.publish('b');
		release();
		await s.waitForCalls(2);
		expect(s.calls[1].stepId).toBe('b');
		s.calls[1].answer({ ok: true });
		await p.settled();
	});

	it('stops on a refusal and keeps its message', async () => {
		const s = controlledSend();
		const p = new LivePublisher({ send: s.send, wait: instant });
		p.publish('a');
		await s.waitForCalls(1);
		s.calls[0].answer({ ok: false, retry: false, message: 'Only the workshop’s instructors can present it.' });
		await p.settled();
		expect(p.state).toBe('refused');
		expect(p.message).toMatch(/instructors/);
		expect(s.calls).toHaveLength(1);
	});
});
