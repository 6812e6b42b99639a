import { describe, expect, it } from 'vitest';
import { computeExposure } from '$lib/light/scene';
import { exposureSceneSchema, type ExposureScene } from '$lib/light/schema';
import { lightField, totalXAt } from '$lib/light/light-field';
import { mossOnTheSill } from '$lib/light/test-scenes';
import { falloffColour, falloffGrid, FalloffShares, FALLOFF_PALETTE_LIGHT } from './falloff';

const moss = mossOnTheSill;

describe('falloff map', () => {
	it('at the subject’s cell it reads 0 stops, the engine’s own total exposure there', () => {
		// Bounds centred on the subject with an odd number of cells: the middle cell's centre is the subject.
		const grid = falloffGrid(moss, { minX: -0.45, minY: -0.45, maxX: 0.45, maxY: 0.45 }, 81);
		expect([grid.cols, grid.rows]).toEqual([9, 9]);
		expect(grid.reference).toBe('subject');
		expect(grid.stops[4 * 9 + 4]).toBe(0);
		const x = totalXAt(lightField(moss), [0, 0, 0.02], moss.subject.normal);
		expect(x).toBe(computeExposure(moss).total.x);
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
		const field = lightField(shaded);
		expect(totalXAt(field, [0, 0.3, 0])).toBe(0);
		expect(totalXAt(field, [0, -0.3, 0])).toBeGreaterThan(0);
		const grid = falloffGrid(shaded, { minX: -0.1, minY: 0.25, maxX: 0.1, maxY: 0.35 }, 16);
		expect(Math.max(...grid.stops)).toBe(-Infinity);
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

describe('falloff map from kept shares', () => {
	const base: ExposureScene = exposureSceneSchema.parse({
		camera: { iso: 100, aperture: 16, shutter: 1 / 125, magnification: 0.5 },
		subject: { position: [0, 0, 0.03] },
		ambient: { ev100: 6 },
		lights: [
			{ id: 'key', kind: 'flash', position: [-0.4, 0.1, 0.3], guideNumber: 40, power: 0.25, beamAngleDeg: 60, aim: [0, 0, 0.03] },
			{ id: 'lamp', kind: 'continuous', position: [0.3, 0.4, 0.4], luxAt1m: 900 },
			{ id: 'card', kind: 'reflector', position: [0.3, -0.2, 0.05], areaM2: 0.04, reflectance: 0.8, surface: 'diffuse', source: 'key' },
			{ id: 'sill', kind: 'reflector', position: [-0.3, -0.3, 0.05], areaM2: 0.04, reflectance: 0.8, surface: 'diffuse', source: 'ambient' }
		],
		flags: [{ id: 'flag', from: [-0.2, 0.3], to: [0.1, 0.35] }]
	});
	const bounds = { minX: -0.6, minY: -0.5, maxX: 0.6, maxY: 0.6 };
	const moved = (scene: ExposureScene, id: string, position: [number, number, number]): ExposureScene => ({
		...scene,
		lights: scene.lights.map((l) => (l.id === id ? { ...l, position } : l))
	});

	it('equals the map worked out afresh after each kind of change', () => {
		const shares = new FalloffShares();
		const steps: ExposureScene[] = [base];
		// The key (the card it lights follows), the lamp, the card, a flag, the subject, the camera, the ambient, a light removed.
		steps.push(moved(steps.at(-1)!, 'key', [-0.35, 0.05, 0.3]));
		steps.push(moved(steps.at(-1)!, 'lamp', [0.25, 0.45, 0.4]));
		steps.push(moved(steps.at(-1)!, 'card', [0.35, -0.15, 0.05]));
		steps.push({ ...steps.at(-1)!, flags: [{ id: 'flag', from: [-0.3, 0.2], to: [0.1, 0.35] }] });
		steps.push({ ...steps.at(-1)!, subject: { position: [0.05, 0, 0.03] } });
		// (A new shutter time changes the lamp's and the ambient's share but not the flash's: an aperture
		// or ISO change would scale every share alike and leave the map, in stops from the subject, as it was.)
		steps.push({ ...steps.at(-1)!, camera: { ...steps.at(-1)!.camera, shutter: 1 / 30 } });
		steps.push({ ...steps.at(-1)!, ambient: { ev100: 8 } });
		steps.push({ ...steps.at(-1)!, lights: steps.at(-1)!.lights.filter((l) => l.id !== 'lamp') });
		for (const scene of steps) {
			const kept = falloffGrid(scene, bounds, 400, shares);
			const afresh = falloffGrid(scene, bounds, 400);
			expect([...kept.stops]).toEqual([...afresh.stops]);
			expect(kept.reference).toBe(afresh.reference);
		}
		// Every step changed the map (so each comparison above saw new shares, not only the first map).
		const maps = steps.map((s) => [...falloffGrid(s, bounds, 400).stops].join());
		expect(new Set(maps).size).toBe(steps.length);
	});

	it('equals the map worked out afresh when the bounds change under the same scene', () => {
		const shares = new FalloffShares();
		falloffGrid(base, bounds, 400, shares);
		const wider = { ...bounds, maxX: 0.9 };
		expect([...falloffGrid(base, wider, 400, shares).stops]).toEqual([...falloffGrid(base, wider, 400).stops]);
	});
});

describe('falloff colours', () => {
	it('warm above the subject, graphite below, smoothly deeper with less light, darkest with no light', () => {
		const [r0, g0, b0, a0] = falloffColour(0.2, FALLOFF_PALETTE_LIGHT);
		expect([r0, g0, b0]).toEqual([...FALLOFF_PALETTE_LIGHT.over]);
		const under1 = falloffColour(-1, FALLOFF_PALETTE_LIGHT)[3];
		const under3 = falloffColour(-3, FALLOFF_PALETTE_LIGHT)[3];
		expect(under3).toBeGreaterThan(under1);
		// Smooth: no bands, a tenth of a stop changes the shade a little.
		expect(falloffColour(-1.4, FALLOFF_PALETTE_LIGHT)[3]).toBeGreaterThan(falloffColour(-1.2, FALLOFF_PALETTE_LIGHT)[3]);
		expect(falloffColour(-1.3, FALLOFF_PALETTE_LIGHT)[3] - falloffColour(-1.2, FALLOFF_PALETTE_LIGHT)[3]).toBeLessThanOrEqual(3);
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
