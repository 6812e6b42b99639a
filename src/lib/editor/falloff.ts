/**
 * The falloff map: how much light each point of the table gets, in stops relative to the subject,
 * computed with the engine's own functions so that the map at the subject's position is exactly the
 * exposure the engine reports. Each cell is the total exposure X a subject placed there (at the
 * subject's height, with the subject's facing) would get from every light of the scene, flags and
 * all; lights keep their aim (they do not follow the probe). Pure, and fast enough to redraw while a
 * light is dragged: the per-light constants are worked out once per scene.
 */
import { ambientExposure } from '$lib/light/ambient';
import { effectiveGuideNumber, flashExposure, highSpeedSyncFactor } from '$lib/light/flash';
import { angleBetweenDeg, beamFactor, distanceM, facingCosine, segmentsIntersect, subtract3, type Vec2, type Vec3 } from '$lib/light/geometry';
import { workingAperture } from '$lib/light/optics';
import { CONTINUOUS_CALIBRATION_C, DEFAULT_BEAM_ANGLE_DEG, DEFAULT_SYNC_SPEED_S } from '$lib/light/scene';
import type { ContinuousLight, ExposureScene, Flag, FlashLight } from '$lib/light/schema';
import type { Bounds } from './model/geometry';

/** A light source as the map needs it: its X at 1 m on its axis and its beam. */
interface PreparedEmitter {
	position: Vec3;
	/** X at 1 m straight along the axis (inverse-square law scales it by 1/d²). */
	xAt1m: number;
	axis: Vec3 | null;
	beamAngleDeg: number;
}

type PreparedLight =
	| { kind: 'emitter'; id: string; emitter: PreparedEmitter }
	| {
			kind: 'reflector';
			id: string;
			position: Vec3;
			normal: Vec3 | null;
			r2: number;
			/** ρ · X at the card · cos θ_in (diffuse), or null where the card is unlit. */
			diffuseX: number | null;
			specular: { source: PreparedEmitter; d1: number; rho: number; cosIn: number } | { ambientX: number; rho: number } | null;
	  };

export interface PreparedScene {
	subject: Vec3;
	subjectNormal: Vec3 | null;
	lights: PreparedLight[];
	flags: readonly Flag[];
	ambientX: number;
	cameraFactor: number;
}

function prepareEmitter(scene: ExposureScene, light: FlashLight | ContinuousLight, wa: number): PreparedEmitter {
	const cam = scene.camera;
	const position = light.position as Vec3;
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
	const beamed = light.aim !== undefined || light.beamAngleDeg !== undefined;
	return {
		position,
		xAt1m,
		axis: beamed ? subtract3((light.aim ?? scene.subject.position) as Vec3, position) : null,
		beamAngleDeg: light.beamAngleDeg ?? DEFAULT_BEAM_ANGLE_DEG
	};
}

function emitterXAt(e: PreparedEmitter, point: Vec3, dM: number): number {
	const beam = e.axis ? beamFactor(angleBetweenDeg(e.axis, subtract3(point, e.position)), e.beamAngleDeg) : 1;
	return (beam * e.xAt1m) / (dM * dM);
}

const crosses = (a: Vec3, b: Vec3, flags: readonly Flag[]) => {
	for (const f of flags) if (segmentsIntersect([a[0], a[1]], [b[0], b[1]], f.from as Vec2, f.to as Vec2)) return true;
	return false;
};

/** Works out everything that does not depend on where the probe is. */
export function prepareScene(scene: ExposureScene): PreparedScene {
	const cam = scene.camera;
	const wa = workingAperture(cam.aperture, cam.magnification, cam.pupilMagnification ?? 1);
	const flags = scene.flags ?? [];
	const ambientX = scene.ambient ? ambientExposure(scene.ambient.ev100, cam.iso, cam.shutter, wa) : 0;
	const emitters = new Map<string, PreparedEmitter>();
	for (const l of scene.lights) if (l.kind !== 'reflector') emitters.set(l.id, prepareEmitter(scene, l, wa));
	const lights: PreparedLight[] = [];
	for (const l of scene.lights) {
		if (l.kind !== 'reflector') {
			lights.push({ kind: 'emitter', id: l.id, emitter: emitters.get(l.id)! });
			continue;
		}
		const position = l.position as Vec3;
		const normal = (l.normal as Vec3 | undefined) ?? null;
		const r2 = l.areaM2 / Math.PI;
		let diffuseX: number | null = null;
		let specular: Extract<PreparedLight, { kind: 'reflector' }>['specular'] = null;
		if (l.source === 'ambient') {
			if (l.surface === 'diffuse') diffuseX = l.reflectance * ambientX;
			else specular = { ambientX, rho: l.reflectance };
		} else {
			const source = emitters.get(l.source);
			if (source && !crosses(source.position, position, flags)) {
				const d1 = distanceM(source.position, position);
				const cosIn = normal ? facingCosine(normal, subtract3(source.position, position)) : 1;
				if (l.surface === 'diffuse') diffuseX = l.reflectance * emitterXAt(source, position, d1) * cosIn;
				else specular = { source, d1, rho: l.reflectance, cosIn };
			}
		}
		lights.push({ kind: 'reflector', id: l.id, position, normal, r2, diffuseX, specular });
	}
	return {
		subject: scene.subject.position as Vec3,
		subjectNormal: (scene.subject.normal as Vec3 | undefined) ?? null,
		lights,
		flags,
		ambientX,
		cameraFactor: 2 ** -(cam.lossStops ?? 0)
	};
}

/** Shortest distance the map uses: a probe on top of a light would be infinitely bright. */
const MIN_DISTANCE_M = 0.001;

/** One light's X at a probe point (0 where a flag blocks it), as the engine computes it at the subject. */
export function lightXAt(p: PreparedScene, light: PreparedLight, point: Vec3): number {
	const pos = light.kind === 'emitter' ? light.emitter.position : light.position;
	const d = Math.max(MIN_DISTANCE_M, distanceM(pos, point));
	let x: number;
	if (light.kind === 'emitter') {
		x = emitterXAt(light.emitter, point, d);
	} else {
		const cosOut = light.normal ? facingCosine(light.normal, subtract3(point, light.position)) : 1;
		if (light.diffuseX !== null) x = light.diffuseX * cosOut * (light.r2 / (light.r2 + d * d));
		else if (light.specular && 'ambientX' in light.specular) x = cosOut > 0 ? light.specular.rho * light.specular.ambientX : 0;
		else if (light.specular) {
			const s = light.specular;
			x = s.cosIn > 0 && cosOut > 0 ? s.rho * emitterXAt(s.source, light.position, s.d1 + d) : 0;
		} else x = 0;
	}
	if (x > 0 && p.subjectNormal) x *= facingCosine(p.subjectNormal, subtract3(pos, point));
	if (x > 0 && p.flags.length && crosses(pos, point, p.flags)) return 0;
	return x * p.cameraFactor;
}

/** Total X at a probe point (ambient included). */
export function totalXAt(p: PreparedScene, point: Vec3): number {
	let x = p.ambientX * p.cameraFactor;
	for (const light of p.lights) x += lightXAt(p, light, point);
	return x;
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
	/** Brighter than the subject. */
	over: Rgb;
	/** Darker than the subject. */
	under: Rgb;
}

/** Warm for more light, graphite for less (the theme's tungsten-light and graphite-900). */
export const FALLOFF_PALETTE_LIGHT: FalloffPalette = { over: [242, 184, 114], under: [23, 27, 31] };
export const FALLOFF_PALETTE_DARK: FalloffPalette = { over: [242, 184, 114], under: [0, 0, 0] };

/** Bands of half a stop, so the map reads like contours; clamped at +3 and −6 stops. */
export function falloffColour(stops: number, palette: FalloffPalette): [number, number, number, number] {
	if (stops === -Infinity || Number.isNaN(stops)) return [...palette.under, 190];
	const band = Math.floor(stops * 2) / 2;
	if (band >= 0) {
		const a = Math.min(3, band + 0.5) / 3;
		return [...palette.over, Math.round(40 + 120 * a)];
	}
	const a = Math.min(6, -band) / 6;
	return [...palette.under, Math.round(20 + 150 * a)];
}

/** RGBA pixels, one per cell, for an image drawn over the plan. */
export function falloffPixels(grid: FalloffGrid, palette: FalloffPalette): Uint8ClampedArray {
	const out = new Uint8ClampedArray(grid.cols * grid.rows * 4);
	for (let i = 0; i < grid.stops.length; i++) out.set(falloffColour(grid.stops[i], palette), i * 4);
	return out;
}

export const FALLOFF_LEGEND_STOPS = [2, 1, 0, -1, -2, -3, -4, -6] as const;
