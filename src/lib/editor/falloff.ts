/**
 * The falloff map: how much light each point of the table gets, in stops relative to the subject.
 * Each cell is the total exposure X a subject placed there (at the subject's height, with the
 * subject's facing) would get from every light of the scene, flags and all, read from the engine's
 * `lightField` (src/lib/light/light-field.ts): the map at the subject's position is exactly the
 * exposure the engine reports. Lights keep their aim (they do not follow the probe). Computed in a
 * worker in the browser (falloff.worker.ts).
 */
import { lightField, lightXAt, totalXAt, type FieldLight, type LightField } from '$lib/light/light-field';
import type { Vec3 } from '$lib/light/geometry';
import type { ExposureScene } from '$lib/light/schema';
import type { Bounds } from './model/geometry';

export interface FalloffGrid {
	/** Plan position of the first cell's corner; cells run along x first, then y. */
	x0M: number;
	y0M: number;
	cellM: number;
	cols: number;
	rows: number;
	/** Stops relative to the reference per cell; −Infinity where no light arrives. */
	stops: Float32Array;
	/** What 0 stops means: the subject's exposure, or the brightest cell when the subject gets none. */
	reference: 'subject' | 'brightest';
}

export const DEFAULT_MAX_CELLS = 4096;

/** Where a map's cells are: the first cell's corner, the cell size and the counts. */
type CellLayout = Pick<FalloffGrid, 'x0M' | 'y0M' | 'cellM' | 'cols' | 'rows'>;

/**
 * Each light's share of the map (its X at every cell, flags applied), kept from one map to the next
 * while the grid, the camera, the subject, the ambient and the flags stay the same: a dragged light
 * then costs only its own share (and that of a card it lights), not every light's. The worker keeps
 * one for its maps; a map computed without one works every share out afresh.
 */
export class FalloffShares {
	#common = '';
	#byLight = new Map<string, { key: string; xs: Float64Array }>();

	/** The share of each light of `field` (in its order) on the cells of `grid`. */
	sharesOf(scene: ExposureScene, field: LightField, grid: CellLayout): Float64Array[] {
		const common = JSON.stringify([grid, scene.camera, scene.subject, scene.ambient ?? null, scene.flags ?? []]);
		const kept = common === this.#common ? this.#byLight : new Map<string, { key: string; xs: Float64Array }>();
		const byId = new Map(scene.lights.map((l) => [l.id, l]));
		const next = new Map<string, { key: string; xs: Float64Array }>();
		const shares = field.lights.map((l) => {
			// A card's share follows its light too.
			const key = JSON.stringify(l.light.kind === 'reflector' ? [l.light, byId.get(l.light.source) ?? null] : l.light);
			const old = kept.get(l.light.id);
			const entry = old && old.key === key ? old : { key, xs: lightShare(field, l, scene, grid) };
			next.set(l.light.id, entry);
			return entry.xs;
		});
		this.#common = common;
		this.#byLight = next;
		return shares;
	}
}

/** One light's X at every cell centre (its part of `totalXAt` there). */
function lightShare(field: LightField, l: FieldLight, scene: ExposureScene, grid: CellLayout): Float64Array {
	const { x0M, y0M, cellM, cols, rows } = grid;
	const z = scene.subject.position[2];
	const normal = scene.subject.normal as Vec3 | undefined;
	const xs = new Float64Array(cols * rows);
	for (let r = 0; r < rows; r++) {
		const y = y0M + (r + 0.5) * cellM;
		for (let c = 0; c < cols; c++) {
			xs[r * cols + c] = lightXAt(field, l, [x0M + (c + 0.5) * cellM, y, z], normal);
		}
	}
	return xs;
}

export function falloffGrid(scene: ExposureScene, bounds: Bounds, maxCells = DEFAULT_MAX_CELLS, shares = new FalloffShares()): FalloffGrid {
	const field = lightField(scene);
	const subject = scene.subject.position as Vec3;
	const normal = scene.subject.normal as Vec3 | undefined;
	const w = Math.max(bounds.maxX - bounds.minX, 1e-3);
	const h = Math.max(bounds.maxY - bounds.minY, 1e-3);
	const cellM = Math.sqrt((w * h) / maxCells);
	const cols = Math.max(1, Math.ceil(w / cellM));
	const rows = Math.max(1, Math.ceil(h / cellM));
	const x0M = (bounds.minX + bounds.maxX) / 2 - (cols * cellM) / 2;
	const y0M = (bounds.minY + bounds.maxY) / 2 - (rows * cellM) / 2;
	// The ambient, then each light's share in the scene's order: the sum `totalXAt` makes at each cell.
	const xs = new Float64Array(cols * rows).fill(field.ambientX);
	for (const share of shares.sharesOf(scene, field, { x0M, y0M, cellM, cols, rows })) {
		for (let i = 0; i < xs.length; i++) xs[i] += share[i];
	}
	let brightest = 0;
	for (const x of xs) if (x > brightest) brightest = x;
	const subjectX = totalXAt(field, subject, normal);
	const reference = subjectX > 0 ? 'subject' : 'brightest';
	const refX = subjectX > 0 ? subjectX : brightest;
	const stops = new Float32Array(cols * rows);
	for (let i = 0; i < xs.length; i++) stops[i] = xs[i] > 0 && refX > 0 ? Math.log2(xs[i] / refX) : -Infinity;
	return { x0M, y0M, cellM, cols, rows, stops, reference };
}

// ---------- colours ----------

export type Rgb = readonly [number, number, number];

export interface FalloffPalette {
	/**
	 * 'shade' (on paper): more light is a warm wash, less light a graphite shade that deepens with
	 * every half stop. 'glow' (on the dim-studio scheme): one warm colour whose strength follows the
	 * light, so brighter reads brighter on a dark ground.
	 */
	mode: 'shade' | 'glow';
	over: Rgb;
	under: Rgb;
}

/** The theme's tungsten-light for more light, graphite-900 for less. */
export const FALLOFF_PALETTE_LIGHT: FalloffPalette = { mode: 'shade', over: [242, 184, 114], under: [23, 27, 31] };
export const FALLOFF_PALETTE_DARK: FalloffPalette = { mode: 'glow', over: [242, 184, 114], under: [242, 184, 114] };

/**
 * A smooth scale (the image is also smoothed between cells when drawn), clamped at +3 and −6 stops;
 * the hue changes at the subject's level (0 stops), so brighter and darker than the subject read apart.
 */
export function falloffColour(stops: number, palette: FalloffPalette): [number, number, number, number] {
	const none = stops === -Infinity || Number.isNaN(stops);
	const band = none ? -6 : Math.max(-6, Math.min(3, stops));
	if (palette.mode === 'glow') return [...palette.over, none ? 0 : Math.round(10 + 150 * ((band + 6) / 9))];
	if (none) return [...palette.under, 150];
	if (band >= 0) return [...palette.over, Math.round(40 + 100 * (Math.min(3, band + 0.5) / 3))];
	return [...palette.under, Math.round(12 + 100 * (-band / 6))];
}

/** RGBA pixels, one per cell, for an image drawn over the plan. */
export function falloffPixels(grid: FalloffGrid, palette: FalloffPalette): Uint8ClampedArray {
	const out = new Uint8ClampedArray(grid.cols * grid.rows * 4);
	for (let i = 0; i < grid.stops.length; i++) out.set(falloffColour(grid.stops[i], palette), i * 4);
	return out;
}

export const FALLOFF_LEGEND_STOPS = [2, 1, 0, -1, -2, -3, -4, -6] as const;
