/**
 * Two fingers on the plan: the distance between them zooms, their midpoint pans, so the plan point
 * first under the midpoint stays under it.
 */
import type { Vec2 } from '../model/types';
import { clampZoom, screenToPlan, type Viewport } from '../viewport';

export class PinchGesture {
	readonly #start: Viewport;
	readonly #startDistancePx: number;
	readonly #planMid: Vec2;

	constructor(viewport: Viewport, a: Vec2, b: Vec2) {
		this.#start = viewport;
		this.#startDistancePx = Math.max(1, Math.hypot(a[0] - b[0], a[1] - b[1]));
		this.#planMid = screenToPlan(viewport, [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2]);
	}

	viewportFor(a: Vec2, b: Vec2): Viewport {
		const zoom = clampZoom((this.#start.zoom * Math.max(1, Math.hypot(a[0] - b[0], a[1] - b[1]))) / this.#startDistancePx);
		const mid: Vec2 = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
		return { zoom, panX: mid[0] - this.#planMid[0] * zoom, panY: mid[1] - this.#planMid[1] * zoom };
	}
}
