import { describe, expect, it } from 'vitest';
import { computeExposure } from './scene';
import { exposureSceneSchema, type ExposureSceneInput } from './schema';
import { evaluateTarget, evaluateTargets, keyLightAngleDeg, neededFlashPowers, outsideBy, targetTally, type Target } from './targets';
import { targetsSchema } from '$lib/scene/targets';

const scene = (input: ExposureSceneInput) => exposureSceneSchema.parse(input);
const one = (target: Target, input: ExposureSceneInput) => {
	const s = scene(input);
	return evaluateTarget(target, s, computeExposure(s));
};

const camera = { iso: 100, aperture: 16, shutter: 1 / 125, magnification: 0 };
const subject = { position: [0, 0, 0] as [number, number, number] };
const flashAt = (id: string, x: number, extra = {}) => ({ id, kind: 'flash' as const, position: [x, 0, 0] as [number, number, number], guideNumber: 32, power: 1, ...extra });

describe('exposure offset at the marked aperture', () => {
	it('GN 32 at 2 m and f/16 is correct, so a ±⅓ stop target is met', () => {
		// Source: guide number definition, GN = distance × f-number at ISO 100 (ISO 1230; from memory).
		const r = one({ kind: 'exposureOffset', min: -1 / 3, max: 1 / 3 }, { camera, subject, lights: [flashAt('key', 2)] });
		expect(r.met).toBe(true);
		expect(r.value).toBeCloseTo(0, 9);
		expect(r.missedBy).toBe(0);
	});

	it('the same flash at 4 m is two stops under (inverse-square law), missing the range by 1⅔ stops', () => {
		// Source: inverse-square law, E ∝ 1/d²: twice the distance is a quarter of the light, −2 stops (Hecht, Optics; from memory).
		const r = one({ kind: 'exposureOffset', min: -1 / 3, max: 1 / 3 }, { camera, subject, lights: [flashAt('key', 4)] });
		expect(r.met).toBe(false);
		expect(r.value).toBeCloseTo(-2, 9);
		expect(r.missedBy).toBeCloseTo(5 / 3, 9);
		expect(r.text).toBe('−2 stops: not met, 1.67 stops below the range.');
	});

	it('no light at the subject cannot be evaluated, and says why', () => {
		const r = one({ kind: 'exposureOffset', min: -1, max: 1 }, { camera, subject, lights: [] });
		expect(r.met).toBeNull();
		expect(r.text).toMatch(/No light reaches/);
	});
});

describe('lighting ratio', () => {
	it('a flash at 2 m and an equal one at 4 m give 4:1; 2.5:1 to 4:1 is met, 2:1 to 3:1 is missed by 1', () => {
		// Source: lighting ratio = key illuminance / fill illuminance (common practice); inverse square gives 4:1.
		const input = { camera, subject, lights: [flashAt('key', 2), flashAt('fill', -4)] };
		expect(one({ kind: 'lightingRatio', min: 2.5, max: 4 }, input)).toMatchObject({ met: true, missedBy: 0 });
		const missed = one({ kind: 'lightingRatio', min: 2, max: 3 }, input);
		expect(missed.met).toBe(false);
		expect(missed.missedBy).toBeCloseTo(1, 9);
	});

	it('one light alone has no ratio: not evaluated', () => {
		expect(one({ kind: 'lightingRatio', min: 2 }, { camera, subject, lights: [flashAt('key', 2)] }).met).toBeNull();
	});
});

describe('marked aperture and number of lights', () => {
	it('f/16 meets f/11 to f/22 and misses f/5.6 to f/8 by 8', () => {
		const input = { camera, subject, lights: [flashAt('key', 2)] };
		expect(one({ kind: 'aperture', min: 11, max: 22 }, input).met).toBe(true);
		expect(one({ kind: 'aperture', min: 5.6, max: 8 }, input)).toMatchObject({ met: false, missedBy: 8 });
	});

	it('reflectors are not lights: a flash and a card is one light', () => {
		const input = {
			camera,
			subject,
			lights: [flashAt('key', 2), { id: 'card', kind: 'reflector' as const, position: [0, 0.3, 0] as [number, number, number], areaM2: 0.06, reflectance: 0.85, surface: 'diffuse' as const, source: 'key' }]
		};
		expect(one({ kind: 'lightCount', max: 1 }, input)).toMatchObject({ met: true, value: 1 });
		expect(one({ kind: 'lightCount', max: 1 }, { camera, subject, lights: [flashAt('a', 2), flashAt('b', -2)] })).toMatchObject({ met: false, missedBy: 1 });
	});
});

describe("depth of field against the subject's depth", () => {
	it('f/16 at 1:1 gives 2 × 32 × 0.03 / 1 = 1.92 mm: a 1.5 mm subject fits, a 3 mm one is 1.08 mm short', () => {
		// Source: close-up depth of field 2·N·c·(1 + m)/m² (Wikipedia, "Depth of field", close-up approximation),
		// N = 16, m = 1, c = 0.03 mm.
		const base = { camera: { ...camera, magnification: 1 }, lights: [flashAt('key', 1)] };
		const fits = one({ kind: 'depthOfField' }, { ...base, subject: { ...subject, depthMm: 1.5 } });
		expect(fits.value).toBeCloseTo(1.92, 9);
		expect(fits.met).toBe(true);
		const short = one({ kind: 'depthOfField' }, { ...base, subject: { ...subject, depthMm: 3 } });
		expect(short.met).toBe(false);
		expect(short.missedBy).toBeCloseTo(1.08, 9);
	});

	it("without the subject's depth it cannot be told", () => {
		expect(one({ kind: 'depthOfField' }, { camera: { ...camera, magnification: 1 }, subject, lights: [flashAt('key', 1)] }).met).toBeNull();
	});
});

describe("key light's angle from the camera axis", () => {
	it('a key 45° off the lens axis, measured at the subject', () => {
		// Source: plain geometry, the angle between two directions from their dot product (common practice).
		const s = scene({ camera: { ...camera, position: [0, -2, 0] }, subject, lights: [{ ...flashAt('key', 1), position: [1, -1, 0] }] });
		expect(keyLightAngleDeg(s, computeExposure(s))).toBeCloseTo(45, 9);
		expect(evaluateTarget({ kind: 'keyLightAngle', min: 60, max: 120 }, s, computeExposure(s))).toMatchObject({ met: false });
		expect(evaluateTarget({ kind: 'keyLightAngle', min: 60, max: 120 }, s, computeExposure(s)).missedBy).toBeCloseTo(15, 9);
	});

	it('without a camera on the plan the angle cannot be told', () => {
		expect(one({ kind: 'keyLightAngle', min: 0, max: 90 }, { camera, subject, lights: [flashAt('key', 2)] }).met).toBeNull();
	});
});

describe("flash power needed within the flash's range", () => {
	it('GN 32 at 1 m and f/16 needs a quarter power (GN scales with √power): within range', () => {
		// Source: guide number definition, GN = d × N, and GN ∝ √power (ISO 1230; from memory):
		// f/16 at 1 m needs GN 16, (16/32)² = 1/4 power.
		const s = scene({ camera, subject, lights: [flashAt('key', 1)] });
		const needed = neededFlashPowers(s, computeExposure(s))!;
		expect(needed[0].needed).toBeCloseTo(0.25, 9);
		expect(evaluateTarget({ kind: 'flashPower' }, s, computeExposure(s))).toMatchObject({ met: true, missedBy: 0 });
	});

	it('at 4 m f/16 needs 4× full power: two stops beyond full power, not met', () => {
		const r = one({ kind: 'flashPower' }, { camera, subject, lights: [flashAt('key', 4, { power: 0.5 })] });
		expect(r.met).toBe(false);
		expect(r.missedBy).toBeCloseTo(2, 9);
		expect(r.text).toMatch(/beyond full power/);
	});

	it('a flash whose lowest step is 1/64 cannot give the 1/256 needed at 25 cm: two stops below', () => {
		// Source: as above, (16 × 0.25 / 32)² = 1/64 at GN 32 … at 12.5 cm: (16 × 0.125 / 32)² = 1/256.
		const r = one({ kind: 'flashPower' }, { camera, subject, lights: [flashAt('key', 0.125, { lowestPower: 1 / 64 })] });
		expect(r.met).toBe(false);
		expect(r.missedBy).toBeCloseTo(2, 9);
	});
});

describe('ranges and tallies', () => {
	it('outsideBy is 0 inside, the distance to the nearer bound outside, open bounds never missed', () => {
		expect(outsideBy(3, 2, 4)).toBe(0);
		expect(outsideBy(1, 2, 4)).toBe(1);
		expect(outsideBy(5.5, 2, 4)).toBe(1.5);
		expect(outsideBy(1000, 2)).toBe(0);
	});

	it('targetTally counts the met ones of all', () => {
		const s = scene({ camera, subject, lights: [flashAt('key', 2)] });
		const results = evaluateTargets([{ kind: 'aperture', min: 16, max: 16 }, { kind: 'lightCount', max: 0 }, { kind: 'lightingRatio', min: 2 }], s);
		expect(targetTally(results)).toEqual({ met: 1, total: 3 });
	});
});

describe('the targets schema', () => {
	const issues = (input: unknown) => {
		const r = targetsSchema.safeParse(input);
		return r.success ? [] : r.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
	};

	it('an inverted range names its field', () => {
		expect(issues([{ kind: 'lightingRatio', min: 4, max: 2.5 }])).toEqual([expect.stringMatching(/^0\.max: the range is inverted/)]);
	});

	it('an empty range names its field', () => {
		expect(issues([{ kind: 'aperture' }])).toEqual([expect.stringMatching(/^0\.min: the range is empty/)]);
	});

	it('bounds outside what the engine gives, a fractional light count, a repeated kind and a range on a fixed target are refused', () => {
		expect(issues([{ kind: 'keyLightAngle', min: 0, max: 200 }])).toEqual(['0.max: must be from 0 to 180']);
		expect(issues([{ kind: 'lightCount', max: 1.5 }])).toEqual(['0.max: must be a whole number']);
		expect(issues([{ kind: 'aperture', min: 8 }, { kind: 'aperture', max: 22 }])).toEqual([expect.stringMatching(/^1\.kind: .* already a target/)]);
		expect(issues([{ kind: 'flashPower', max: 1 }])).toEqual([expect.stringMatching(/^0\.max: .* takes no range/)]);
	});

	it('good targets pass as they are', () => {
		expect(targetsSchema.parse([{ kind: 'lightingRatio', min: 2.5, max: 4 }, { kind: 'depthOfField' }])).toEqual([{ kind: 'lightingRatio', min: 2.5, max: 4 }, { kind: 'depthOfField' }]);
	});
});
