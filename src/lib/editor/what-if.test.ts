import { describe, expect, it } from 'vitest';
import { setElementProperties } from './commands-properties';
import { openDocument } from './model/document';
import { Editor } from './editor.svelte';
import { modelFromScene } from './model/layout';
import { quartzModel, quartzScene } from './test-fixtures';
import {
	describeDistanceFactor,
	distanceFactor,
	formatStopChange,
	inverseSquareStops,
	previewWhatIf,
	whatIfPatch
} from './what-if';
import type { FlashElement } from './model/schema';

describe('inverse-square law', () => {
	// E = I / d² for a point source (the inverse-square law; from memory, as stated in any optics or
	// photography textbook): doubling the distance quarters the light, −2 stops; halving it, +2 stops.
	it('twice as far is −2 stops, half as far +2, √2 as far −1', () => {
		expect(inverseSquareStops(2)).toBeCloseTo(-2, 12);
		expect(inverseSquareStops(0.5)).toBeCloseTo(2, 12);
		expect(inverseSquareStops(Math.SQRT2)).toBeCloseTo(-1, 12);
		expect(inverseSquareStops(1)).toBe(-0);
	});
	it('refuses a distance factor that is not a positive number', () => {
		expect(() => inverseSquareStops(0)).toThrow(RangeError);
		expect(() => inverseSquareStops(Number.NaN)).toThrow(RangeError);
	});
	it('sixths of a doubling run from half to twice as far, a third of a stop of light each', () => {
		expect(distanceFactor(6)).toBe(2);
		expect(distanceFactor(-6)).toBe(0.5);
		expect(inverseSquareStops(distanceFactor(1))).toBeCloseTo(-1 / 3, 12);
	});
	it('says it in words', () => {
		expect(describeDistanceFactor(2)).toBe('twice as far');
		expect(describeDistanceFactor(0.5)).toBe('half as far');
		expect(describeDistanceFactor(distanceFactor(3))).toBe('1.41× as far');
		expect(formatStopChange(-2)).toBe('−2.0 stops');
		expect(formatStopChange(1)).toBe('+1.0 stop');
		expect(formatStopChange(0.02)).toBe('0.0 stops');
	});
});

describe('previewWhatIf', () => {
	it('moving the quartz key light twice as far costs 2 stops, checked against the guide-number formula', () => {
		const model = quartzModel();
		const p = previewWhatIf(model, 'key', { powerThirds: 0, distanceSixths: 6 })!;
		expect(p.distanceWords).toBe('twice as far: −2.0 stops');
		expect(p.oldDistanceM).toBeCloseTo(0.5, 12);
		expect(p.distanceM).toBeCloseTo(1, 12);
		// Guide-number exposure, X = (GN·√power / (d·N_w))² (the API's formula, /api/v1/openapi.json; GN = distance × f-number is
		// the definition of a guide number, common practice). GN 40 at 1/8 power, f/16 at 1:2 → N_w = 24.
		const gn = 40 * Math.sqrt(1 / 8);
		expect(p.contributionStops.before).toBeCloseTo(Math.log2((gn / (0.5 * 24)) ** 2), 9);
		expect(p.contributionStops.after).toBeCloseTo(Math.log2((gn / (1 * 24)) ** 2), 9);
		expect(p.contributionStops.after! - p.contributionStops.before!).toBeCloseTo(-2, 9);
		// The only light: the whole exposure falls by the same 2 stops.
		expect(p.totalStops.after! - p.totalStops.before!).toBeCloseTo(-2, 9);
		expect(p.summary).toMatch(/^Whole exposure −2\.0 stops/);
	});

	it('uses the true 3-D distance: a light up and to the side moves along its line to the subject', () => {
		const scene = quartzScene();
		// Subject 3 cm up; the light 30 cm to its left and 40 cm above it: 50 cm away (a 3-4-5 triangle).
		scene.lights = [{ id: 'key', kind: 'flash', position: [-0.3, 0, 0.43], guideNumber: 40, power: 1 / 8 }];
		const model = modelFromScene(scene).model;
		const light = model.elements.key as FlashElement;
		const p = whatIfPatch(model, light, { powerThirds: 0, distanceSixths: 6 });
		expect(p.oldDistanceM).toBeCloseTo(0.5, 12);
		expect(p.patch.xM).toBeCloseTo(-0.6, 12);
		expect(p.patch.yM).toBeCloseTo(0, 12);
		expect(p.patch.heightM).toBeCloseTo(0.83, 12);
		const preview = previewWhatIf(model, 'key', { powerThirds: 0, distanceSixths: -6 })!;
		expect(preview.distanceM).toBeCloseTo(0.25, 12);
		expect(preview.contributionStops.after! - preview.contributionStops.before!).toBeCloseTo(2, 9);
	});

	it('a stop more flash power is the next whole step up the ladder; full power is the limit', () => {
		const model = quartzModel();
		const up = previewWhatIf(model, 'key', { powerThirds: 3, distanceSixths: 0 })!;
		expect(up.patch).toEqual({ power: 1 / 4 });
		expect(up.powerWords).toBe('power +1.0 stop');
		expect(up.contributionStops.after! - up.contributionStops.before!).toBeCloseTo(1, 9);
		// From 1/8, +3 stops reaches full power exactly; +3⅓ would need more than the flash has.
		const capped = previewWhatIf(model, 'key', { powerThirds: 9, distanceSixths: 0 })!;
		expect(capped.patch).toEqual({ power: 1 });
		expect(capped.powerStops).toBeCloseTo(3, 12);
		expect(capped.powerLimit).toBeNull();
		const full = whatIfPatch(model, { ...(model.elements.key as FlashElement), power: 1 }, { powerThirds: 3, distanceSixths: 0 });
		expect(full.powerStops).toBe(0);
		expect(full.patch).toEqual({});
		expect(full.powerLimit).toBe('the flash is at full power');
	});

	it('two stops more power and twice as far cancel out', () => {
		const p = previewWhatIf(quartzModel(), 'key', { powerThirds: 6, distanceSixths: 6 })!;
		expect(p.expectedChangeStops).toBeCloseTo(0, 12);
		expect(p.contributionStops.after!).toBeCloseTo(p.contributionStops.before!, 9);
	});

	it('a continuous light changes its output, lux at 1 m', () => {
		const scene = quartzScene();
		scene.subject = { position: [0, 0, 0.03], normal: [0, -1, 0] }; // the face turned to the lamp
		scene.lights = [{ id: 'lamp', kind: 'continuous', position: [0, -0.5, 0.03], luxAt1m: 2000 }];
		const model = modelFromScene(scene).model;
		const p = previewWhatIf(model, 'lamp', { powerThirds: -3, distanceSixths: 0 })!;
		expect(p.patch).toEqual({ luxAt1m: 1000 });
		expect(p.contributionStops.after! - p.contributionStops.before!).toBeCloseTo(-1, 9);
	});

	it('warns before it is kept when the trial brings a flash within half a metre of a living subject', () => {
		const scene = quartzScene();
		scene.subject = { ...scene.subject, living: true };
		scene.lights = [{ id: 'key', kind: 'flash', position: [-0.6, 0, 0.03], guideNumber: 40, power: 1 / 8 }];
		const model = modelFromScene(scene).model;
		// 60 cm: no caution (our threshold is 0.5 m, LIVING_SUBJECT_FLASH_DISTANCE_M). Half as far, 30 cm: one.
		expect(previewWhatIf(model, 'key', { powerThirds: 0, distanceSixths: 0 })!.newCautions).toEqual([]);
		const near = previewWhatIf(model, 'key', { powerThirds: 0, distanceSixths: -6 })!;
		expect(near.newCautions).toHaveLength(1);
		expect(near.newCautions[0]).toMatch(/from a living subject/);
		expect(previewWhatIf(model, 'key', { powerThirds: 0, distanceSixths: 6 })!.newCautions).toEqual([]);
	});

	it('changes nothing in the model, and answers null for an element that is not a light', () => {
		const model = quartzModel();
		const copy = structuredClone(model);
		previewWhatIf(model, 'key', { powerThirds: -3, distanceSixths: 4 });
		expect(model).toEqual(copy);
		const subjectId = Object.values(model.elements).find((e) => e.kind === 'subject')!.id;
		expect(previewWhatIf(model, subjectId, { powerThirds: 3, distanceSixths: 0 })).toBeNull();
	});

	it('kept, the trial is one undo step in the editor; undone, the light is back', () => {
		const e = new Editor({ document: openDocument({ scene: quartzScene(), plan: {} }) });
		const before = { ...e.model.elements.key };
		const steps = e.undoSteps;
		const p = previewWhatIf(e.model, 'key', { powerThirds: 3, distanceSixths: 6 })!;
		expect(e.execute(setElementProperties('key', p.patch)).ok).toBe(true);
		expect(e.undoSteps).toBe(steps + 1);
		expect(e.model.elements.key).toMatchObject({ xM: -1, power: 1 / 4 });
		e.undo();
		expect(e.model.elements.key).toEqual(before);
	});
});
