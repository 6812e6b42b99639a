/**
 * Plan geometry of elements: facing directions, footprints (the rectangle an element covers, in its
 * own frame), hit testing and bounds. The drawing components use the same footprints, so what is
 * drawn is what is picked.
 */
import type { EditorElement } from './schema';
import type { EditorModel, Vec2, Vec3 } from './types';
import { elementsInOrder } from './types';

const DEG = Math.PI / 180;

export function direction2(rotationDeg: number): Vec2 {
	return [Math.cos(rotationDeg * DEG), Math.sin(rotationDeg * DEG)];
}

/** Unit vector for a rotation in plan and a tilt up (+) from level. */
export function direction3(rotationDeg: number, tiltDeg: number): Vec3 {
	const c = Math.cos(tiltDeg * DEG);
	return [c * Math.cos(rotationDeg * DEG), c * Math.sin(rotationDeg * DEG), Math.sin(tiltDeg * DEG)];
}

/** Rotation and tilt that point from one point at another. */
export function aimAngles(from: Vec3, to: Vec3): { rotationDeg: number; tiltDeg: number } {
	const dx = to[0] - from[0];
	const dy = to[1] - from[1];
	const dz = to[2] - from[2];
	const planM = Math.hypot(dx, dy);
	return {
		rotationDeg: planM === 0 ? 0 : Math.atan2(dy, dx) / DEG,
		tiltDeg: planM === 0 && dz === 0 ? 0 : Math.atan2(dz, planM) / DEG
	};
}

/** Angle normalised to (−180, 180]. */
export function normaliseDeg(deg: number): number {
	let d = deg % 360;
	if (d <= -180) d += 360;
	if (d > 180) d -= 360;
	return d;
}

export function position3(el: EditorElement): Vec3 {
	return [el.xM, el.yM, el.heightM];
}

/** Sizes of the drawn parts of a camera: the position is the front of the lens. */
export function cameraParts(focalLengthMm: number) {
	const lensLengthM = Math.min(0.3, Math.max(0.04, (focalLengthMm / 1000) * 0.9));
	return { lensLengthM, lensWidthM: 0.07, bodyDepthM: 0.08, bodyWidthM: 0.13 };
}

/** Sizes of a light's drawn parts: the position is the emitting face (what the scene measures from). */
export function emitterParts(el: Extract<EditorElement, { kind: 'flash' | 'continuous' }>) {
	const headDepthM = el.kind === 'flash' ? 0.05 : 0.08;
	const headWidthM = el.kind === 'flash' ? 0.075 : 0.09;
	const faceWidthM = el.modifier ? Math.max(el.modifier.sizeM, headWidthM * 0.6) : headWidthM;
	const modifierDepthM = el.modifier && el.modifier.sizeM > headWidthM ? 0.6 * el.modifier.sizeM : el.modifier ? 0.03 : 0;
	return { headDepthM, headWidthM, faceWidthM, modifierDepthM };
}

export const PANEL_THICKNESS_M = { reflector: 0.01, diffuser: 0.006, flag: 0.015 } as const;
/** The ambient light is drawn as a window frame this deep, across its width. */
export const AMBIENT_DEPTH_M = 0.03;

/** The footprint in the element's own frame: u along its facing, v across it. */
export interface Footprint {
	uMinM: number;
	uMaxM: number;
	halfAcrossM: number;
}

export function footprint(el: EditorElement): Footprint {
	switch (el.kind) {
		case 'subject':
		case 'background':
			return { uMinM: -el.depthM / 2, uMaxM: el.depthM / 2, halfAcrossM: el.widthM / 2 };
		case 'camera': {
			const p = cameraParts(el.focalLengthMm);
			return { uMinM: -(p.lensLengthM + p.bodyDepthM), uMaxM: 0, halfAcrossM: p.bodyWidthM / 2 };
		}
		case 'flash':
		case 'continuous': {
			const p = emitterParts(el);
			return { uMinM: -(p.modifierDepthM + p.headDepthM), uMaxM: 0, halfAcrossM: Math.max(p.faceWidthM, p.headWidthM) / 2 };
		}
		case 'reflector':
		case 'diffuser':
		case 'flag': {
			const t = PANEL_THICKNESS_M[el.kind];
			return { uMinM: -t / 2, uMaxM: t / 2, halfAcrossM: el.widthM / 2 };
		}
		case 'ambient':
			return { uMinM: -AMBIENT_DEPTH_M / 2, uMaxM: AMBIENT_DEPTH_M / 2, halfAcrossM: el.widthM / 2 };
	}
}

/** A plan point in the element's frame (u along its facing, v across). */
export function toLocal(el: EditorElement, point: Vec2): Vec2 {
	const [c, s] = direction2(el.rotationDeg);
	const dx = point[0] - el.xM;
	const dy = point[1] - el.yM;
	return [dx * c + dy * s, -dx * s + dy * c];
}

export function toPlan(el: EditorElement, local: Vec2): Vec2 {
	const [c, s] = direction2(el.rotationDeg);
	return [el.xM + local[0] * c - local[1] * s, el.yM + local[0] * s + local[1] * c];
}

export function footprintCorners(el: EditorElement): Vec2[] {
	const f = footprint(el);
	return [
		toPlan(el, [f.uMinM, -f.halfAcrossM]),
		toPlan(el, [f.uMaxM, -f.halfAcrossM]),
		toPlan(el, [f.uMaxM, f.halfAcrossM]),
		toPlan(el, [f.uMinM, f.halfAcrossM])
	];
}

/** Is the point on the element, with a margin (so thin cards can be picked)? */
export function hitsElement(el: EditorElement, point: Vec2, marginM: number): boolean {
	const f = footprint(el);
	const [u, v] = toLocal(el, point);
	return u >= f.uMinM - marginM && u <= f.uMaxM + marginM && Math.abs(v) <= f.halfAcrossM + marginM;
}

/** The top-most element under a point, or null. The background is picked only where nothing else is. */
export function hitTest(model: EditorModel, point: Vec2, marginM: number): EditorElement | null {
	const ordered = elementsInOrder(model).reverse();
	for (const el of ordered) if (el.kind !== 'background' && hitsElement(el, point, marginM)) return el;
	for (const el of ordered) if (el.kind === 'background' && hitsElement(el, point, 0)) return el;
	return null;
}

export interface Bounds {
	minX: number;
	minY: number;
	maxX: number;
	maxY: number;
}

export function boundsOfPoints(points: readonly Vec2[]): Bounds | null {
	if (!points.length) return null;
	let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
	for (const [x, y] of points) {
		if (x < minX) minX = x;
		if (y < minY) minY = y;
		if (x > maxX) maxX = x;
		if (y > maxY) maxY = y;
	}
	return { minX, minY, maxX, maxY };
}

export function elementBounds(el: EditorElement): Bounds {
	return boundsOfPoints(footprintCorners(el))!;
}

export function boundsOfElements(elements: readonly EditorElement[]): Bounds | null {
	return boundsOfPoints(elements.flatMap(footprintCorners));
}

export function expandBounds(b: Bounds, marginM: number): Bounds {
	return { minX: b.minX - marginM, minY: b.minY - marginM, maxX: b.maxX + marginM, maxY: b.maxY + marginM };
}

export function boundsContain(outer: Bounds, inner: Bounds): boolean {
	return inner.minX >= outer.minX && inner.maxX <= outer.maxX && inner.minY >= outer.minY && inner.maxY <= outer.maxY;
}

/** The plan segment a panel stands on: its width across its facing direction. */
export function panelSegment(el: { xM: number; yM: number; rotationDeg: number; widthM: number }): [Vec2, Vec2] {
	const [c, s] = direction2(el.rotationDeg);
	const hx = (-s * el.widthM) / 2;
	const hy = (c * el.widthM) / 2;
	return [
		[el.xM + hx, el.yM + hy],
		[el.xM - hx, el.yM - hy]
	];
}

/** The panel (centre, width, rotation) standing on a plan segment; inverse of `panelSegment`. */
export function panelFromSegment(from: Vec2, to: Vec2): { xM: number; yM: number; widthM: number; rotationDeg: number } {
	const dx = from[0] - to[0];
	const dy = from[1] - to[1];
	// panelSegment puts `from` at centre + (−sin r, cos r)·w/2, so (−sin r, cos r) ∥ (from − to).
	const rotationDeg = Math.atan2(-dx, dy) / DEG;
	return { xM: (from[0] + to[0]) / 2, yM: (from[1] + to[1]) / 2, widthM: Math.hypot(dx, dy), rotationDeg };
}
