import { afterEach, describe, expect, it } from 'vitest';
import { openSync, syncChannelName, type PresentSync, type SyncMessage } from './sync';

const W = '3c0d6a41-8b2e-4d7f-a1c3-5e9f00000101';
const L = '3c0d6a41-8b2e-4d7f-a1c3-5e9f00000102';
const opened: PresentSync[] = [];
afterEach(() => opened.splice(0).forEach((s) => s.close()));

function received(lessonId = L) {
	const got: SyncMessage[] = [];
	opened.push(openSync(W, lessonId, (m) => got.push(m)));
	return got;
}
const settle = () => new Promise((r) => setTimeout(r, 30));

describe('projector and presenter windows in step (Node has BroadcastChannel, as browsers do)', () => {
	it('carries the projector state and the presenter window’s requests between the two', async () => {
		const presenter = received();
		const projector = openSync(W, L, () => {});
		opened.push(projector);
		projector.post({ type: 'state', index: 2, blank: false, startedAt: 1000 });
		const fromPresenter = openSync(W, L, () => {});
		opened.push(fromPresenter);
		const atProjector = received();
		fromPresenter.post({ type: 'go', index: 1 });
		await settle();
		expect(presenter).toContainEqual({ type: 'state', index: 2, blank: false, startedAt: 1000 });
		expect(atProjector).toContainEqual({ type: 'go', index: 1 });
	});

	it('keeps lessons apart and drops malformed messages', async () => {
		const other = received('3c0d6a41-8b2e-4d7f-a1c3-5e9f00000199');
		const same = received();
		const raw = new BroadcastChannel(syncChannelName(W, L));
		raw.postMessage({ type: 'go', index: -1 });
		raw.postMessage('hello');
		raw.postMessage({ type: 'blank', blank: true });
		await settle();
		raw.close();
		expect(other).toEqual([]);
		expect(same).toEqual([{ type: 'blank', blank: true }]);
	});
});
