/**
 * The editor model as the exposure scene of `POST /api/v1/exposure` (see /api/v1/openapi.json): the subject's position,
 * each light with its kelvin, its losses (modifier + other + every diffuser its straight path to the
 * subject crosses in plan), its beam aimed along its rotation and tilt, each reflector with its area
 * and (when its facing is set) its normal; each flag as its plan segment; the ambient element as the
 * scene's ambient (its EV at ISO 100 and kelvin; where it stands and the way it faces are the plan's).
 * The camera element gives the scene's camera its position (so the subject faces it: Lambert's cosine
 * law at the subject), its focal length (thin-lens depth of field) and its sensor (circle of
 * confusion); the subject gives its facing and its depth; a light whose modifier has a front that
 * glows evenly gives that front's size (an extended source close up). Diffusers and backgrounds are
 * drawing and loss only: the scene has no place for them.
 */
import { segmentsIntersect } from '$lib/light/geometry';
import type { ExposureScene, Flag, SceneLight } from '$lib/light/schema';
import { direction3, panelSegment } from './geometry';
import type { DiffuserElement, EditorElement, EmitterElement, Modifier, ReflectorElement, SubjectElement } from './schema';
import type { EditorModel, Vec2, Vec3 } from './types';
import { ambientOf, cameraOf, elementsInOrder, subjectOf } from './types';

/** The subject's position when a plan has none yet (the scene needs one). */
export const ORIGIN: Vec3 = [0, 0, 0];

export interface ExcludedElement {
	id: string;
	reason: string;
}

const pos3 = (el: EditorElement): [number, number, number] => [el.xM, el.yM, el.heightM];

/** Stops lost to diffusers whose plan segment the straight path from `from` to `to` crosses. */
export function diffuserLossStops(diffusers: readonly DiffuserElement[], from: Vec2, to: Vec2): number {
	let loss = 0;
	for (const d of diffusers) {
		const [a, b] = panelSegment(d);
		if (segmentsIntersect(from, to, a, b)) loss += d.lossStops;
	}
	return loss;
}

/** Why a reflector cannot be in the scene (null: it can). */
export function reflectorProblem(model: EditorModel, r: ReflectorElement): string | null {
	if (r.source === 'ambient') return ambientOf(model) ? null : 'bounces the ambient light, but the setup has no ambient';
	const source = model.elements[r.source];
	if (!source) return `bounces “${r.source}”, which is not on the plan`;
	if (source.kind !== 'flash' && source.kind !== 'continuous') return `bounces “${source.label}”, which is not a light`;
	return null;
}

/** Elements the scene leaves out, with the reason (for the exposure panel). */
export function excludedElements(model: EditorModel): ExcludedElement[] {
	const out: ExcludedElement[] = [];
	for (const el of elementsInOrder(model)) {
		if (el.kind !== 'reflector') continue;
		const problem = reflectorProblem(model, el);
		if (problem) out.push({ id: el.id, reason: problem });
	}
	return out;
}

/** The scene's largest emitter side (`emitterWidthM` and the like). */
const MAX_EMITTER_M = 20;

/** The size of a modifier's front that glows evenly, as the scene's emitter fields (none: a point). */
export function emitterSizeOf(modifier: Modifier | null): { emitterWidthM: number; emitterHeightM: number } | { emitterDiameterM: number } | Record<string, never> {
	if (!modifier?.emitterShape) return {};
	const side = (m: number) => Math.min(MAX_EMITTER_M, m);
	if (modifier.emitterShape === 'disc') return { emitterDiameterM: side(modifier.sizeM) };
	return { emitterWidthM: side(modifier.sizeM), emitterHeightM: side(modifier.heightM ?? modifier.sizeM) };
}

function emitterLight(el: EmitterElement, subject: Vec3, diffusers: DiffuserElement[]): SceneLight {
	const position = pos3(el);
	const loss = (el.modifier?.lossStops ?? 0) + el.otherLossStops + diffuserLossStops(diffusers, [el.xM, el.yM], [subject[0], subject[1]]);
	const beam: Partial<{ aim: [number, number, number]; beamAngleDeg: number }> = {};
	if (el.modifier?.beamAngleDeg != null) {
		const d = direction3(el.rotationDeg, el.tiltDeg);
		beam.aim = [el.xM + d[0], el.yM + d[1], el.heightM + d[2]];
		beam.beamAngleDeg = el.modifier.beamAngleDeg;
	}
	const colour = {
		...(el.kelvin !== null ? { kelvin: el.kelvin } : {}),
		...(el.gelMired !== 0 ? { gelMired: el.gelMired } : {})
	};
	const lossStops = Math.min(30, loss);
	if (el.kind === 'flash') {
		return {
			id: el.id,
			kind: 'flash',
			position,
			guideNumber: el.guideNumber,
			...(el.calibrationOffsetStops !== 0 ? { calibrationOffsetStops: el.calibrationOffsetStops } : {}),
			power: el.power,
			...(lossStops > 0 ? { lossStops } : {}),
			lowestPower: el.lowestPower,
			...(el.zoomMm !== null ? { zoomMm: el.zoomMm } : {}),
			...beam,
			...emitterSizeOf(el.modifier),
			...colour,
			...(el.highSpeedSync ? { highSpeedSync: true } : {}),
			...(el.mainsPowered ? { mainsPowered: true } : {})
		};
	}
	return {
		id: el.id,
		kind: 'continuous',
		position,
		luxAt1m: el.luxAt1m,
		...(lossStops > 0 ? { lossStops } : {}),
		...beam,
		...emitterSizeOf(el.modifier),
		...colour,
		runsHot: el.runsHot
	};
}

function reflectorLight(el: ReflectorElement): SceneLight {
	const n = direction3(el.rotationDeg, el.tiltDeg);
	return {
		id: el.id,
		kind: 'reflector',
		position: pos3(el),
		areaM2: el.widthM * el.panelHeightM,
		reflectance: el.reflectance,
		surface: el.surface,
		source: el.source,
		...(el.facingSet ? { normal: [n[0], n[1], n[2]] as [number, number, number] } : {})
	};
}

export function toExposureScene(model: EditorModel): ExposureScene {
	const subjectEl = subjectOf(model);
	const subject: Vec3 = subjectEl ? pos3(subjectEl) : ORIGIN;
	const ordered = elementsInOrder(model);
	const diffusers = ordered.filter((e): e is DiffuserElement => e.kind === 'diffuser');
	const ambient = ambientOf(model);
	const lights: SceneLight[] = [];
	const flags: Flag[] = [];
	for (const el of ordered) {
		if (el.kind === 'flash' || el.kind === 'continuous') lights.push(emitterLight(el, subject, diffusers));
		else if (el.kind === 'reflector' && reflectorProblem(model, el) === null) lights.push(reflectorLight(el));
		else if (el.kind === 'flag') {
			const [from, to] = panelSegment(el);
			flags.push({ id: el.id, from: [from[0], from[1]], to: [to[0], to[1]] });
		}
	}
	const camera = sceneCamera(model);
	return {
		camera,
		subject: { position: [subject[0], subject[1], subject[2]], ...(subjectEl ? subjectFields(subjectEl, camera.position !== undefined) : {}) },
		...(ambient ? { ambient: { ev100: ambient.ev100, ...(ambient.kelvin !== null ? { kelvin: ambient.kelvin } : {}) } } : {}),
		lights,
		...(flags.length ? { flags } : {})
	};
}

/** The scene's camera: the settings, with the camera element's place, focal length and sensor when the plan has one. */
function sceneCamera(model: EditorModel): ExposureScene['camera'] {
	const el = cameraOf(model);
	if (!el) return { ...model.camera };
	return {
		...model.camera,
		position: [el.xM, el.yM, el.heightM],
		focalLengthMm: el.focalLengthMm,
		sensorWidthMm: el.sensorWidthMm,
		sensorHeightMm: el.sensorHeightMm
	};
}

/** The scene's deepest subject, mm. */
const MAX_DEPTH_MM = 10_000;

/**
 * The subject's figures beyond its place: living, its face (a set direction as its normal; else up, or
 * toward the camera when the camera has a place: the engine refuses "camera" without one) and its depth.
 */
function subjectFields(el: SubjectElement, cameraPlaced: boolean): Partial<ExposureScene['subject']> {
	const facing = el.normal ? {} : el.facing === 'up' ? { facing: 'up' as const } : cameraPlaced ? { facing: 'camera' as const } : {};
	return {
		...(el.living ? { living: true } : {}),
		...(el.normal ? { normal: [...el.normal] as [number, number, number] } : {}),
		...facing,
		depthMm: Math.min(MAX_DEPTH_MM, depthMmOf(el.depthM))
	};
}

/** Metres to millimetres and back, rounded to a nanometre so a saved depth reads back as typed. */
export const depthMmOf = (m: number) => Math.round(m * 1e9) / 1e6;
export const depthMOf = (mm: number) => Math.round(mm * 1e6) / 1e9;
