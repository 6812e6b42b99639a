/**
 * Keeps the falloff map up to date for the editor. In a browser the map is computed in a worker:
 * while one map is being computed, only the newest request waits (older ones are dropped), so a drag
 * never queues work. Where there is no Worker (tests, the server) it is computed on the spot.
 */
import type { ExposureScene } from '$lib/light/schema';
import { DEFAULT_MAX_CELLS, falloffGrid, type FalloffGrid } from './falloff';
import type { Bounds } from './model/geometry';

export interface FalloffRequest {
	id: number;
	scene: ExposureScene;
	bounds: Bounds;
	maxCells: number;
}

export type FalloffResponse = { id: number; grid: FalloffGrid; error?: undefined } | { id: number; error: string; grid?: undefined };

export class FalloffService {
	#grid = $state.raw<FalloffGrid | null>(null);
	#worker: Worker | null = null;
	#inFlight: number | null = null;
	#waiting: FalloffRequest | null = null;
	#nextId = 1;
	#failed = false;

	constructor(useWorker = typeof Worker !== 'undefined') {
		if (!useWorker) return;
		try {
			this.#worker = new Worker(new URL('./falloff.worker.ts', import.meta.url), { type: 'module' });
			this.#worker.onmessage = (e: MessageEvent<FalloffResponse>) => this.#answer(e.data);
			this.#worker.onerror = () => this.#fallBack();
		} catch {
			this.#worker = null;
		}
	}

	/** The latest map (it may lag the plan by one computation while a light is dragged). */
	get grid(): FalloffGrid | null {
		return this.#grid;
	}

	get usesWorker(): boolean {
		return this.#worker !== null && !this.#failed;
	}

	request(scene: ExposureScene, bounds: Bounds, maxCells = DEFAULT_MAX_CELLS) {
		const req: FalloffRequest = { id: this.#nextId++, scene, bounds: { ...bounds }, maxCells };
		if (!this.usesWorker) {
			this.#grid = falloffGrid(req.scene, req.bounds, req.maxCells);
			return;
		}
		if (this.#inFlight !== null) {
			this.#waiting = req;
			return;
		}
		this.#send(req);
	}

	/** The map is hidden: forget it, and ignore an answer still on its way. */
	clear() {
		this.#waiting = null;
		this.#inFlight = null;
		this.#grid = null;
	}

	#send(req: FalloffRequest) {
		this.#inFlight = req.id;
		this.#worker!.postMessage(req);
	}

	#answer(res: FalloffResponse) {
		if (res.id !== this.#inFlight) return;
		this.#inFlight = null;
		if (res.grid) this.#grid = res.grid;
		const next = this.#waiting;
		this.#waiting = null;
		if (next) this.#send(next);
	}

	/** A worker that cannot start (a strict content policy): compute on the main thread instead. */
	#fallBack() {
		this.#failed = true;
		const next = this.#waiting;
		this.#inFlight = null;
		this.#waiting = null;
		if (next) this.request(next.scene, next.bounds, next.maxCells);
	}

	destroy() {
		this.#worker?.terminate();
		this.#worker = null;
		this.#waiting = null;
	}
}
