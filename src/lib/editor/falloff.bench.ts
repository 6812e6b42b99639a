/**
 * Falloff map speed (`npx vitest bench --run src/lib/editor`): one map of 4096 cells for a plan with
 * 2 lights and with 60, worked out afresh, and with 60 as the worker draws a drag (each light's share
 * kept, one light and the 20 cards it lights moved), side by side. Speed is measured here, never
 * asserted in a test.
 */
import { bench, describe } from 'vitest';
import { exposureSceneSchema, type ExposureScene } from '$lib/light/schema';
import { falloffGrid, FalloffShares } from './falloff';

function sceneWith(lights: number): ExposureScene {
	return exposureSceneSchema.parse({
		camera: { iso: 100, aperture: 16, shutter: 1 / 160, magnification: 0.5 },
		subject: { position: [0, 0, 0.03] },
		ambient: { ev100: 7 },
		lights: Array.from({ length: lights }, (_, i) =>
			i % 3 === 2
				? { id: `card${i}`, kind: 'reflector', position: [Math.cos(i) * 0.4, Math.sin(i) * 0.4, 0.1], areaM2: 0.04, reflectance: 0.8, surface: 'diffuse', source: 'light0', normal: [-Math.cos(i), -Math.sin(i), 0] }
				: { id: `light${i}`, kind: 'flash', position: [Math.cos(i) * 0.5, Math.sin(i) * 0.5, 0.25], guideNumber: 30, power: 0.125, beamAngleDeg: 60, aim: [0, 0, 0.03] }
		),
		flags: [{ id: 'flag', from: [-0.1, 0.2], to: [0.1, 0.25] }]
	});
}

const bounds = { minX: -0.7, minY: -0.7, maxX: 0.7, maxY: 0.7 };
const two = sceneWith(2);
const sixty = sceneWith(60);

describe('falloff map, 4096 cells', () => {
	bench('2 lights', () => void falloffGrid(two, bounds));
	bench('60 lights', () => void falloffGrid(sixty, bounds));
	// As the worker draws a drag: the shares kept, one light moved between maps.
	const shares = new FalloffShares();
	let step = 0;
	bench('60 lights, one moved (shares kept)', () => {
		step++;
		const lights = sixty.lights.map((l) => (l.id === 'light0' ? { ...l, position: [0.5 + (step % 10) * 0.01, 0, 0.25] as [number, number, number] } : l));
		void falloffGrid({ ...sixty, lights }, bounds, undefined, shares);
	});
});
