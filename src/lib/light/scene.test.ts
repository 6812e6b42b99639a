import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computeExposure, THIRD_STOP_APERTURES } from './scene';
import { exposureSceneSchema, type ExposureSceneInput } from './schema';

const run = (input: ExposureSceneInput) => computeExposure(exposureSceneSchema.parse(input));

const camera = { iso: 100, aperture: 16, shutter: 1 / 125, magnification: 0 };
const subject = { position: [0, 0, 0] as [number, number, number] };
const flashAt = (id: string, x: number, gn = 32, extra = {}) => ({ id, kind: 'flash' as const, position: [x, 0, 0] as [number, number, number], guideNumber: gn, power: 1, ...extra });

describe('direct light', () => {
	it('GN 32 at 2 m and f/16 is a correct exposure (X = 1)', () => {
		// Source: guide number definition, GN = d × N (ISO 1230; from memory).
		const r = run({ camera, subject, lights: [flashAt('key', 2)] });
		expect(r.lights[0]).toMatchObject({ id: 'key', blocked: false });
		expect(r.lights[0].x).toBeCloseTo(1, 12);
		expect(r.total.exposureOffsetStops).toBeCloseTo(0, 12);
		expect(r.keyLightId).toBe('key');
		expect(r.lightingRatio).toBeNull();
	});

	it('at 1:1 the same flash is two stops under (bellows factor 4)', () => {
		// Source: bellows factor (1 + m)² (The Manual of Photography, close-up chapter; from memory).
		const r = run({ camera: { ...camera, magnification: 1 }, subject, lights: [flashAt('key', 2)] });
		expect(r.workingAperture).toBe(32);
		expect(r.total.exposureOffsetStops).toBeCloseTo(-2, 12);
	});

	it('heights count: a flash 1.2 m across and 1.6 m up is 2 m away', () => {
		const r = run({ camera, subject, lights: [{ ...flashAt('key', 1.2), position: [1.2, 0, 1.6] }] });
		expect(r.lights[0].distanceM).toBeCloseTo(2, 12);
		expect(r.lights[0].x).toBeCloseTo(1, 12);
	});

	it('a continuous light of 2000 lux at 1 m, moved to 50 cm, ISO 100, 1/8 s, f/16 → X = 1.5625', () => {
		// Source: incident calibration N²/t = E·S/C with C = 250 (ISO 2720; from memory) and the inverse-square
		// law: E = 2000 / 0.5² = 8000 lux, X = E·S·t / (C·N²) = 8000 × 100 × 0.125 / (250 × 256) = 1.5625.
		const r = run({ camera: { ...camera, shutter: 1 / 8 }, subject, lights: [{ id: 'lamp', kind: 'continuous', position: [0.5, 0, 0], luxAt1m: 2000 }] });
		const expected = (8000 * 100 * 0.125) / (250 * 256);
		expect(r.lights[0].x).toBeCloseTo(expected, 12);
		expect(r.lights[0].stops).toBeCloseTo(Math.log2(expected), 12);
	});

	it('ambient EV 12 at ISO 100, f/8, 1/60 s is close to correct', () => {
		// Source: APEX, EV = log2(N²/t): f/8 at 1/60 is EV 11.9 (ANSI PH2.5; from memory).
		const r = run({ camera: { ...camera, aperture: 8, shutter: 1 / 60 }, subject, ambient: { ev100: 12 }, lights: [] });
		expect(r.lights).toEqual([{ id: 'ambient', kind: 'ambient', x: expect.any(Number), stops: expect.any(Number), blocked: false, group: 'ambient' }]);
		expect(r.total.exposureOffsetStops).toBeCloseTo(12 - Math.log2(64 * 60), 12);
	});

	it('camera loss applies to every light and the total is their sum', () => {
		const r = run({ camera: { ...camera, lossStops: 1 }, subject, ambient: { ev100: 10 }, lights: [flashAt('a', 2), flashAt('b', -4)] });
		expect(r.lights[0].x).toBeCloseTo(0.5, 12);
		expect(r.lights[1].x).toBeCloseTo(0.125, 12);
		expect(r.total.x).toBeCloseTo(r.lights.reduce((s, l) => s + l.x, 0), 12);
		expect(r.lightingRatio).toBeCloseTo(4, 12);
	});

	it('a light aimed away with a 60° beam gives half at 30° off axis', () => {
		const aimed = run({ camera, subject, lights: [flashAt('k', 2, 32, { aim: [0, 2 * Math.tan(Math.PI / 6), 0], beamAngleDeg: 60 })] });
		expect(aimed.lights[0].x).toBeCloseTo(0.5, 9);
	});

	it('subject normal: Lambert’s cosine law on a flat subject tilted 60° to the light', () => {
		// Source: Lambert's cosine law (Hecht, Optics, §3.3; from memory).
		const r = run({ camera, subject: { ...subject, normal: [Math.cos(Math.PI / 3), Math.sin(Math.PI / 3), 0] }, lights: [flashAt('k', 2)] });
		expect(r.lights[0].x).toBeCloseTo(0.5, 12);
	});
});

describe('reflectors', () => {
	it('a diffuse card on axis returns ρ·X_card·r²/(r² + d²), the Lambertian-disc irradiance', () => {
		// Source: on-axis illuminance of a uniform Lambertian disc E = πL·r²/(r² + d²) with L = ρE_in/π
		// (McCluney, Introduction to Radiometry and Photometry, disk source configuration; from memory).
		const area = 0.2 * 0.3;
		const r2 = area / Math.PI;
		const res = run({
			camera,
			subject,
			lights: [
				flashAt('key', 1),
				{ id: 'card', kind: 'reflector', position: [-0.5, 0, 0], areaM2: area, reflectance: 0.9, surface: 'diffuse', source: 'key' }
			]
		});
		const xAtCard = (32 / (1.5 * 16)) ** 2;
		expect(res.lights[1].x).toBeCloseTo(0.9 * xAtCard * (r2 / (r2 + 0.25)), 12);
		expect(res.keyLightId).toBe('key');
		expect(res.lightingRatio).toBeCloseTo(res.lights[0].x / res.lights[1].x, 12);
	});

	it('a card at a distance equal to its radius returns half of ρ·E_in', () => {
		// Source: as above, r²/(r² + r²) = 1/2: a disc subtending 45° half-angle gives E = πL/2.
		const area = 0.1;
		const rad = Math.sqrt(area / Math.PI);
		const res = run({ camera, subject, lights: [flashAt('f', 1), { id: 'c', kind: 'reflector', position: [-rad, 0, 0], areaM2: area, reflectance: 1, surface: 'diffuse', source: 'f' }] });
		const xAtCard = (32 / ((1 + rad) * 16)) ** 2;
		expect(res.lights[1].x).toBeCloseTo(xAtCard / 2, 12);
	});

	it('a card turned 60° from the source and 60° from the subject returns a quarter', () => {
		// Source: Lambert's cosine law at both faces, cos 60° × cos 60° = 1/4 (Hecht, Optics, §3.3; from memory).
		const rad = (deg: number) => (deg * Math.PI) / 180;
		const card = { id: 'c', kind: 'reflector' as const, position: [1, 0, 0] as [number, number, number], areaM2: 0.05, reflectance: 0.8, surface: 'diffuse' as const, source: 'f' };
		const flash = { id: 'f', kind: 'flash' as const, position: [1 + Math.cos(rad(60)), Math.sin(rad(60)), 0] as [number, number, number], guideNumber: 32, power: 1 };
		const facingBoth = run({ camera, subject, lights: [flash, card] });
		const tilted = run({ camera, subject, lights: [flash, { ...card, normal: [Math.cos(rad(120)), Math.sin(rad(120)), 0] }] });
		expect(tilted.lights[1].x / facingBoth.lights[1].x).toBeCloseTo(0.25, 12);
		const away = run({ camera, subject, lights: [flash, { ...card, normal: [1, 0, 0] }] });
		expect(away.lights[1].x).toBe(0); // faces away from the subject: nothing
	});

	it('a specular reflector returns ρ × the source at the whole path d₁ + d₂', () => {
		// Source: a plane mirror forms a virtual source at the total path length (Hecht, Optics, §5.4 plane
		// mirrors; from memory); the inverse-square law then applies to d₁ + d₂.
		const res = run({ camera, subject, lights: [flashAt('f', 1, 32, { aim: [0, 0, 0] }), { id: 'm', kind: 'reflector', position: [0, 1, 0], areaM2: 0.1, reflectance: 0.85, surface: 'specular', source: 'f' }] });
		const d1 = Math.SQRT2;
		// The head is aimed at the subject (along −x) with the default 60° beam: the mirror at 45° off axis gets cos⁴·⁸²(45°).
		const beam = Math.cos(Math.PI / 4) ** (Math.log(0.5) / Math.log(Math.cos(Math.PI / 6)));
		expect(res.lights[1].x).toBeCloseTo(0.85 * beam * (32 / ((d1 + 1) * 16)) ** 2, 12);
		const bare = run({ camera, subject, lights: [flashAt('f', 1), { id: 'm', kind: 'reflector', position: [0, 1, 0], areaM2: 0.1, reflectance: 0.85, surface: 'specular', source: 'f' }] });
		expect(bare.lights[1].x).toBeCloseTo(0.85 * (32 / ((d1 + 1) * 16)) ** 2, 12);
	});

	it('a silver reflector with the ambient returns ρ × ambient X and raises the sunlight caution', () => {
		const res = run({ camera, subject, ambient: { ev100: 14 }, lights: [{ id: 'silver', kind: 'reflector', position: [0.5, 0, 0], areaM2: 0.3, reflectance: 0.8, surface: 'specular', source: 'ambient' }] });
		const amb = res.lights.find((l) => l.id === 'ambient')!;
		expect(res.lights[0].x).toBeCloseTo(0.8 * amb.x, 12);
		expect(res.cautionDetails.map((c) => c.code)).toContain('specular-reflector-ambient');
	});
});

describe('flags', () => {
	it('a flag across a light’s path blocks it and says so; a blocked key is warned about', () => {
		const res = run({ camera, subject, lights: [flashAt('key', 2), flashAt('fill', -4)], flags: [{ id: 'black', from: [1, -1], to: [1, 1] }] });
		expect(res.lights[0]).toMatchObject({ id: 'key', x: 0, stops: null, blocked: true, blockedBy: 'black' });
		expect(res.keyLightId).toBe('fill');
		expect(res.warnings.some((w) => w.includes('“key” is blocked'))).toBe(true);
	});

	it('a flag between a reflector and its source leaves the reflector unlit', () => {
		const res = run({
			camera,
			subject,
			lights: [flashAt('f', 1), { id: 'card', kind: 'reflector', position: [0, 1, 0], areaM2: 0.1, reflectance: 0.9, surface: 'diffuse', source: 'f' }],
			flags: [{ id: 'g', from: [0.4, 0.4], to: [0.7, 0.7] }]
		});
		expect(res.lights[0].blocked).toBe(false);
		expect(res.lights[1]).toMatchObject({ x: 0, blocked: false, sourceBlocked: true });
	});
});

describe('aperture table, warnings, cautions', () => {
	it('defaults run f/2.8 to f/32 on the nominal third-stop series with exact 2^(k/6) values', () => {
		// Source: the third-stop f-number series √2^(k/3) and its nominal markings (ISO 517 aperture markings;
		// from memory).
		const res = run({ camera, subject, lights: [flashAt('key', 2)] });
		expect(res.apertureTable.map((r) => r.label)).toEqual([
			'f/2.8', 'f/3.2', 'f/3.5', 'f/4', 'f/4.5', 'f/5', 'f/5.6', 'f/6.3', 'f/7.1', 'f/8', 'f/9', 'f/10', 'f/11',
			'f/13', 'f/14', 'f/16', 'f/18', 'f/20', 'f/22', 'f/25', 'f/29', 'f/32'
		]);
		const f11 = res.apertureTable.find((r) => r.label === 'f/11')!;
		expect(f11.aperture).toBeCloseTo(2 ** 3.5, 12);
		const f16 = res.apertureTable.find((r) => r.label === 'f/16')!;
		expect(f16.exposureOffsetStops).toBeCloseTo(0, 12);
		expect(f11.exposureOffsetStops).toBeCloseTo(1, 12);
		expect(f16.ambientOffsetStops).toBeNull();
		expect(f16.dofMm).toBeNull(); // no magnification: the close-up formula does not apply
	});

	it('custom range up to f/45 at 1:1 with dof and diffraction per row', () => {
		const res = run({ camera: { ...camera, magnification: 1, minAperture: 16, maxAperture: 45 }, subject, ambient: { ev100: 11 }, lights: [flashAt('key', 1)] });
		expect(res.apertureTable.map((r) => r.label)).toEqual(['f/16', 'f/18', 'f/20', 'f/22', 'f/25', 'f/29', 'f/32', 'f/36', 'f/40', 'f/45']);
		const row = res.apertureTable[0];
		expect(row.workingAperture).toBe(32);
		expect(row.dofMm).toBeCloseTo(1.92, 12);
		expect(row.airyDiskUm).toBeCloseTo(2.44 * 0.55 * 32, 12);
		expect(row.diffractionLimited).toBe(true);
		expect(row.flashOffsetStops).toBeCloseTo(0, 12);
		expect(row.exposureOffsetStops).toBeCloseTo(Math.log2(res.total.x), 12);
	});

	it('warns about shutter above sync, exposure beyond ±3 stops and diffraction', () => {
		const res = run({ camera: { ...camera, shutter: 1 / 1000, aperture: 32, magnification: 1 }, subject, lights: [flashAt('key', 4), flashAt('hss', -4, 32, { highSpeedSync: true })] });
		expect(res.warnings.join('\n')).toMatch(/faster than the sync speed.*“key” will light only part/);
		expect(res.warnings.join('\n')).toMatch(/high-speed sync on “hss” costs about 3\.3 stops/);
		expect(res.warnings.join('\n')).toMatch(/more than 3 stops under/);
		expect(res.warnings.join('\n')).toMatch(/Diffraction/);
	});

	it('no light at all: total null and a warning', () => {
		const res = run({ camera, subject, lights: [] });
		expect(res.total).toEqual({ x: 0, exposureOffsetStops: null });
		expect(res.keyLightId).toBeNull();
		expect(res.warnings).toContain('No light reaches the subject.');
	});

	it('hot lamp near a card, a gel on a hot lamp, a flash near a living subject, mains strobe, tripod', () => {
		const res = run({
			camera: { ...camera, centreColumn: 'reversed' },
			subject: { ...subject, living: true },
			lights: [
				{ id: 'lamp', kind: 'continuous', position: [1, 1, 0], luxAt1m: 1000, gelMired: 159 },
				{ id: 'card', kind: 'reflector', position: [1.2, 1, 0], areaM2: 0.1, reflectance: 0.9, surface: 'diffuse', source: 'lamp' },
				flashAt('close', 0.2, 20, { mainsPowered: true })
			]
		});
		expect(res.cautionDetails.map((c) => c.code).sort()).toEqual(
			// A reversed column hangs the camera between the legs: off-centre, not top-heavy (issue 15, item 11).
			['flash-near-living-subject', 'hot-light-gel', 'hot-light-near-material', 'mains-strobe', 'reversed-centre-column'].sort()
		);
		expect(res.cautions.every((c) => c.length > 40)).toBe(true);
	});

	it('an LED marked cool near a card raises no heat caution', () => {
		const res = run({ camera, subject, lights: [{ id: 'led', kind: 'continuous', position: [1, 1, 0], luxAt1m: 1000, runsHot: false }, { id: 'card', kind: 'reflector', position: [1.2, 1, 0], areaM2: 0.1, reflectance: 0.9, surface: 'diffuse', source: 'led' }] });
		expect(res.cautions).toEqual([]);
	});

	it('white balance of a flash and a window mix, with the mired warning', () => {
		const res = run({ camera, subject, ambient: { ev100: 13, kelvin: 6500 }, lights: [{ ...flashAt('f', 2), kelvin: 5500, gelMired: 159 }] });
		expect(res.whiteBalance?.spreadMired).toBeCloseTo(1e6 / 5500 + 159 - 1e6 / 6500, 6);
		expect(res.warnings.some((w) => w.includes('mired apart'))).toBe(true);
	});

	it('the third-stop series is exact: each step is 2^(1/6) in f-number', () => {
		for (let i = 1; i < THIRD_STOP_APERTURES.length; i++) {
			expect(THIRD_STOP_APERTURES[i].exact / THIRD_STOP_APERTURES[i - 1].exact).toBeCloseTo(2 ** (1 / 6), 12);
		}
		expect(THIRD_STOP_APERTURES.find((a) => a.nominal === 2.8)?.k).toBe(9);
		expect(THIRD_STOP_APERTURES.find((a) => a.nominal === 45)?.k).toBe(33);
	});
});

describe('scene laws (fast-check)', () => {
	const coord = fc.double({ min: -3, max: 3, noNaN: true });
	const pos = fc.tuple(coord, coord, fc.double({ min: 0.05, max: 3, noNaN: true }));
	const emitter = fc.oneof(
		fc.record({ kind: fc.constant('flash' as const), position: pos, guideNumber: fc.double({ min: 1, max: 60, noNaN: true }), power: fc.double({ min: 1 / 256, max: 1, noNaN: true }) }),
		fc.record({ kind: fc.constant('continuous' as const), position: pos, luxAt1m: fc.double({ min: 1, max: 100000, noNaN: true }) })
	);
	const cam = fc.record({
		iso: fc.double({ min: 50, max: 6400, noNaN: true }),
		aperture: fc.double({ min: 2, max: 45, noNaN: true }),
		shutter: fc.double({ min: 1 / 8000, max: 30, noNaN: true }),
		magnification: fc.double({ min: 0, max: 5, noNaN: true }),
		lossStops: fc.double({ min: 0, max: 5, noNaN: true })
	});
	const withIds = (ls: object[], prefix: string) => ls.map((l, i) => ({ ...l, id: `${prefix}${i}` })) as ExposureSceneInput['lights'];

	it('the scene total is the sum of its lights, and of the scenes of any split of its lights', () => {
		fc.assert(
			fc.property(cam, fc.array(emitter, { maxLength: 6 }), fc.array(emitter, { maxLength: 6 }), fc.option(fc.double({ min: -5, max: 16, noNaN: true }), { nil: undefined }), (c, a, b, ev) => {
				const ambient = ev === undefined ? undefined : { ev100: ev };
				const both = run({ camera: c, subject, ambient, lights: [...withIds(a, 'a'), ...withIds(b, 'b')] });
				const onlyA = run({ camera: c, subject, ambient, lights: withIds(a, 'a') });
				const onlyB = run({ camera: c, subject, lights: withIds(b, 'b') });
				const sum = both.lights.reduce((s, l) => s + l.x, 0);
				expect(both.total.x).toBeCloseTo(sum, 9);
				expect(both.total.x / (onlyA.total.x + onlyB.total.x || 1)).toBeCloseTo(both.total.x === 0 ? 0 : 1, 9);
			})
		);
	});

	it('doubling every light’s distance costs two stops on the total', () => {
		fc.assert(
			fc.property(cam, fc.array(emitter, { minLength: 1, maxLength: 6 }), (c, ls) => {
				const near = run({ camera: c, subject, lights: withIds(ls, 'l') });
				const far = run({ camera: c, subject, lights: withIds(ls.map((l) => ({ ...l, position: l.position.map((v) => 2 * v) as [number, number, number] })), 'l') });
				expect(Math.log2(far.total.x / near.total.x)).toBeCloseTo(-2, 9);
			})
		);
	});

	it('never NaN or Infinity for a valid scene', () => {
		fc.assert(
			fc.property(cam, fc.array(emitter, { maxLength: 6 }), (c, ls) => {
				const lights = withIds(ls, 'l');
				if (lights.length) lights.push({ id: 'card', kind: 'reflector', position: [0.1, 0.2, 0.3], areaM2: 0.05, reflectance: 0.9, surface: 'diffuse', source: 'l0' });
				const res = run({ camera: c, subject, ambient: { ev100: 10 }, lights, flags: [{ id: 'g', from: [-1, 1], to: [1, 1] }] });
				const json = JSON.stringify(res, (_k, v) => (typeof v === 'number' && !Number.isFinite(v) ? 'BAD' : v));
				expect(json).not.toContain('BAD');
			})
		);
	});
});
