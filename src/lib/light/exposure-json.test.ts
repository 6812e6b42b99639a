import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { exposureAnswerJson, writeTableStops } from './exposure-json';
import { apertureColumns, buildApertureColumns, computeExposure, lensSettings, shifted } from './scene';
import { exposureSceneSchema, type ExposureScene } from './schema';

/** A scene that touches every part of the answer: both groups, all reflector kinds, a flag, warnings and cautions. */
const scene = {
	camera: { iso: 200, aperture: 16, shutter: 1 / 250, magnification: 0.5, lossStops: 0.3, syncSpeed: 1 / 200, centreColumn: 'extended' },
	subject: { position: [0, 0, 0.05], living: true },
	ambient: { ev100: 11, kelvin: 6500 },
	lights: [
		{ id: 'softbox', kind: 'flash', position: [-0.3, 0.1, 0.25], guideNumber: 24, power: 0.25, lossStops: 1, kelvin: 5500, highSpeedSync: true },
		{ id: 'rim', kind: 'flash', position: [0.2, 0.35, 0.3], guideNumber: 20, power: 0.125, aim: [0, 0, 0.05], beamAngleDeg: 60 },
		{ id: 'lamp', kind: 'continuous', position: [0.3, -0.1, 0.2], luxAt1m: 3000, kelvin: 3200, gelMired: -30 },
		{ id: 'white-card', kind: 'reflector', position: [0.25, -0.05, 0.1], areaM2: 0.06, reflectance: 0.85, surface: 'diffuse', source: 'softbox', normal: [-1, 0, 0] },
		{ id: 'silver', kind: 'reflector', position: [0, -0.3, 0.1], areaM2: 0.04, reflectance: 0.8, surface: 'specular', source: 'ambient' },
		{ id: 'sill', kind: 'reflector', position: [-0.2, -0.25, 0.2], areaM2: 0.1, reflectance: 0.7, surface: 'diffuse', source: 'lamp' }
	],
	flags: [
		{ id: 'black', from: [0.4, 0.3], to: [0.45, -0.5] },
		{ id: 'cutter', from: [0.15, -0.2], to: [0.15, 0] }
	]
};

const parsedScene = (raw: unknown) => exposureSceneSchema.parse(raw) as ExposureScene;
/** The answer as the general path writes it, read back. */
const generalAnswer = (s: ExposureScene) => JSON.parse(JSON.stringify(computeExposure(s)));
const writtenAnswer = (s: ExposureScene) => {
	const out = exposureAnswerJson(s);
	if (!out.ok) throw new Error(`not finite: ${out.nonFinite.join('.')}`);
	return JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(out.bytes));
};
const tableStopsText = (stops: number | null) => {
	const out = new Uint8Array(32);
	return new TextDecoder().decode(out.subarray(0, writeTableStops(out, 0, stops)));
};

describe('exposureAnswerJson (the exposure route writes its answer itself)', () => {
	it('writes the same answer as JSON.stringify of computeExposure, warnings, cautions and µ included', () => {
		const s = parsedScene(scene);
		const answer = writtenAnswer(s);
		expect(answer).toEqual(generalAnswer(s));
		expect(answer.apertureTable).toHaveLength(22);
		expect(answer.warnings.some((w: string) => w.includes('µm'))).toBe(true);
		expect(answer.cautions.length).toBeGreaterThan(0);
		expect(answer.lights.find((l: { id: string }) => l.id === 'lamp').blockedBy).toBe('cutter');
		expect(answer.lights.find((l: { id: string }) => l.id === 'sill').sourceBlocked).toBe(true);
	});

	it('gives each answer its own bytes (the scratch buffer is never handed out)', () => {
		const first = exposureAnswerJson(parsedScene(scene));
		const raw = structuredClone(scene);
		raw.lights[0].power = 1;
		const second = exposureAnswerJson(parsedScene(raw));
		if (!first.ok || !second.ok) throw new Error('not finite');
		expect(first.bytes.buffer).not.toBe(second.bytes.buffer);
		expect(JSON.parse(new TextDecoder().decode(first.bytes))).toEqual(generalAnswer(parsedScene(scene)));
	});

	it('writes an empty table when no marked aperture falls in the range', () => {
		const raw = structuredClone(scene);
		Object.assign(raw.camera, { minAperture: 3.0, maxAperture: 3.1 });
		const s = parsedScene(raw);
		expect(writtenAnswer(s).apertureTable).toEqual([]);
		expect(writtenAnswer(s)).toEqual(generalAnswer(s));
	});

	it('writes any light name as UTF-8 (accents, other scripts, emoji)', () => {
		const raw = structuredClone(scene);
		raw.lights[0].id = 'Lumière 主光 💡'.repeat(6);
		raw.lights[3].source = raw.lights[0].id;
		const s = parsedScene(raw);
		expect(writtenAnswer(s)).toEqual(generalAnswer(s));
	});

	it('agrees with the general path for 500 scenes with lights moved, powers changed and cameras reset', () => {
		const num = (min: number, max: number) => fc.double({ min, max, noNaN: true });
		fc.assert(
			fc.property(
				fc.array(fc.tuple(num(-0.5, 0.5), num(-0.5, 0.5), num(0.02, 0.6)), { minLength: 6, maxLength: 6 }),
				fc.record({
					aperture: fc.constantFrom(2.8, 5.6, 11, 16, 22, 8.3),
					magnification: fc.constantFrom(0, 0.25, 1, 2.5),
					pupilMagnification: fc.option(num(0.3, 3), { nil: undefined }),
					minAperture: fc.option(fc.constantFrom(1, 4, 16), { nil: undefined }),
					maxAperture: fc.option(fc.constantFrom(22, 45, 64), { nil: undefined })
				}),
				fc.option(num(-5, 16), { nil: undefined }),
				num(1 / 256, 1),
				(positions, lens, ev100, power) => {
					const raw = structuredClone(scene) as Record<string, any>;
					raw.lights.forEach((l: { position: number[] }, i: number) => (l.position = positions[i]));
					raw.lights[0].power = power;
					for (const [k, v] of Object.entries(lens)) if (v === undefined) delete lens[k as keyof typeof lens];
					Object.assign(raw.camera, lens);
					if (ev100 === undefined) {
						delete raw.ambient;
						raw.lights[4].source = 'rim';
					} else raw.ambient.ev100 = ev100;
					const checked = exposureSceneSchema.safeParse(raw);
					fc.pre(checked.success);
					const s = checked.data as ExposureScene;
					expect(writtenAnswer(s)).toEqual(generalAnswer(s));
				}
			),
			{ numRuns: 500 }
		);
	});

	it('gives the table stops to a millionth of a stop, equal to the stops at the camera moved by 2·log2(N_w / N_w,row)', () => {
		// Source: the API, /api/v1/openapi.json (every light scales with 1/N_w²); the rounding is ours (TABLE_STOPS_DECIMALS).
		const s = parsedScene(scene);
		const answer = writtenAnswer(s);
		const wa = answer.workingAperture;
		for (const row of answer.apertureTable) {
			const exact = answer.total.exposureOffsetStops + 2 * Math.log2(wa / row.workingAperture);
			expect(Math.abs(row.exposureOffsetStops - exact)).toBeLessThanOrEqual(5e-7 + 1e-12);
			expect(String(row.exposureOffsetStops).split('.')[1]?.length ?? 0).toBeLessThanOrEqual(6);
		}
	});

	it('writes table stops that read back as exactly the rounded stops of the general path', () => {
		fc.assert(
			fc.property(fc.oneof(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.double({ min: -1e-5, max: 1e-5, noNaN: true })), (stops) => {
				const text = tableStopsText(stops);
				expect(text).toMatch(/^-?\d+\.\d{6}$/);
				expect(JSON.parse(text) === shifted(stops, 0)).toBe(true); // === : the general path writes −0 as 0
			}),
			{ numRuns: 5000 }
		);
		expect(tableStopsText(-0.26549)).toBe('-0.265490');
		expect(tableStopsText(-1e-7)).toBe('0.000000');
		expect(tableStopsText(12.5)).toBe('12.500000');
		expect(tableStopsText(null)).toBe('null');
		expect(JSON.parse(tableStopsText(1e300))).toBe(1e300);
	});

	it('names a number that is not finite instead of writing null', () => {
		// An ISO far outside any camera overflows a flash's exposure; the route must refuse, not send null.
		const s = parsedScene(scene);
		const huge = { ...s, camera: { ...s.camera, iso: 1e300 }, lights: [{ ...s.lights[0], guideNumber: 1e200 }] } as ExposureScene;
		const out = exposureAnswerJson(huge);
		expect(out.ok).toBe(false);
		if (!out.ok) expect(out.nonFinite.length).toBeGreaterThan(0);
	});
});

describe('apertureColumns (the camera-only columns, memoised per lens setting)', () => {
	it('always equals the columns built afresh, over a run of cameras that hits and evicts the memo', () => {
		const lens = fc.record({
			iso: fc.constant(100),
			shutter: fc.constant(1 / 125),
			aperture: fc.constantFrom(2.8, 4, 8, 11, 16, 22, 32, 9.5),
			magnification: fc.constantFrom(0, 0.5, 1, 3),
			pupilMagnification: fc.constantFrom(undefined, 0.5, 1, 2),
			minAperture: fc.constantFrom(undefined, 2, 5.6),
			maxAperture: fc.constantFrom(undefined, 32, 64)
		});
		fc.assert(
			fc.property(fc.array(lens, { minLength: 1, maxLength: 40 }), (cams) => {
				for (const cam of cams) {
					const lens = lensSettings(cam as ExposureScene['camera']);
					expect(apertureColumns(lens)).toEqual(buildApertureColumns(lens));
				}
			}),
			{ numRuns: 200 }
		);
	});
});
