/**
 * The close-range fields of the exposure scene (how the magnification is made, a teleconverter, the
 * camera's place, focal length and sensor, the subject's facing and depth, a flash's calibration,
 * lowest power and zoom, a light's size) carried by the editor both ways: a document the calculator or
 * the API saved with them, opened and saved in the editor, keeps them.
 */
import { describe, expect, it } from 'vitest';
import { computeExposure } from '$lib/light/scene';
import { exposureSceneSchema } from '$lib/light/schema';
import { setupDocumentSchema, type SetupDocumentInput } from '$lib/scene/document';
import { CURRENT_SCHEMA_VERSION } from '$lib/scene/version';
import { setCameraSettings, setElementProperties } from '../commands-properties';
import { applyDiff } from './diff';
import { documentFromModel, modelFromDocument } from './document';
import { MODIFIER_PRESETS } from './defaults';
import { toExposureScene } from './scene';
import type { EditorModel } from './types';

const scene = {
	camera: {
		iso: 100,
		aperture: 11,
		shutter: 1 / 160,
		magnification: 0.4,
		pupilMagnification: 0.6,
		magnificationBy: 'close-up-lens',
		teleconverterFactor: 1.4,
		position: [0, 0.35, 0.2],
		focalLengthMm: 100,
		sensorWidthMm: 23.5,
		sensorHeightMm: 15.6,
		pixelPitchUm: 3.9,
		cocBasis: 'pixel'
	},
	subject: { position: [0, 0, 0.02], facing: 'up', depthMm: 18 },
	lights: [
		{
			id: 'key',
			kind: 'flash',
			position: [-0.2, 0.1, 0.3],
			guideNumber: 24,
			power: 1 / 16,
			lossStops: 1.5,
			beamAngleDeg: 100,
			calibrationOffsetStops: -0.3,
			lowestPower: 1 / 128,
			zoomMm: 50,
			emitterWidthM: 0.3,
			emitterHeightM: 0.2
		},
		{ id: 'lamp', kind: 'continuous', position: [0.25, -0.1, 0.25], luxAt1m: 1500, beamAngleDeg: 150, lossStops: 1, emitterDiameterM: 0.1, runsHot: false }
	]
} as const;

const doc = (plan: Record<string, unknown> = {}): SetupDocumentInput => ({ schemaVersion: CURRENT_SCHEMA_VERSION, scene: structuredClone(scene) as never, plan, notes: '', gear: [] });

const saved = (model: EditorModel) => JSON.parse(JSON.stringify(documentFromModel(model)));

/** The scene without the aim points the editor writes for a beam (the subject: the engine's default when none is given). */
function withoutAims(s: { lights: Record<string, unknown>[] }) {
	return { ...s, lights: s.lights.map(({ aim: _aim, ...l }) => l) };
}

describe('the close-range fields, read and written back by the editor', () => {
	it('a document with a plan of {} opens and saves with every field kept', () => {
		const { model, notes } = modelFromDocument(setupDocumentSchema.parse(doc()));
		expect(notes).toEqual([]);
		const out = saved(model);
		expect(setupDocumentSchema.safeParse(out).success).toBe(true);
		expect(withoutAims(out.scene)).toEqual(exposureSceneSchema.parse(scene));
		// And again: a second round trip changes nothing.
		expect(saved(modelFromDocument(out).model)).toEqual(out);
	});

	it('a plan whose camera stands elsewhere is moved to the scene’s camera, whose figures win', () => {
		const plan = { elements: { camera: { kind: 'camera', label: 'Body', position: [0.5, 0.5, 0.1], rotationDeg: 90, focalLengthMm: 60, sensorWidthMm: 36, sensorHeightMm: 24 } } };
		const { model } = modelFromDocument(setupDocumentSchema.parse(doc(plan)));
		expect(model.elements.camera).toMatchObject({ xM: 0, yM: 0.35, heightM: 0.2, focalLengthMm: 100, sensorWidthMm: 23.5, sensorHeightMm: 15.6, rotationDeg: 90 });
		// The settings hold what the camera element does not (no second copy of its place).
		expect(model.camera).not.toHaveProperty('position');
		expect(model.camera).toMatchObject({ magnificationBy: 'close-up-lens', teleconverterFactor: 1.4, pixelPitchUm: 3.9, cocBasis: 'pixel' });
		expect(withoutAims(saved(model).scene)).toEqual(exposureSceneSchema.parse(scene));
	});

	it('reads the subject’s facing and depth, a flash’s calibration, ladder and zoom, and each light’s size', () => {
		const { model } = modelFromDocument(setupDocumentSchema.parse(doc()));
		const { subject, key, lamp } = { subject: Object.values(model.elements).find((e) => e.kind === 'subject')!, key: model.elements.key, lamp: model.elements.lamp };
		expect(subject).toMatchObject({ facing: 'up', depthM: 0.018 });
		expect(key).toMatchObject({ calibrationOffsetStops: -0.3, lowestPower: 1 / 128, zoomMm: 50 });
		expect(key.kind === 'flash' && key.modifier).toMatchObject({ emitterShape: 'rectangle', sizeM: 0.3, heightM: 0.2, lossStops: 1.5 });
		expect(lamp.kind === 'continuous' && lamp.modifier).toMatchObject({ emitterShape: 'disc', sizeM: 0.1 });
	});

	it('the exposure the editor computes is the engine’s for the saved scene', () => {
		const { model } = modelFromDocument(setupDocumentSchema.parse(doc()));
		const before = computeExposure(exposureSceneSchema.parse(scene));
		const after = computeExposure(exposureSceneSchema.parse(toExposureScene(model)));
		expect(after.total.x).toBe(before.total.x);
		expect(after.workingAperture).toBe(before.workingAperture);
		expect(after.lights.map((l) => l.sourceModel)).toEqual(['rectangle', 'disc']);
	});
});

describe('the plan gives the scene what it holds', () => {
	const start = modelFromDocument(setupDocumentSchema.parse(doc())).model;
	const apply = (m: EditorModel, r: ReturnType<ReturnType<typeof setElementProperties>>) => {
		if (!r.ok) throw new Error(r.error.message);
		return applyDiff(m, r.diff);
	};

	it('the camera’s place is the camera element’s: moving it moves camera.position', () => {
		const moved = apply(start, setElementProperties('camera', { xM: 0.1, yM: 0.4, heightM: 0.25 })(start));
		expect(toExposureScene(moved).camera.position).toEqual([0.1, 0.4, 0.25]);
	});

	it('a subject facing the camera sends facing "camera" only when the plan has a camera; a set direction sends its normal', () => {
		const subjectId = Object.values(start.elements).find((e) => e.kind === 'subject')!.id;
		const toCamera = apply(start, setElementProperties(subjectId, { facing: 'camera' })(start));
		expect(toExposureScene(toCamera).subject.facing).toBe('camera');
		const noCamera: EditorModel = { ...toCamera, elements: Object.fromEntries(Object.entries(toCamera.elements).filter(([, e]) => e.kind !== 'camera')) };
		expect(toExposureScene(noCamera).subject).not.toHaveProperty('facing');
		expect(exposureSceneSchema.safeParse(toExposureScene(noCamera)).success).toBe(true);
		const turned = apply(start, setElementProperties(subjectId, { normal: [-1, 0, 0] })(start));
		expect(toExposureScene(turned).subject).toMatchObject({ normal: [-1, 0, 0] });
		expect(toExposureScene(turned).subject).not.toHaveProperty('facing');
	});

	it('a softbox preset is a rectangle its own size, a dome a disc, a bare head a point', () => {
		const box = MODIFIER_PRESETS.find((m) => m.name.startsWith('Small softbox'))!;
		const dome = MODIFIER_PRESETS.find((m) => m.name.startsWith('Diffusion dome'))!;
		const bare = MODIFIER_PRESETS.find((m) => m.name === 'Bare head')!;
		const light = (modifier: typeof box) => {
			const m = apply(start, setElementProperties('key', { modifier })(start));
			return toExposureScene(m).lights.find((l) => l.id === 'key')!;
		};
		expect(light(box)).toMatchObject({ emitterWidthM: 0.3, emitterHeightM: 0.3 });
		expect(light(dome)).toMatchObject({ emitterDiameterM: 0.08 });
		const point = light(bare);
		expect(point).not.toHaveProperty('emitterWidthM');
		expect(point).not.toHaveProperty('emitterDiameterM');
	});

	it('a teleconverter set on the camera doubles the working f-number with a close-up lens (N_w = k·N)', () => {
		// A close-up lens costs no light and a 2× converter doubles the f-number (optics.ts, apertureFactor;
		// common practice: a 2× converter costs two stops).
		const r = setCameraSettings({ teleconverterFactor: 2 })(start);
		if (!r.ok) throw new Error(r.error.message);
		const m = applyDiff(start, r.diff);
		expect(computeExposure(exposureSceneSchema.parse(toExposureScene(m))).workingAperture).toBeCloseTo(22, 9);
	});
});
