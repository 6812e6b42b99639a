/**
 * Snapping a dragged point: to the plan position of another element when within a tolerance (that
 * element's x or y, each axis on its own), otherwise to the grid. Returns the guides to draw.
 */
import { snapToGrid } from '../grid';
import { normaliseDeg } from '../model/geometry';
import type { Vec2 } from '../model/types';

export interface SnapLine {
	/** 'x': a vertical guide at x = atM from y = fromM to toM; 'y': a horizontal one. */
	axis: 'x' | 'y';
	atM: number;
	fromM: number;
	toM: number;
}

export interface SnapOptions {
	/** Grid step in metres, or null for no grid snapping. */
	gridStepM: number | null;
	/** Plan positions of elements to line up with (not the ones being moved). */
	targets: readonly Vec2[];
	/** Within this distance an element wins over the grid (a few screen pixels, in metres). */
	toleranceM: number;
}

export interface Snapped {
	point: Vec2;
	lines: SnapLine[];
}

function snapAxis(value: number, other: number, axis: 0 | 1, opts: SnapOptions): { value: number; line: SnapLine | null } {
	let best: number | null = null;
	let bestGap = opts.toleranceM;
	for (const t of opts.targets) {
		const gap = Math.abs(t[axis] - value);
		if (gap <= bestGap) [best, bestGap] = [t[axis], gap];
	}
	if (best !== null) {
		const along = opts.targets.filter((t) => Math.abs(t[axis] - best!) < 1e-9).map((t) => t[1 - axis]);
		return {
			value: best,
			line: { axis: axis === 0 ? 'x' : 'y', atM: best, fromM: Math.min(other, ...along), toM: Math.max(other, ...along) }
		};
	}
	return { value: opts.gridStepM ? snapToGrid(value, opts.gridStepM) : value, line: null };
}

export function snapPoint(point: Vec2, opts: SnapOptions): Snapped {
	const x = snapAxis(point[0], point[1], 0, opts);
	const y = snapAxis(point[1], x.value, 1, opts);
	// The vertical guide's extent uses the snapped y.
	const lines: SnapLine[] = [];
	if (x.line) {
		const along = opts.targets.filter((t) => Math.abs(t[0] - x.value) < 1e-9).map((t) => t[1]);
		lines.push({ ...x.line, fromM: Math.min(y.value, ...along), toM: Math.max(y.value, ...along) });
	}
	if (y.line) lines.push(y.line);
	return { point: [x.value, y.value], lines };
}

/** Rotation snapping: to 15° steps with Shift, else to facing the subject within `captureDeg`. */
export function snapRotation(rotationDeg: number, opts: { stepDeg: number | null; towardDeg: number | null; captureDeg?: number }): { rotationDeg: number; snapped: 'step' | 'toward' | null } {
	if (opts.stepDeg) return { rotationDeg: Math.round(rotationDeg / opts.stepDeg) * opts.stepDeg, snapped: 'step' };
	if (opts.towardDeg !== null) {
		const gap = ((rotationDeg - opts.towardDeg + 540) % 360) - 180;
		if (Math.abs(gap) <= (opts.captureDeg ?? 3)) return { rotationDeg: normaliseDeg(rotationDeg - gap), snapped: 'toward' };
	}
	return { rotationDeg, snapped: null };
}
