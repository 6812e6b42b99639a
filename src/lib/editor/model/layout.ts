/**
 * From an exposure scene (and whatever plan entries a document has) to the editor model. The scene
 * wins on everything the exposure depends on (positions, powers, aims, normals, areas, flags); the
 * plan supplies what only the drawing needs (labels, sizes, rotations of bare lights, lock, order) and
 * the elements the scene has no place for (camera, diffusers, background). What the plan lacks is laid
 * out: each light and card turned toward the subject, a camera in front of the subject at the lens's
 * working distance, default sizes.
 */
import type { ExposureScene, SceneLight } from '$lib/light/schema';
import { defaultElement, KIND_LABELS } from './defaults';
import { aimAngles, direction3, normaliseDeg, panelFromSegment, panelSegment } from './geometry';
import { LOWEST_POWER } from '$lib/light/flash';
import { depthMOf, diffuserLossStops, reflectorProblem } from './scene';
import type {
	AmbientElement,
	CameraElement,
	ContinuousElement,
	DiffuserElement,
	EditorElement,
	ElementKind,
	FlagElement,
	FlashElement,
	Modifier,
	ReflectorElement,
	SubjectElement
} from './schema';
import { EMPTY_KEPT_PLAN, subjectOf, type EditorModel, type Vec2, type Vec3 } from './types';

/** Focal length assumed for a camera laid out from a scene alone (a common macro lens length). */
export const LAYOUT_FOCAL_LENGTH_MM = 100;

/** Working distance (subject to lens) for a magnification, thin lens: u = f·(1 + 1/m); 0.6 m at m = 0. */
export function layoutCameraDistanceM(magnification: number, focalLengthMm = LAYOUT_FOCAL_LENGTH_MM): number {
	if (!(magnification > 0)) return 0.6;
	return Math.min(2, Math.max(0.12, (focalLengthMm * (1 + 1 / magnification)) / 1000));
}

const SCENE_MODIFIER_NAME = 'Modifier';
const BARE_SIZE_M = 0.075;

/**
 * A light's modifier: the scene holds its beam angle and its loss, the plan its name and size.
 * `planModifier` undefined (no plan entry): all of the scene's loss is put down to a modifier;
 * null (the plan says none): only a beam the scene gives makes one, with no loss of its own.
 */
export function modifierFromScene(light: SceneEmitterFigures, planModifier: Modifier | null | undefined): Modifier | null {
	const beam = light.beamAngleDeg ?? null;
	const front = frontFromScene(light);
	const sized = (m: Modifier): Modifier => {
		const out: Modifier = { ...m, beamAngleDeg: beam, ...front };
		if (!front.emitterShape) delete out.emitterShape;
		if (front.emitterShape !== 'rectangle' || out.heightM === undefined) delete out.heightM;
		return out;
	};
	if (planModifier) return sameModifier(planModifier, sized(planModifier)) ? planModifier : sized(planModifier);
	const bare = { name: SCENE_MODIFIER_NAME, beamAngleDeg: beam, sizeM: BARE_SIZE_M };
	if (planModifier === null) return beam === null && !front.emitterShape ? null : sized({ ...bare, lossStops: 0 });
	if (beam !== null || (light.lossStops ?? 0) > 0 || front.emitterShape) return sized({ ...bare, lossStops: light.lossStops ?? 0 });
	return null;
}

type SceneEmitterFigures = { lossStops?: number; beamAngleDeg?: number; emitterWidthM?: number; emitterHeightM?: number; emitterDiameterM?: number };

/** A scene light's front size as a modifier's shape and size (nothing: a point). */
function frontFromScene(light: SceneEmitterFigures): Partial<Pick<Modifier, 'emitterShape' | 'sizeM' | 'heightM'>> {
	if (light.emitterDiameterM !== undefined) return { emitterShape: 'disc', sizeM: light.emitterDiameterM };
	if (light.emitterWidthM !== undefined && light.emitterHeightM !== undefined) {
		return { emitterShape: 'rectangle', sizeM: light.emitterWidthM, ...(light.emitterHeightM !== light.emitterWidthM ? { heightM: light.emitterHeightM } : {}) };
	}
	return {};
}

function sameModifier(a: Modifier, b: Modifier): boolean {
	return a.beamAngleDeg === b.beamAngleDeg && a.sizeM === b.sizeM && a.emitterShape === b.emitterShape && (a.heightM ?? a.sizeM) === (b.heightM ?? b.sizeM);
}

/** The scene of a setup that has nothing on it yet: a subject, a camera at 1:2, f/16, no light. */
export function emptySetupScene(): ExposureScene {
	return {
		camera: { iso: 100, aperture: 16, shutter: 1 / 160, magnification: 0.5 },
		subject: { position: [0, 0, 0.03] },
		lights: []
	};
}

export interface LayoutResult {
	model: EditorModel;
	/** Plan entries that could not be used, and why. */
	notes: string[];
}

/**
 * @param planElements valid plan entries by id (already parsed); `{}` lays out everything.
 */
export function modelFromScene(scene: ExposureScene, planElements: Readonly<Record<string, EditorElement>> = {}): LayoutResult {
	const notes: string[] = [];
	const planEmpty = Object.keys(planElements).length === 0;
	const elements: Record<string, EditorElement> = {};
	let z = Math.max(0, ...Object.values(planElements).map((e) => e.zIndex));
	const nextZ = () => ++z;
	const subjectPos = scene.subject.position as Vec3;

	// The subject: the plan's, moved to where the scene puts it.
	const planSubject = Object.values(planElements).find((e): e is SubjectElement => e.kind === 'subject');
	const subjectBase: SubjectElement =
		planSubject ??
		defaultElement('subject', { id: 'subject', label: KIND_LABELS.subject, xM: 0, yM: 0, rotationDeg: 90, zIndex: nextZ() });
	const subject: SubjectElement = {
		...subjectBase,
		xM: subjectPos[0],
		yM: subjectPos[1],
		heightM: subjectPos[2],
		living: scene.subject.living ?? false,
		facing: scene.subject.facing === 'up' ? 'up' : 'camera',
		normal: scene.subject.normal,
		...(scene.subject.depthMm !== undefined ? { depthM: keepDepth(subjectBase.depthM, scene.subject.depthMm) } : {})
	};
	if (!subject.normal) delete subject.normal;
	elements[subject.id] = subject;

	// What only the plan holds.
	const diffusers: DiffuserElement[] = [];
	for (const el of Object.values(planElements)) {
		if (el.kind === 'camera' || el.kind === 'diffuser' || el.kind === 'background') {
			if (el.id in elements) continue;
			elements[el.id] = el.kind === 'camera' ? cameraFromScene(scene.camera, el) : el;
			if (el.kind === 'diffuser') diffusers.push(el);
		}
	}
	if (planEmpty) {
		const u = layoutCameraDistanceM(scene.camera.magnification, scene.camera.focalLengthMm);
		const camera: CameraElement = defaultElement('camera', {
			id: 'camera',
			label: KIND_LABELS.camera,
			xM: subjectPos[0],
			yM: subjectPos[1] + u,
			heightM: subjectPos[2],
			rotationDeg: -90,
			zIndex: nextZ()
		});
		camera.focalLengthMm = LAYOUT_FOCAL_LENGTH_MM;
		const placed = cameraFromScene(scene.camera, camera);
		if (scene.camera.position) placed.rotationDeg = aimAngles(scene.camera.position as Vec3, subjectPos).rotationDeg;
		elements[camera.id] = placed;
	}

	const byId = new Map(scene.lights.map((l) => [l.id, l]));
	const labelFor = (kind: EditorElement['kind'], id: string) => {
		const plan = planElements[id];
		// A scene's ids are its own names for its lights ("key", "card"): they make good labels.
		return plan && plan.kind === kind ? plan.label : id;
	};

	for (const light of scene.lights) {
		if (elements[light.id]) {
			notes.push(`light “${light.id}” has the id of another element; the plan entry was replaced`);
		}
		const plan = planElements[light.id];
		const samePlan = plan && plan.kind === light.kind ? plan : undefined;
		if (light.kind === 'flash' || light.kind === 'continuous') {
			elements[light.id] = emitterFromScene(light, samePlan as FlashElement | ContinuousElement | undefined, subjectPos, diffusers, labelFor(light.kind, light.id), nextZ);
		} else {
			elements[light.id] = reflectorFromScene(light, samePlan as ReflectorElement | undefined, byId, subjectPos, labelFor('reflector', light.id), nextZ);
		}
	}
	for (const flag of scene.flags ?? []) {
		const plan = planElements[flag.id];
		const samePlan = plan?.kind === 'flag' ? plan : undefined;
		const seg = panelFromSegment(flag.from, flag.to);
		if (samePlan && sameSegment(panelSegment(samePlan), [flag.from as Vec2, flag.to as Vec2])) {
			elements[flag.id] = samePlan;
			continue;
		}
		const base: FlagElement = samePlan ?? defaultElement('flag', { id: flag.id, label: labelFor('flag', flag.id), xM: 0, yM: 0, zIndex: nextZ() });
		elements[flag.id] = { ...base, xM: seg.xM, yM: seg.yM, widthM: Math.max(0.001, seg.widthM), rotationDeg: keepTurn(base.rotationDeg, seg.rotationDeg) };
	}

	const planAmbient = Object.values(planElements).find((e): e is AmbientElement => e.kind === 'ambient');
	if (scene.ambient) {
		const ambient = ambientFromScene(scene.ambient, planAmbient, subjectPos, nextZ);
		if (elements[ambient.id]) notes.push(`the ambient light has the id of another element (“${ambient.id}”); the plan entry was replaced`);
		elements[ambient.id] = ambient;
	} else if (planAmbient) {
		notes.push(`plan entry “${planAmbient.id}” has no ambient light in the scene and was left out`);
	}

	const model: EditorModel = {
		elements,
		camera: settingsFromScene(scene.camera, Object.values(elements).some((e) => e.kind === 'camera')),
		kept: EMPTY_KEPT_PLAN
	};
	// Reflectors the scene could not hold (no usable source) live in the plan only: keep them.
	for (const el of Object.values(planElements)) {
		if (el.kind !== 'reflector' || el.id in elements) continue;
		if (reflectorProblem(model, el) !== null) elements[el.id] = el;
		else notes.push(`plan entry “${el.id}” has no light in the scene and was left out`);
	}
	for (const el of Object.values(planElements)) {
		if ((el.kind === 'flash' || el.kind === 'continuous' || el.kind === 'flag') && !(el.id in elements)) {
			notes.push(`plan entry “${el.id}” has no ${el.kind === 'flag' ? 'flag' : 'light'} in the scene and was left out`);
		}
	}
	return { model, notes };
}

/**
 * Floating point does not survive a trip through the scene exactly (an aim point is a position plus a
 * direction): where the plan's value and the scene's agree to far below anything measurable, the
 * plan's is kept, so a saved document reads back as the very same model.
 */
function keepAngles(plan: { rotationDeg: number; tiltDeg: number } | null, scene: { rotationDeg: number; tiltDeg: number }) {
	if (!plan) return scene;
	const a = direction3(plan.rotationDeg, plan.tiltDeg);
	const b = direction3(scene.rotationDeg, scene.tiltDeg);
	return Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]) < 1e-9 ? plan : scene;
}

function sameSegment(a: readonly [Vec2, Vec2], b: readonly [Vec2, Vec2]): boolean {
	const d = (p: Vec2, q: Vec2) => Math.hypot(p[0] - q[0], p[1] - q[1]);
	return d(a[0], b[0]) < 1e-9 && d(a[1], b[1]) < 1e-9;
}

/** The scene's angle, but turned the way the plan had it when they agree (a flag's 0° and 180° are one line). */
function keepTurn(planDeg: number, sceneDeg: number): number {
	return Math.abs(normaliseDeg(planDeg - sceneDeg - 180)) < 1e-6 ? planDeg : sceneDeg;
}

/** What the camera element holds of the scene's camera (its place, focal length, sensor): the scene's figures win. */
const CAMERA_ELEMENT_FIGURES = ['position', 'focalLengthMm', 'sensorWidthMm', 'sensorHeightMm'] as const;

function cameraFromScene(camera: ExposureScene['camera'], el: CameraElement): CameraElement {
	const p = camera.position;
	return {
		...el,
		...(p ? { xM: p[0], yM: p[1], heightM: p[2] } : {}),
		...(camera.focalLengthMm !== undefined ? { focalLengthMm: camera.focalLengthMm } : {}),
		...(camera.sensorWidthMm !== undefined ? { sensorWidthMm: camera.sensorWidthMm } : {}),
		...(camera.sensorHeightMm !== undefined ? { sensorHeightMm: camera.sensorHeightMm } : {})
	};
}

/** The camera settings: the scene's camera, less what a camera element on the plan holds (it gives them back to the scene). */
function settingsFromScene(camera: ExposureScene['camera'], hasCameraElement: boolean): EditorModel['camera'] {
	const settings = { ...camera };
	if (hasCameraElement) for (const key of CAMERA_ELEMENT_FIGURES) delete settings[key];
	return settings;
}

/** The scene's depth in metres, but the plan's when they agree to a nanometre (mm to m is not exact in floating point). */
function keepDepth(planM: number, sceneMm: number): number {
	return Math.abs(planM * 1000 - sceneMm) < 1e-6 ? planM : depthMOf(sceneMm);
}

function emitterFromScene(
	light: Extract<SceneLight, { kind: 'flash' | 'continuous' }>,
	plan: FlashElement | ContinuousElement | undefined,
	subject: Vec3,
	diffusers: DiffuserElement[],
	label: string,
	nextZ: () => number
): FlashElement | ContinuousElement {
	const pos = light.position as Vec3;
	const modifier = modifierFromScene(light, plan ? plan.modifier : undefined);
	const modLoss = modifier?.lossStops ?? 0;
	const otherLossStops = Math.max(0, round6((light.lossStops ?? 0) - modLoss - diffuserLossStops(diffusers, [pos[0], pos[1]], [subject[0], subject[1]])));
	const planAim = plan ? { rotationDeg: plan.rotationDeg, tiltDeg: plan.tiltDeg } : null;
	const aim = light.aim
		? keepAngles(planAim, aimAngles(pos, light.aim as Vec3))
		: planAim && !light.beamAngleDeg
			? planAim
			: keepAngles(planAim, aimAngles(pos, subject));
	const common = {
		xM: pos[0],
		yM: pos[1],
		heightM: pos[2],
		rotationDeg: aim.rotationDeg,
		tiltDeg: aim.tiltDeg,
		modifier,
		otherLossStops,
		kelvin: light.kelvin ?? null,
		gelMired: light.gelMired ?? 0
	};
	if (light.kind === 'flash') {
		const base = (plan as FlashElement | undefined) ?? defaultElement('flash', { id: light.id, label, xM: 0, yM: 0, zIndex: nextZ() });
		return {
			...base,
			...common,
			guideNumber: light.guideNumber,
			power: light.power,
			lowestPower: light.lowestPower !== undefined ? Math.max(LOWEST_POWER, light.lowestPower) : base.lowestPower,
			zoomMm: light.zoomMm ?? base.zoomMm,
			calibrationOffsetStops: light.calibrationOffsetStops ?? 0,
			highSpeedSync: light.highSpeedSync ?? false,
			mainsPowered: light.mainsPowered ?? false
		};
	}
	const base = (plan as ContinuousElement | undefined) ?? defaultElement('continuous', { id: light.id, label, xM: 0, yM: 0, zIndex: nextZ() });
	return { ...base, ...common, luxAt1m: light.luxAt1m, runsHot: light.runsHot ?? true };
}

/** The id the ambient light gets when the plan has none for it (the migration to version 2 uses it too). */
export const AMBIENT_ID = 'ambient-1';

/**
 * The ambient light: the scene's EV and kelvin, drawn where the plan puts it; with no plan entry, as
 * open sky behind the subject, light travelling toward the camera's side.
 */
function ambientFromScene(ambient: NonNullable<ExposureScene['ambient']>, plan: AmbientElement | undefined, subject: Vec3, nextZ: () => number): AmbientElement {
	const base =
		plan ??
		({
			...defaultElement('ambient', { id: AMBIENT_ID, label: KIND_LABELS.ambient, xM: subject[0], yM: subject[1] - 0.4, heightM: subject[2] + 0.3, rotationDeg: 90, zIndex: nextZ() }),
			source: 'sky'
		} satisfies AmbientElement);
	return { ...base, ev100: ambient.ev100, kelvin: ambient.kelvin ?? null };
}

function reflectorFromScene(
	light: Extract<SceneLight, { kind: 'reflector' }>,
	plan: ReflectorElement | undefined,
	byId: Map<string, SceneLight>,
	subject: Vec3,
	label: string,
	nextZ: () => number
): ReflectorElement {
	const pos = light.position as Vec3;
	const base = plan ?? defaultElement('reflector', { id: light.id, label, xM: 0, yM: 0, zIndex: nextZ() });
	// Keep the plan's proportions; scale them to the scene's area.
	const planArea = base.widthM * base.panelHeightM;
	const scale = Math.abs(light.areaM2 / planArea - 1) < 1e-9 ? 1 : Math.sqrt(light.areaM2 / planArea);
	const sized = plan ? { widthM: base.widthM * scale, panelHeightM: base.panelHeightM * scale } : { widthM: Math.sqrt(light.areaM2), panelHeightM: Math.sqrt(light.areaM2) };
	let facing: { rotationDeg: number; tiltDeg: number };
	if (light.normal) {
		facing = keepAngles(plan ? { rotationDeg: plan.rotationDeg, tiltDeg: plan.tiltDeg } : null, aimAngles([0, 0, 0], light.normal as Vec3));
	} else if (plan) {
		facing = { rotationDeg: plan.rotationDeg, tiltDeg: plan.tiltDeg };
	} else {
		// Drawn turned halfway between its source and the subject, the way an ideal card faces.
		const source = light.source === 'ambient' ? undefined : byId.get(light.source);
		const toSubject = aimAngles(pos, subject).rotationDeg;
		const toSource = source ? aimAngles(pos, source.position as Vec3).rotationDeg : toSubject;
		const half = normaliseDeg(toSource - toSubject) / 2;
		facing = { rotationDeg: normaliseDeg(toSubject + half), tiltDeg: 0 };
	}
	return {
		...base,
		...sized,
		xM: pos[0],
		yM: pos[1],
		heightM: pos[2],
		...facing,
		surface: light.surface,
		reflectance: light.reflectance,
		source: light.source,
		facingSet: light.normal !== undefined
	};
}

function round6(n: number): number {
	return Math.round(n * 1e6) / 1e6;
}

/**
 * Where a new element goes when the user does not say: around the subject for everything but a
 * subject, each new one a little further round so they do not stack, on the grid; else at `centreM`
 * (the middle of the view).
 */
export function placeForNew(model: EditorModel, kind: ElementKind, gridStepM: number, centreM: Vec2): { xM: number; yM: number } {
	const subject = subjectOf(model);
	if (!subject || kind === 'subject') return { xM: centreM[0], yM: centreM[1] };
	const count = Object.keys(model.elements).length;
	const angle = (-135 + 50 * count) * (Math.PI / 180);
	const r = kind === 'background' ? 0 : kind === 'camera' ? 0.3 : 0.25;
	const round = (v: number) => Math.round(v / gridStepM) * gridStepM;
	return { xM: round(subject.xM + r * Math.cos(angle)), yM: round(subject.yM + r * Math.sin(angle)) };
}
