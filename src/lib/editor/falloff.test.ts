import { describe, expect, it } from 'vitest';
import { computeExposure } from '$lib/light/scene';
import { exposureSceneSchema, type ExposureScene } from '$lib/light/schema';
import { falloffColour, falloffGrid, FALLOFF_PALETTE_LIGHT, prepareScene, totalXAt } from './falloff';

/** The moss sample on the sill: a fill flash in a dome, a lamp, a white card and a silver one, daylight, a flag. */
const moss: ExposureScene = exposureSceneSchema.parse({
	camera: { iso: 400, aperture: 11, shutter: 1 / 250, magnification: 1, pupilMagnification: 0.8, lossStops: 0.3 },
	subject: { position: [0, 0, 0.02], normal: [0, -0.3, 1] },
	ambient: { ev100: 10, kelvin: 6500 },
	lights: [
		{ id: 'fill', kind: 'flash', position: [-0.3, -0.2, 0.25], guideNumber: 28, power: 1 / 16, lossStops: 1.5, aim: [0, 0, 0.02], beamAngleDeg: 120 },
		{ id: 'lamp', kind: 'continuous', position: [0.2, -0.4, 0.3], luxAt1m: 4000, aim: [0.05, 0, 0], beamAngleDeg: 40, kelvin: 3200 },
		{ id: 'white', kind: 'reflector', position: [0.25, 0.05, 0.05], areaM2: 0.04, reflectance: 0.85, surface: 'diffuse', source: 'fill', normal: [-1, -0.2, 0.1] },
		{ id: 'silver', kind: 'reflector', position: [-0.1, 0.3, 0.1], areaM2: 0.02, reflectance: 0.9, surface: 'specular', source: 'ambient' },
		{ id: 'hot', kind: 'flash', position: [0.4, 0.4, 0.1], guideNumber: 20, power: 1 / 4 }
	],
	flags: [{ id: 'cutter', from: [0.3, 0.2], to: [0.3, 0.5] }]
});

describe('falloff map', () => {
	const prepared = prepareScene(moss);

	it('at the subject it is exactly the engine’s total exposure', () => {
		expect(totalXAt(prepared, [0, 0, 0.02])).toBeCloseTo(computeExposure(moss).total.x, 12);
	});

	it('anywhere else it is what the engine computes for a subject placed there', () => {
		for (const p of [
			[0.1, 0.1, 0.02],
			[-0.2, 0.05, 0.02],
			[0.35, 0.35, 0.02], // behind the flag from "hot"
			[0.05, -0.25, 0.02]
		] as const) {
			const moved = exposureSceneSchema.parse({ ...moss, subject: { ...moss.subject, position: p } });
			expect(totalXAt(prepared, p) / computeExposure(moved).total.x).toBeCloseTo(1, 12);
		}
	});

	it('twice as far from a single bare flash reads −2 stops (inverse-square law)', () => {
		// Inverse-square law, the API (POST /api/v1/exposure in /api/v1/openapi.json): X = (GN_eff / (d · N_w))².
		const one: ExposureScene = exposureSceneSchema.parse({
			camera: { iso: 100, aperture: 16, shutter: 1 / 125, magnification: 0 },
			subject: { position: [0, 0, 0] },
			lights: [{ id: 'f', kind: 'flash', position: [-0.5, 0, 0], guideNumber: 40, power: 1 }]
		});
		// Cells of 1 cm from x = 0 to 1: the cell centred at x = 0.505 is 1.005 m from the flash.
		const grid = falloffGrid(one, { minX: 0, minY: -0.005, maxX: 1, maxY: 0.005 }, 100);
		expect(grid.cols).toBe(100);
		expect(grid.rows).toBe(1);
		expect(grid.reference).toBe('subject');
		const at = (xM: number) => grid.stops[Math.round((xM - grid.x0M) / grid.cellM - 0.5)];
		expect(at(0.505)).toBeCloseTo(-2 * Math.log2(1.005 / 0.5), 5);
		expect(at(0.005)).toBeCloseTo(-2 * Math.log2(0.505 / 0.5), 5);
	});

	it('a flag casts a shadow: no light behind it from a lone flash', () => {
		const shaded: ExposureScene = exposureSceneSchema.parse({
			camera: { iso: 100, aperture: 16, shutter: 1 / 125, magnification: 0 },
			subject: { position: [0, 0, 0] },
			lights: [{ id: 'f', kind: 'flash', position: [-0.5, 0, 0], guideNumber: 40, power: 1 }],
			flags: [{ id: 'flag', from: [-0.25, 0.1], to: [-0.25, 0.3] }]
		});
		const p = prepareScene(shaded);
		expect(totalXAt(p, [0, 0.3, 0])).toBe(0);
		expect(totalXAt(p, [0, -0.3, 0])).toBeGreaterThan(0);
	});

	it('fits the bounds with no more than the cells asked for', () => {
		const g = falloffGrid(moss, { minX: -0.5, minY: -0.5, maxX: 0.6, maxY: 0.6 }, 2000);
		expect(g.cols * g.rows).toBeLessThanOrEqual(2000 * 1.05);
		expect(g.x0M).toBeLessThanOrEqual(-0.5);
		expect(g.x0M + g.cols * g.cellM).toBeGreaterThanOrEqual(0.6);
		expect(g.stops).toHaveLength(g.cols * g.rows);
	});

	it('measures from the brightest point when nothing reaches the subject', () => {
		const dark: ExposureScene = exposureSceneSchema.parse({
			camera: { iso: 100, aperture: 16, shutter: 1 / 125, magnification: 0 },
			subject: { position: [0, 0, 0] },
			lights: [{ id: 'f', kind: 'flash', position: [-0.5, 0, 0], guideNumber: 40, power: 1 }],
			flags: [{ id: 'flag', from: [-0.25, -0.1], to: [-0.25, 0.1] }]
		});
		const g = falloffGrid(dark, { minX: -0.4, minY: -0.4, maxX: 0.4, maxY: 0.4 }, 400);
		expect(g.reference).toBe('brightest');
		expect(Math.max(...g.stops)).toBeCloseTo(0, 9);
	});
});

describe('falloff colours', () => {
	it('warm above the subject, graphite below, deeper with every half stop, darkest with no light', () => {
		const [r0, g0, b0, a0] = falloffColour(0.2, FALLOFF_PALETTE_LIGHT);
		expect([r0, g0, b0]).toEqual([...FALLOFF_PALETTE_LIGHT.over]);
		const under1 = falloffColour(-1, FALLOFF_PALETTE_LIGHT)[3];
		const under3 = falloffColour(-3, FALLOFF_PALETTE_LIGHT)[3];
		expect(under3).toBeGreaterThan(under1);
		expect(falloffColour(-1.2, FALLOFF_PALETTE_LIGHT)[3]).toBe(falloffColour(-1.4, FALLOFF_PALETTE_LIGHT)[3]);
		expect(falloffColour(-Infinity, FALLOFF_PALETTE_LIGHT)[3]).toBeGreaterThan(falloffColour(-6, FALLOFF_PALETTE_LIGHT)[3]);
		expect(a0).toBeGreaterThan(0);
	});
});

describe('falloff colours on the dim-studio scheme', () => {
	it('glows stronger with more light and not at all where none arrives', async () => {
		const { FALLOFF_PALETTE_DARK } = await import('./falloff');
		const a = (s: number) => falloffColour(s, FALLOFF_PALETTE_DARK)[3];
		expect(a(1)).toBeGreaterThan(a(0));
		expect(a(0)).toBeGreaterThan(a(-2));
		expect(a(-Infinity)).toBe(0);
	});
});

describe('the map’s flag test', () => {
	it('agrees with the engine’s segmentsIntersect, touching included', async () => {
		const fc = await import('fast-check');
		const { segmentsIntersect } = await import('$lib/light/geometry');
		const { crossesAnyFlag } = await import('./falloff');
		// Coordinates on a coarse lattice so that touching and collinear cases come up often.
		const c = fc.integer({ min: -4, max: 4 }).map((n) => n / 4);
		const seg = fc.tuple(c, c, c, c);
		fc.assert(
			fc.property(seg, seg, ([ax, ay, bx, by], [cx, cy, dx, dy]) => {
				const engine = segmentsIntersect([ax, ay], [bx, by], [cx, cy], [dx, dy]);
				return crossesAnyFlag(new Float64Array([cx, cy, dx, dy]), ax, ay, bx, by) === engine;
			}),
			{ numRuns: 5000 }
		);
	});
});
