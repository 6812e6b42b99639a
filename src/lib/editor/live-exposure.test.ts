import { describe, expect, it } from 'vitest';
import { computeExposure } from '$lib/light/scene';
import { exposureSceneSchema } from '$lib/light/schema';
import { liveExposure } from './live-exposure';

const scene = exposureSceneSchema.parse({
	camera: { iso: 100, aperture: 16, shutter: 1 / 125, magnification: 0.5 },
	subject: { position: [0, 0, 0.02] },
	lights: [{ id: 'key', kind: 'flash', position: [-0.3, 0, 0.2], guideNumber: 24, power: 0.25 }]
});

describe('live exposure', () => {
	it('is the engine’s answer for a valid scene', () => {
		expect(liveExposure(scene)).toEqual({ ok: true, result: computeExposure(scene) });
	});

	it('names the field at fault, as the API would, instead of computing', () => {
		const atSubject = { ...scene, lights: [{ ...scene.lights[0], position: [0, 0, 0.02] as [number, number, number] }] };
		expect(liveExposure(atSubject)).toEqual({ ok: false, message: 'lights.0.position: is at the subject (closer than 1 mm)' });
	});
});
