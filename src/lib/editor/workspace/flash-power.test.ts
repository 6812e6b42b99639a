import { describe, expect, it } from 'vitest';
import { computeExposure } from '$lib/light/scene';
import { exposureSceneSchema, type ExposureScene } from '$lib/light/schema';
import { flashPowersNeeded } from './flash-power';

/** One bare flash 2 m from the subject, face on, f/2.8 at ISO 100: far more light than needed. */
function scene(lowestPower?: number): ExposureScene {
	return exposureSceneSchema.parse({
		camera: { iso: 100, aperture: 2.8, shutter: 1 / 200, magnification: 0 },
		subject: { position: [0, 0, 0] },
		lights: [{ id: 'key', kind: 'flash', position: [0.2, 0, 0], guideNumber: 40, power: 1, ...(lowestPower ? { lowestPower } : {}) }]
	});
}

describe('the flash power shown for a correct exposure', () => {
	it('ends at the flash’s own lowest step, and says the flash cannot go that low', () => {
		// GN 40 at 0.2 m wants f/200 at full power (GN = distance × f-number): at f/2.8 it needs
		// (2.8 × 0.2 / 40)² ≈ 1/5100 of full power, below any ladder.
		const s = scene(1 / 128);
		const [p] = flashPowersNeeded(s, computeExposure(s), {});
		expect(p.power).toBeCloseTo((2.8 * 0.2 / 40) ** 2, 9);
		expect(p.stepLabel).toBe('1/128');
		expect(p.within).toBe(false);
		const [any] = flashPowersNeeded(scene(), computeExposure(scene()), {});
		expect(any.stepLabel).toBe('1/256');
	});
});
