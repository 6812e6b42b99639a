import { afterEach, describe, expect, it } from 'vitest';
import { FalloffService, type FalloffRequest } from './falloff-service.svelte';
import { falloffGrid } from './falloff';
import { quartzScene } from './test-fixtures';

/** A stand-in for the browser's Worker that holds messages until the test answers them. */
class HeldWorker {
	static last: HeldWorker | null = null;
	posted: FalloffRequest[] = [];
	onmessage: ((e: MessageEvent) => void) | null = null;
	onerror: (() => void) | null = null;
	terminated = false;
	constructor() {
		HeldWorker.last = this;
	}
	postMessage(req: FalloffRequest) {
		this.posted.push(req);
	}
	answer(req: FalloffRequest) {
		this.onmessage?.({ data: { id: req.id, grid: falloffGrid(req.scene, req.bounds, req.maxCells) } } as MessageEvent);
	}
	terminate() {
		this.terminated = true;
	}
}

const bounds = { minX: -0.6, minY: -0.3, maxX: 0.3, maxY: 0.3 };

describe('FalloffService', () => {
	const saved = globalThis.Worker;
	afterEach(() => {
		globalThis.Worker = saved;
	});

	it('computes on the spot where there is no worker', () => {
		const s = new FalloffService(false);
		s.request(quartzScene(), bounds, 100);
		expect(s.grid?.reference).toBe('subject');
	});

	it('sends one map at a time and, of the requests that wait, only the newest', () => {
		globalThis.Worker = HeldWorker as unknown as typeof Worker;
		const s = new FalloffService(true);
		const w = HeldWorker.last!;
		expect(s.usesWorker).toBe(true);
		const scene = quartzScene();
		s.request(scene, bounds, 100);
		s.request(scene, bounds, 200);
		s.request(scene, bounds, 300);
		expect(w.posted.map((r) => r.maxCells)).toEqual([100]);
		w.answer(w.posted[0]);
		expect(s.grid).not.toBeNull();
		expect(w.posted.map((r) => r.maxCells)).toEqual([100, 300]);
		w.answer(w.posted[1]);
		expect(w.posted).toHaveLength(2);
	});

	it('ignores an answer that arrives after the map was hidden; destroy() ends the worker', () => {
		globalThis.Worker = HeldWorker as unknown as typeof Worker;
		const s = new FalloffService(true);
		const w = HeldWorker.last!;
		s.request(quartzScene(), bounds, 100);
		s.clear();
		w.answer(w.posted[0]);
		expect(s.grid).toBeNull();
		s.destroy();
		expect(w.terminated).toBe(true);
	});
});
