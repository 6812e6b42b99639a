import { describe, expect, it } from 'vitest';
import { computeExposure } from '$lib/light/scene';
import { exposureSceneSchema } from '$lib/light/schema';
import { addElement, moveElementsTo, type Command } from '../commands';
import { setCameraSettings, setElementProperties } from '../commands-properties';
import { addWith, quartzModel } from '../test-fixtures';
import { applyDiff } from './diff';
import { excludedElements, toExposureScene } from './scene';
import type { EditorModel } from './types';

function run(model: EditorModel, ...commands: Command[]): EditorModel {
	for (const c of commands) {
		const r = c(model);
		if (!r.ok) throw new Error(r.error.message);
		model = applyDiff(model, r.diff);
	}
	return model;
}

const stopsOf = (model: EditorModel, id: string) => computeExposure(exposureSceneSchema.parse(toExposureScene(model))).lights.find((l) => l.id === id)!;

describe('toExposureScene', () => {
	it('gives a scene the API accepts', () => {
		const model = run(quartzModel(), addElement('reflector', { xM: 0.3, yM: 0 }), addElement('flag', { xM: 0, yM: -0.3 }), addElement('diffuser', { xM: 0, yM: 0.5 }));
		expect(exposureSceneSchema.safeParse(toExposureScene(model)).success).toBe(true);
	});

	it('a flash moved twice as far gives −2 stops (inverse-square law) through the engine', () => {
		// Inverse-square law: illuminance ∝ 1/d²; the API (POST /api/v1/exposure in /api/v1/openapi.json): X = (GN_eff / (d · N_w))².
		const near = quartzModel();
		const far = run(near, moveElementsTo({ key: { xM: -1, yM: 0 } }));
		const difference = stopsOf(far, 'key').stops! - stopsOf(near, 'key').stops!;
		expect(difference).toBeCloseTo(-2, 9);
	});

	it('guide number worked example: GN 40 m at full power, ISO 100, f/16 is correct at 2.5 m', () => {
		// Guide number definition: GN = distance × f-number at ISO 100 and full power (/api/v1/openapi.json; ISO 1230,
		// from memory): 40 / 16 = 2.5 m.
		const model = run(
			quartzModel(),
			setCameraSettings({ magnification: 0 }),
			setElementProperties('key', { power: 1, modifier: null }),
			moveElementsTo({ key: { xM: -2.5, yM: 0 } })
		);
		expect(stopsOf(model, 'key').stops).toBeCloseTo(0, 9);
	});

	it('a modifier costs its light loss; a gel or filter its own', () => {
		const bare = run(quartzModel(), setElementProperties('key', { modifier: null }));
		const softbox = run(bare, setElementProperties('key', { modifier: { name: 'Small softbox', beamAngleDeg: 100, lossStops: 1.5, sizeM: 0.3 } }));
		// Aimed straight at the subject (the layout aims it), so the beam costs nothing on axis.
		expect(stopsOf(softbox, 'key').stops! - stopsOf(bare, 'key').stops!).toBeCloseTo(-1.5, 9);
		const filtered = run(softbox, setElementProperties('key', { otherLossStops: 0.5 }));
		expect(stopsOf(filtered, 'key').stops! - stopsOf(bare, 'key').stops!).toBeCloseTo(-2, 9);
	});

	it('a diffuser costs its loss to the lights whose path crosses it, and nothing to others', () => {
		const base = quartzModel();
		const across = run(base, addWith('diffuser', { xM: -0.25, yM: 0 }, { rotationDeg: 0, widthM: 0.3, lossStops: 1 }));
		expect(stopsOf(across, 'key').stops! - stopsOf(base, 'key').stops!).toBeCloseTo(-1, 9);
		const aside = run(base, addWith('diffuser', { xM: -0.25, yM: 0.4 }, { rotationDeg: 0, widthM: 0.3, lossStops: 1 }));
		expect(stopsOf(aside, 'key').stops).toBeCloseTo(stopsOf(base, 'key').stops!, 9);
	});

	it('a flag across the path blocks the light; its plan segment is its width across its facing', () => {
		const model = run(quartzModel(), addWith('flag', { xM: -0.25, yM: 0 }, { rotationDeg: 0, widthM: 0.2 }));
		const scene = toExposureScene(model);
		const flag = scene.flags![0];
		expect(flag.from[0]).toBeCloseTo(-0.25);
		expect(flag.to[0]).toBeCloseTo(-0.25);
		expect(Math.abs(flag.from[1] - flag.to[1])).toBeCloseTo(0.2);
		const key = stopsOf(model, 'key');
		expect(key.blocked).toBe(true);
		expect(key.stops).toBeNull();
	});

	it('lights carry their kelvin and gel; a kelvin left unstated stays out of the scene', () => {
		let model = run(quartzModel(), setElementProperties('key', { kelvin: 5600, gelMired: 109 }));
		let key = toExposureScene(model).lights[0];
		expect(key.kind === 'flash' && [key.kelvin, key.gelMired]).toEqual([5600, 109]);
		model = run(model, setElementProperties('key', { kelvin: null, gelMired: 0 }));
		key = toExposureScene(model).lights[0];
		expect('kelvin' in key || 'gelMired' in key).toBe(false);
	});

	it('a light turned away from the subject loses its beam: aim follows rotation and tilt', () => {
		const aimed = run(quartzModel(), setElementProperties('key', { modifier: { name: 'Grid', beamAngleDeg: 20, lossStops: 0, sizeM: 0.07 } }));
		const light = toExposureScene(aimed).lights[0];
		expect(light.kind === 'flash' && light.aim).toEqual([0.5, 0, 0.03]);
		const turned = run(aimed, setElementProperties('key', { rotationDeg: 90 }));
		expect(stopsOf(turned, 'key').stops).toBeNull();
	});

	it('a card gets its normal from its facing; turned away from the subject it returns nothing', () => {
		// The subject's face turned to the card (the card fills the side away from the key).
		const turned = run(quartzModel(), setElementProperties('subject', { normal: [1, 0, 0] }));
		const withCard = run(turned, addElement('reflector', { xM: 0.3, yM: 0 }));
		const card = Object.values(withCard.elements).find((e) => e.kind === 'reflector')!;
		expect(card.kind === 'reflector' && card.source).toBe('key');
		const facingSubject = run(withCard, setElementProperties(card.id, { rotationDeg: 180, tiltDeg: 0 }));
		const scene = toExposureScene(facingSubject);
		const r = scene.lights.find((l) => l.id === card.id)!;
		expect(r.kind === 'reflector' && r.normal?.map((v) => Math.round(v * 1e6) / 1e6)).toEqual([-1, 0, 0]);
		expect(r.kind === 'reflector' && r.areaM2).toBeCloseTo(0.04);
		expect(stopsOf(facingSubject, card.id).stops).not.toBeNull();
		const away = run(facingSubject, setElementProperties(card.id, { rotationDeg: 0 }));
		expect(stopsOf(away, card.id).x).toBe(0);
	});

	it('leaves out a card with nothing to bounce, and says why', () => {
		const model = run(quartzModel(), addWith('reflector', { xM: 0.3, yM: 0 }, { source: 'ambient' }));
		const card = Object.values(model.elements).find((e) => e.kind === 'reflector')!;
		expect(toExposureScene(model).lights.map((l) => l.id)).toEqual(['key']);
		expect(excludedElements(model)).toEqual([{ id: card.id, reason: 'bounces the ambient light, but the setup has no ambient' }]);
	});
});
