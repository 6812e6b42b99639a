import { describe, expect, it } from 'vitest';
import { crossingFlag, lightField, MIN_EMITTER_DISTANCE_M, totalXAt } from './light-field';
import { computeExposure } from './scene';
import { exposureSceneSchema } from './schema';
import { mossOnTheSill } from './test-scenes';

const scene = mossOnTheSill;

describe('the light field', () => {
	const field = lightField(scene);
	const normal = scene.subject.normal;

	it('at the subject it is the exposure route’s answer, light by light', () => {
		const answer = computeExposure(scene);
		field.lights.forEach((l, i) => expect(l.xAt([0, 0, 0.02], normal)).toBe(answer.lights[i].x));
		expect(totalXAt(field, [0, 0, 0.02], normal)).toBe(answer.total.x);
	});

	it('anywhere else it is what the engine computes for a subject placed there, flags included', () => {
		for (const p of [
			[0.1, 0.1, 0.02],
			[-0.2, 0.05, 0.02],
			[0.35, 0.35, 0.02], // behind the flag from "hot"
			[0.05, -0.25, 0.02]
		] as const) {
			// Every beam here has an aim (or no beam), so moving the subject leaves the lights as they are.
			const moved = exposureSceneSchema.parse({ ...scene, subject: { ...scene.subject, position: p } });
			expect(totalXAt(field, p, normal) / computeExposure(moved).total.x).toBeCloseTo(1, 12);
		}
		expect(crossingFlag([0.4, 0.4, 0.1], [0.35, 0.35, 0.02], scene.flags!)).toBeUndefined();
		expect(crossingFlag([0.4, 0.4, 0.1], [0.2, 0.35, 0.02], scene.flags!)).toBe('cutter');
	});

	it('a point on top of a lamp counts as 1 mm away, not infinitely bright', () => {
		const lone = lightField(exposureSceneSchema.parse({
			camera: { iso: 100, aperture: 16, shutter: 1 / 125, magnification: 0 },
			subject: { position: [0, 0, 0] },
			lights: [{ id: 'f', kind: 'flash', position: [-0.5, 0, 0], guideNumber: 40, power: 1 }]
		}));
		const atLamp = lone.lights[0].xAt([-0.5, 0, 0]);
		expect(Number.isFinite(atLamp)).toBe(true);
		// Inverse-square law (API.md): X = (GN / (d · N))², at d = 1 mm.
		expect(atLamp).toBeCloseTo((40 / (MIN_EMITTER_DISTANCE_M * 16)) ** 2, 6);
	});
});
