import { describe, expect, it } from 'vitest';
import { computeExposure } from '$lib/light/scene';
import { exposureSceneSchema, type ExposureScene } from '$lib/light/schema';
import { documentFromModel, modelFromDocument } from './document';
import { layoutCameraDistanceM, modelFromScene } from './layout';
import { toExposureScene } from './scene';

/** The ammonite section: raking flash from the left, a silver reflector opposite, a flag, overcast ambient. */
const ammonite: ExposureScene = exposureSceneSchema.parse({
	camera: { iso: 200, aperture: 11, shutter: 1 / 125, magnification: 0.5 },
	subject: { position: [0.1, 0.05, 0.02] },
	ambient: { ev100: 8 },
	lights: [
		{ id: 'rake', kind: 'flash', position: [-0.3, 0.05, 0.05], guideNumber: 32, power: 0.25, beamAngleDeg: 60, lossStops: 1 },
		{ id: 'lamp', kind: 'continuous', position: [0.1, -0.4, 0.4], luxAt1m: 3000, kelvin: 3200 },
		{ id: 'silver', kind: 'reflector', position: [0.4, 0.05, 0.05], areaM2: 0.06, reflectance: 0.9, surface: 'specular', source: 'rake' }
	],
	flags: [{ id: 'cutter', from: [0.1, 0.3], to: [0.3, 0.3] }]
});

describe('laying out a plan from a scene alone (plan: {})', () => {
	const { model, notes } = modelFromScene(ammonite);
	const els = model.elements;

	it('derives one element per subject, light, flag and the ambient, and adds a camera', () => {
		expect(notes).toEqual([]);
		expect(Object.values(els).map((e) => e.kind).sort()).toEqual(['ambient', 'camera', 'continuous', 'flag', 'flash', 'reflector', 'subject']);
		// The ambient with no plan entry: open sky behind the subject, its EV the scene's.
		expect(Object.values(els).find((e) => e.kind === 'ambient')).toMatchObject({ source: 'sky', ev100: 8, kelvin: null, rotationDeg: 90 });
		expect([els.rake.xM, els.rake.yM, els.rake.heightM]).toEqual([-0.3, 0.05, 0.05]);
	});

	it('puts the camera in front of the subject at the lens’s working distance u = f(1 + 1/m)', () => {
		// Thin lens, f = 100 mm at m = 0.5: u = 100 × 3 = 300 mm (thin-lens equation; textbook, from memory).
		expect(layoutCameraDistanceM(0.5)).toBeCloseTo(0.3);
		const camera = Object.values(els).find((e) => e.kind === 'camera')!;
		expect(camera.xM).toBeCloseTo(0.1);
		expect(camera.yM).toBeCloseTo(0.05 + 0.3);
		expect(camera.rotationDeg).toBe(-90);
	});

	it('turns lights toward the subject, keeps the modifier’s loss, reads a flag’s segment', () => {
		expect(els.rake.rotationDeg).toBeCloseTo(0);
		expect(els.rake.kind === 'flash' && els.rake.modifier).toMatchObject({ beamAngleDeg: 60, lossStops: 1 });
		expect(els.lamp.kind === 'continuous' && els.lamp.kelvin).toBe(3200);
		expect(els.cutter.kind === 'flag' && [els.cutter.xM, els.cutter.yM, els.cutter.widthM]).toEqual([0.2, 0.3, expect.closeTo(0.2, 9)]);
		expect(els.silver.kind === 'reflector' && els.silver.widthM * els.silver.panelHeightM).toBeCloseTo(0.06);
		expect(els.silver.kind === 'reflector' && els.silver.facingSet).toBe(false);
	});

	it('the laid-out plan computes the same exposure as the scene it came from, seen from the camera it lays out', () => {
		// The plan's camera gives the scene its place (the subject faces it: Lambert's cosine law), so the
		// scene to match is the ammonite's seen from there.
		const camera = Object.values(els).find((e) => e.kind === 'camera')!;
		const before = computeExposure({ ...ammonite, camera: { ...ammonite.camera, position: [camera.xM, camera.yM, camera.heightM] } });
		const after = computeExposure(exposureSceneSchema.parse(toExposureScene(model)));
		// An aim point is a position plus a direction: agreement to a part in 10⁹ is float rounding.
		for (const [i, l] of after.lights.entries()) {
			if (before.lights[i].x === 0) expect(l.x).toBe(0);
			else expect(l.x / before.lights[i].x).toBeCloseTo(1, 9);
		}
		expect(after.total.x).toBeCloseTo(before.total.x, 12);
	});

	it('a saved document reads back as the same elements, and saves again as the same document', () => {
		const doc = documentFromModel(model, 'Ammonite, raking light');
		const back = modelFromDocument(JSON.parse(JSON.stringify(doc)));
		expect(back.notes).toEqual([]);
		expect(back.model.elements).toEqual(model.elements);
		expect(back.model.camera).toEqual(model.camera);
		expect(JSON.parse(JSON.stringify(documentFromModel(back.model, 'Ammonite, raking light')))).toEqual(JSON.parse(JSON.stringify(doc)));
	});
});

describe('reading a document whose plan and scene disagree', () => {
	const { model } = modelFromScene(ammonite);
	const doc = documentFromModel(model);

	it('the scene wins on position, the plan keeps labels and sizes', () => {
		const plan = doc.plan as { elements: Record<string, Record<string, unknown>> };
		plan.elements.rake.label = 'Raking flash';
		const scene = structuredClone(doc.scene);
		scene.lights[0].position = [-0.5, 0.05, 0.05];
		const read = modelFromDocument({ scene, plan: doc.plan });
		expect(read.model.elements.rake.label).toBe('Raking flash');
		expect(read.model.elements.rake.xM).toBe(-0.5);
	});

	it('a field of a plan entry that does not fit is left at its default, with a note naming it', () => {
		const plan = structuredClone(doc.plan) as { elements: Record<string, Record<string, unknown>> };
		plan.elements.rake.label = 'Raking flash';
		plan.elements.rake.otherLossStops = 'a little';
		const read = modelFromDocument({ scene: doc.scene, plan });
		expect(read.notes[0]).toMatch(/plan entry “rake”: otherLossStops must be a number/);
		const rake = read.model.elements.rake;
		expect(rake.label).toBe('Raking flash');
		expect(rake.kind === 'flash' && [rake.otherLossStops, rake.guideNumber]).toEqual([0, 32]);
	});

	it('a light a script removed from the scene is dropped from the plan, with a note', () => {
		const scene = structuredClone(doc.scene);
		scene.lights = scene.lights.filter((l) => l.id !== 'lamp');
		const read = modelFromDocument({ scene, plan: doc.plan });
		expect(read.model.elements.lamp).toBeUndefined();
		expect(read.notes.join(' ')).toMatch(/lamp/);
	});
});
