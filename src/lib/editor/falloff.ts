/**
 * The falloff map: how much light each point of the table gets, in stops relative to the subject,
 * computed with the engine's own functions so that the map at the subject's position is exactly the
 * exposure the engine reports. Each cell is the total exposure X a subject placed there (at the
 * subject's height, with the subject's facing) would get from every light of the scene, flags and
 * all; lights keep their aim (they do not follow the probe). Pure, and fast enough to redraw while a
 * light is dragged: the per-light constants are worked out once per scene with the engine's own
 * functions, and the per-cell loop is the engine's formulas unrolled (falloff.test.ts holds it to the
 * engine's answer to a part in 10¹²).
 */
import { ambientExposure } from '$lib/light/ambient';
import { effectiveGuideNumber, flashExposure, highSpeedSyncFactor } from '$lib/light/flash';
import { beamExponent, distanceM, facingCosine, subtract3, type Vec3 } from '$lib/light/geometry';
import { workingAperture } from '$lib/light/optics';
import { CONTINUOUS_CALIBRATION_C, DEFAULT_BEAM_ANGLE_DEG, DEFAULT_SYNC_SPEED_S } from '$lib/light/scene';
import type { ContinuousLight, ExposureScene, FlashLight } from '$lib/light/schema';
import type { Bounds } from './model/geometry';

/**
 * A light source as the map needs it: its position, its X at 1 m on its axis (the inverse-square law
 * scales it by 1/d²), and its beam as a unit axis and the exponent n of cos^n (geometry.ts).
 */
interface PreparedEmitter {
	x: number;
	y: number;
	z: number;
	xAt1m: number;
	beamed: boolean;
	ax: number;
	ay: number;
	az: number;
	exponent: number;
}

/** A card, in one shape for every kind of card (so the loop over them stays fast). */
interface PreparedCard {
	x: number;
	y: number;
	z: number;
	/** Unit normal; `hasNormal` false: the card faces everything. */
	hasNormal: boolean;
	nx: number;
	ny: number;
	nz: number;
	r2: number;
	/**
	 * 0 unlit; 1 diffuse: k = ρ · X at the card · cos θ_in; 2 specular, lit by a light: k = ρ · X of
	 * the source at 1 m toward the card (with its beam), d1 its distance; 3 specular, bouncing the
	 * ambient: k = ρ · ambient X.
	 */
	mode: 0 | 1 | 2 | 3;
	k: number;
	d1: number;
}

export interface PreparedScene {
	subject: Vec3;
	/** Unit subject normal, or null. */
	subjectNormal: Vec3 | null;
	emitters: PreparedEmitter[];
	cards: PreparedCard[];
	/** Flag segments as flat numbers: x1, y1, x2, y2 for each. */
	flags: Float64Array;
	ambientX: number;
	cameraFactor: number;
}

const unit = (v: Vec3): Vec3 | null => {
	const l = Math.sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2]);
	return l > 0 ? [v[0] / l, v[1] / l, v[2] / l] : null;
};

function prepareEmitter(scene: ExposureScene, light: FlashLight | ContinuousLight, wa: number): PreparedEmitter {
	const cam = scene.camera;
	const [x, y, z] = light.position as Vec3;
	let xAt1m: number;
	if (light.kind === 'flash') {
		const gn = effectiveGuideNumber({ guideNumber: light.guideNumber, iso: cam.iso, power: light.power, lossStops: light.lossStops ?? 0 });
		const sync = cam.syncSpeed ?? DEFAULT_SYNC_SPEED_S;
		const hss = light.highSpeedSync && cam.shutter < sync ? highSpeedSyncFactor(cam.shutter, sync) : 1;
		xAt1m = hss * flashExposure(gn, 1, wa);
	} else {
		const lux = light.luxAt1m * 2 ** -(light.lossStops ?? 0);
		xAt1m = (lux * cam.iso * cam.shutter) / (CONTINUOUS_CALIBRATION_C * wa * wa);
	}
	// As the engine: a light has a beam when it is given an aim or a beam angle; the axis points at
	// the aim, else at the subject.
	const axis = light.aim !== undefined || light.beamAngleDeg !== undefined ? unit(subtract3((light.aim ?? scene.subject.position) as Vec3, [x, y, z])) : null;
	return {
		x,
		y,
		z,
		xAt1m,
		beamed: axis !== null,
		ax: axis?.[0] ?? 0,
		ay: axis?.[1] ?? 0,
		az: axis?.[2] ?? 0,
		exponent: beamExponent(light.beamAngleDeg ?? DEFAULT_BEAM_ANGLE_DEG)
	};
}

/**
 * An emitter's X at a point dM away: the engine's beamFactor (cos^n of the angle off the axis, none
 * from 90° on) times X at 1 m over d². The cosine is taken straight from the dot product, which is
 * what cos(angleBetweenDeg(...)) returns.
 */
function emitterXAt(e: PreparedEmitter, px: number, py: number, pz: number, dM: number): number {
	let beam = 1;
	if (e.beamed) {
		const c = (e.ax * (px - e.x) + e.ay * (py - e.y) + e.az * (pz - e.z)) / dM;
		beam = c <= 1e-15 ? 0 : c >= 1 ? 1 : c ** e.exponent;
	}
	return (beam * e.xAt1m) / (dM * dM);
}

/**
 * Do the plan segments a–b and any flag meet (touching counts)? The orientation test of the engine's
 * segmentsIntersect (geometry.ts) with the same tolerance, unrolled for speed; falloff.test.ts checks
 * that the two agree.
 */
const SEGMENT_EPS = 1e-12;

function on(px: number, py: number, qx: number, qy: number, rx: number, ry: number): boolean {
	const eps = SEGMENT_EPS;
	return Math.min(px, qx) - eps <= rx && rx <= Math.max(px, qx) + eps && Math.min(py, qy) - eps <= ry && ry <= Math.max(py, qy) + eps;
}

export function crossesAnyFlag(flags: Float64Array, ax: number, ay: number, bx: number, by: number): boolean {
	const eps = SEGMENT_EPS;
	for (let i = 0; i < flags.length; i += 4) {
		const cx = flags[i], cy = flags[i + 1], dx = flags[i + 2], dy = flags[i + 3];
		const v1 = (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
		const v2 = (bx - ax) * (dy - ay) - (by - ay) * (dx - ax);
		const v3 = (dx - cx) * (ay - cy) - (dy - cy) * (ax - cx);
		const v4 = (dx - cx) * (by - cy) - (dy - cy) * (bx - cx);
		const o1 = Math.abs(v1) < eps ? 0 : Math.sign(v1);
		const o2 = Math.abs(v2) < eps ? 0 : Math.sign(v2);
		const o3 = Math.abs(v3) < eps ? 0 : Math.sign(v3);
		const o4 = Math.abs(v4) < eps ? 0 : Math.sign(v4);
		if (o1 !== o2 && o3 !== o4) return true;
		if (o1 === 0 && on(ax, ay, bx, by, cx, cy)) return true;
		if (o2 === 0 && on(ax, ay, bx, by, dx, dy)) return true;
		if (o3 === 0 && on(cx, cy, dx, dy, ax, ay)) return true;
		if (o4 === 0 && on(cx, cy, dx, dy, bx, by)) return true;
	}
	return false;
}

/** Works out everything that does not depend on where the probe is. */
export function prepareScene(scene: ExposureScene): PreparedScene {
	const cam = scene.camera;
	const wa = workingAperture(cam.aperture, cam.magnification, cam.pupilMagnification ?? 1);
	const flagList = scene.flags ?? [];
	const flags = new Float64Array(flagList.length * 4);
	flagList.forEach((f, i) => flags.set([f.from[0], f.from[1], f.to[0], f.to[1]], i * 4));
	const ambientX = scene.ambient ? ambientExposure(scene.ambient.ev100, cam.iso, cam.shutter, wa) : 0;
	const byId = new Map<string, PreparedEmitter>();
	for (const l of scene.lights) if (l.kind !== 'reflector') byId.set(l.id, prepareEmitter(scene, l, wa));
	const cards: PreparedCard[] = [];
	for (const l of scene.lights) {
		if (l.kind !== 'reflector') continue;
		const [x, y, z] = l.position as Vec3;
		const n = l.normal ? unit(l.normal as Vec3) : null;
		const card: PreparedCard = { x, y, z, hasNormal: n !== null, nx: n?.[0] ?? 0, ny: n?.[1] ?? 0, nz: n?.[2] ?? 0, r2: l.areaM2 / Math.PI, mode: 0, k: 0, d1: 0 };
		const rho = l.reflectance;
		if (l.source === 'ambient') {
			card.mode = l.surface === 'diffuse' ? 1 : 3;
			card.k = rho * ambientX;
		} else {
			const source = byId.get(l.source);
			if (source && !crossesAnyFlag(flags, source.x, source.y, x, y)) {
				const sPos: Vec3 = [source.x, source.y, source.z];
				const d1 = distanceM(sPos, [x, y, z]);
				const cosIn = n ? facingCosine(n, subtract3(sPos, [x, y, z])) : 1;
				const atCard = emitterXAt(source, x, y, z, d1);
				if (l.surface === 'diffuse') {
					card.mode = 1;
					card.k = rho * atCard * cosIn;
				} else if (cosIn > 0) {
					card.mode = 2;
					card.k = rho * atCard * d1 * d1;
					card.d1 = d1;
				}
			}
		}
		cards.push(card);
	}
	return {
		subject: scene.subject.position as Vec3,
		subjectNormal: scene.subject.normal ? unit(scene.subject.normal as Vec3) : null,
		emitters: [...byId.values()],
		cards,
		flags,
		ambientX,
		cameraFactor: 2 ** -(cam.lossStops ?? 0)
	};
}

/** Shortest distance the map uses: a probe on top of a light would be infinitely bright. */
const MIN_DISTANCE_M = 0.001;

/** Total X at a probe point (ambient included), as the engine would give a subject placed there. */
export function totalXAt(p: PreparedScene, point: Vec3): number {
	const px = point[0], py = point[1], pz = point[2];
	const sn = p.subjectNormal;
	const flags = p.flags;
	const hasFlags = flags.length > 0;
	let total = p.ambientX;
	for (const e of p.emitters) {
		const dx = e.x - px, dy = e.y - py, dz = e.z - pz;
		const d = Math.max(MIN_DISTANCE_M, Math.sqrt(dx * dx + dy * dy + dz * dz));
		let x = emitterXAt(e, px, py, pz, d);
		// Lambert's cosine law at the subject (facingCosine of the subject's normal).
		if (x > 0 && sn) x *= Math.max(0, (sn[0] * dx + sn[1] * dy + sn[2] * dz) / d);
		if (x > 0 && hasFlags && crossesAnyFlag(flags, e.x, e.y, px, py)) x = 0;
		total += x;
	}
	for (const c of p.cards) {
		if (c.mode === 0) continue;
		const dx = c.x - px, dy = c.y - py, dz = c.z - pz;
		const d = Math.max(MIN_DISTANCE_M, Math.sqrt(dx * dx + dy * dy + dz * dz));
		// cos θ_out: the card's normal against the direction to the probe.
		const cosOut = c.hasNormal ? Math.max(0, -(c.nx * dx + c.ny * dy + c.nz * dz) / d) : 1;
		let x: number;
		if (c.mode === 1) x = c.k * cosOut * (c.r2 / (c.r2 + d * d));
		else if (c.mode === 2) x = cosOut > 0 ? c.k / ((c.d1 + d) * (c.d1 + d)) : 0;
		else x = cosOut > 0 ? c.k : 0;
		if (x > 0 && sn) x *= Math.max(0, (sn[0] * dx + sn[1] * dy + sn[2] * dz) / d);
		if (x > 0 && hasFlags && crossesAnyFlag(flags, c.x, c.y, px, py)) x = 0;
		total += x;
	}
	return total * p.cameraFactor;
}

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

export function falloffGrid(scene: ExposureScene, bounds: Bounds, maxCells = DEFAULT_MAX_CELLS): FalloffGrid {
	const p = prepareScene(scene);
	const w = Math.max(bounds.maxX - bounds.minX, 1e-3);
	const h = Math.max(bounds.maxY - bounds.minY, 1e-3);
	const cellM = Math.sqrt((w * h) / maxCells);
	const cols = Math.max(1, Math.ceil(w / cellM));
	const rows = Math.max(1, Math.ceil(h / cellM));
	const x0M = (bounds.minX + bounds.maxX) / 2 - (cols * cellM) / 2;
	const y0M = (bounds.minY + bounds.maxY) / 2 - (rows * cellM) / 2;
	const z = p.subject[2];
	const xs = new Float64Array(cols * rows);
	let brightest = 0;
	for (let r = 0; r < rows; r++) {
		const y = y0M + (r + 0.5) * cellM;
		for (let c = 0; c < cols; c++) {
			const x = totalXAt(p, [x0M + (c + 0.5) * cellM, y, z]);
			xs[r * cols + c] = x;
			if (x > brightest) brightest = x;
		}
	}
	const subjectX = totalXAt(p, p.subject);
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

/** Bands of half a stop, so the map reads like contours; clamped at +3 and −6 stops. */
export function falloffColour(stops: number, palette: FalloffPalette): [number, number, number, number] {
	const none = stops === -Infinity || Number.isNaN(stops);
	const band = none ? -6 : Math.max(-6, Math.min(3, Math.floor(stops * 2) / 2));
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
