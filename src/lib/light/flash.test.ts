import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	combinedGuideNumber,
	effectiveGuideNumber,
	flashCalc,
	flashExposure,
	flashExposureOffsetStops,
	highSpeedSyncFactor,
	highSpeedSyncGuideNumber,
	nearestPowerStep,
	powerLadder,
	powerStepLabel,
	powerWithinRange,
	requiredPower,
	workingApertureForCorrect
} from './flash';

const defaults = { iso: 100, power: 1, lossStops: 0, magnification: 0, pupilMagnification: 1 };

describe('guide number: published definition and scaling', () => {
	it('GN = distance × f-number: GN 32 m at f/8 reaches 4 m', () => {
		// Source: guide number definition, ISO 1230 (photographic flash guide numbers), from memory:
		// GN = subject distance × f-number at ISO 100 for a correct exposure.
		expect(workingApertureForCorrect(32, 4)).toBe(8);
	});

	it('GN 32 m gives f/16 at 2 m', () => {
		// Source: guide number definition (as above), worked example N = GN / d.
		expect(workingApertureForCorrect(effectiveGuideNumber({ guideNumber: 32 }), 2)).toBe(16);
	});

	it('quadrupling the ISO doubles the guide number (ISO 100 → 400: GN 20 → 40)', () => {
		// Source: guide number definition; GN scales with √(ISO ratio) because exposure ∝ GN² (from memory,
		// as printed in flash manuals' ISO tables).
		expect(effectiveGuideNumber({ guideNumber: 20, iso: 400 })).toBeCloseTo(40, 12);
	});

	it('ISO 50 divides the guide number by √2', () => {
		// Source: √(ISO/100) scaling, as above.
		expect(effectiveGuideNumber({ guideNumber: 28, iso: 50 })).toBeCloseTo(28 / Math.SQRT2, 12);
	});

	it('half power divides the guide number by √2, quarter power by 2', () => {
		// Source: guide number scales with √(power) since the light energy is proportional to power (from memory,
		// flash manuals' power/GN tables: 1/4 power halves the GN).
		expect(effectiveGuideNumber({ guideNumber: 40, power: 0.5 })).toBeCloseTo(40 / Math.SQRT2, 12);
		expect(effectiveGuideNumber({ guideNumber: 40, power: 0.25 })).toBeCloseTo(20, 12);
	});

	it('a one-stop loss (a diffuser eating half the light) divides GN by √2; two stops halve it', () => {
		// Source: one stop = a factor 2 in exposure ∝ GN² (APEX, ANSI PH2.5; from memory).
		expect(effectiveGuideNumber({ guideNumber: 40, lossStops: 1 })).toBeCloseTo(40 / Math.SQRT2, 12);
		expect(effectiveGuideNumber({ guideNumber: 40, lossStops: 2 })).toBeCloseTo(20, 12);
	});

	it('two equal flashes from the same distance give √2 × the guide number: one stop more', () => {
		// Source: exposures add, GN² ∝ light (from memory: "two identical flashes = one stop", flash-photography
		// handbooks).
		expect(combinedGuideNumber([20, 20])).toBeCloseTo(20 * Math.SQRT2, 12);
		expect(2 * Math.log2(combinedGuideNumber([20, 20]) / 20)).toBeCloseTo(1, 12);
	});

	it('four equal flashes double the guide number', () => {
		// Source: as above; 4× the light is two stops, √4 = 2.
		expect(combinedGuideNumber([11, 11, 11, 11])).toBeCloseTo(22, 12);
	});

	it('a GN 36 ft flash at 9 ft wants f/4 (feet in, feet out)', () => {
		// Source: guide number definition in feet (flash manuals quote both), 36 / 9 = 4.
		expect(workingApertureForCorrect(36, 9)).toBe(4);
	});
});

describe('flash exposure and required power (API.md formulas)', () => {
	it('a whole stop under at f/16 when f/11.3 is correct', () => {
		// Source: the API (/api/v1/openapi.json): exposureOffsetStops = 2·log2(N_correct / N_w); one stop per √2 of f-number
		// (APEX Av = 2·log2 N, ANSI PH2.5).
		expect(flashExposureOffsetStops(16 / Math.SQRT2, 16)).toBeCloseTo(-1, 12);
	});

	it('at 1:1 the flash needs four times the power (bellows factor 4, two stops)', () => {
		// Source: bellows factor (1 + m)² at m = 1 = 4 (The Manual of Photography, close-up chapter; from memory).
		const at0 = requiredPower({ guideNumber: 32 }, 0.5, 16);
		const at1 = requiredPower({ guideNumber: 32 }, 0.5, 32);
		expect(at1 / at0).toBeCloseTo(4, 12);
	});

	it('flash route: GN 32 at 1 m, f/16 at 1:1 needs full power × 1 (f/32 working = GN/d)', () => {
		const r = flashCalc({ ...defaults, guideNumber: 32, distance: 1, magnification: 1, aperture: 16 });
		expect(r.workingAperture).toBe(32);
		expect(r.workingApertureForCorrect).toBe(32);
		expect(r.markedApertureForCorrect).toBe(16);
		expect(r.exposureOffsetStops).toBeCloseTo(0, 12);
		expect(r.requiredPower).toBeCloseTo(1, 12);
		expect(r.withinRange).toBe(true);
		expect(r.nearestPowerStep).toEqual({ fraction: 1, label: '1/1', residualStops: expect.closeTo(0, 9) });
	});

	it('flash route: more than full power needed gives full power and the shortfall', () => {
		const r = flashCalc({ ...defaults, guideNumber: 16, distance: 1, aperture: 32 });
		expect(r.requiredPower).toBeCloseTo(4, 12);
		expect(r.withinRange).toBe(false);
		expect(r.nearestPowerStep?.label).toBe('1/1');
		expect(r.nearestPowerStep?.residualStops).toBeCloseTo(-2, 12);
	});

	it('flash route: less than the lowest step gives 1/256 and the surplus', () => {
		const r = flashCalc({ ...defaults, guideNumber: 64, distance: 1, aperture: 2 });
		expect(r.requiredPower).toBeCloseTo(1 / 1024, 12);
		expect(r.withinRange).toBe(false);
		expect(r.nearestPowerStep?.label).toBe('1/256');
		expect(r.nearestPowerStep?.residualStops).toBeCloseTo(2, 12);
	});

	it('flash route: without an aperture only the correct apertures are answered', () => {
		const r = flashCalc({ ...defaults, guideNumber: 24, distance: 0.3, magnification: 0.5 });
		expect(r.effectiveGuideNumber).toBe(24);
		expect(r.workingApertureForCorrect).toBeCloseTo(80, 12);
		expect(r.markedApertureForCorrect).toBeCloseTo(80 / 1.5, 12);
		expect(r.requiredPower).toBeUndefined();
		expect(r.nearestPowerStep).toBeUndefined();
	});

	it('flash route: a living subject at 20 cm raises the short-range caution', () => {
		const r = flashCalc({ ...defaults, guideNumber: 24, distance: 0.2, living: true });
		expect(r.cautions).toHaveLength(1);
		expect(r.cautions[0]).toMatch(/eyes of people and animals/);
		expect(flashCalc({ ...defaults, guideNumber: 24, distance: 0.2 }).cautions).toEqual([]);
	});
});

describe('the power ladder', () => {
	it('has 25 steps from full power to 1/256 in thirds', () => {
		expect(powerLadder).toHaveLength(25);
		expect(powerLadder[0].fraction).toBe(1);
		expect(powerLadder[24].fraction).toBeCloseTo(1 / 256, 15);
	});

	it('labels whole stops 1/1 … 1/256 and thirds as +0.3 / +0.7 above the whole stop', () => {
		expect(powerLadder.filter((s) => s.k % 3 === 0).map((s) => s.label)).toEqual([
			'1/1', '1/2', '1/4', '1/8', '1/16', '1/32', '1/64', '1/128', '1/256'
		]);
		expect(powerStepLabel(8)).toBe('1/8 +0.3'); // 1/8 × 2^(1/3)
		expect(powerStepLabel(7)).toBe('1/8 +0.7'); // 1/8 × 2^(2/3)
		expect(powerStepLabel(1)).toBe('1/2 +0.7');
		expect(powerStepLabel(23)).toBe('1/256 +0.3');
	});

	it('“1/8 +0.3” is one third of a stop above 1/8', () => {
		expect(powerLadder[8].fraction).toBeCloseTo((1 / 8) * 2 ** (1 / 3), 15);
		expect(powerLadder[7].fraction).toBeCloseTo((1 / 8) * 2 ** (2 / 3), 15);
	});

	it('picks the nearest step in stops and says what is left', () => {
		const s = nearestPowerStep(0.3); // between 1/4 +0.3 (0.315) and 1/4 (0.25)
		expect(s.label).toBe('1/4 +0.3');
		expect(s.residualStops).toBeCloseTo(Math.log2(0.25 * 2 ** (1 / 3) / 0.3), 12);
	});

	it('range: full power and 1/256 are inside, beyond them is not', () => {
		expect(powerWithinRange(1)).toBe(true);
		expect(powerWithinRange(1 / 256)).toBe(true);
		expect(powerWithinRange(1.01)).toBe(false);
		expect(powerWithinRange(1 / 300)).toBe(false);
	});

	it('property: each ladder step is 2^(−1/3) of the one above', () => {
		fc.assert(
			fc.property(fc.integer({ min: 1, max: 24 }), (k) => {
				expect(powerLadder[k].fraction / powerLadder[k - 1].fraction).toBeCloseTo(2 ** (-1 / 3), 12);
			})
		);
	});

	it('property: the nearest step is never more than a sixth of a stop off inside the range', () => {
		fc.assert(
			fc.property(fc.double({ min: 1 / 256, max: 1, noNaN: true }), (p) => {
				expect(Math.abs(nearestPowerStep(p).residualStops)).toBeLessThanOrEqual(1 / 6 + 1e-9);
			})
		);
	});
});

describe('high-speed sync (our model)', () => {
	it('costs nothing at or below the sync speed', () => {
		expect(highSpeedSyncFactor(1 / 200, 1 / 200)).toBe(1);
		expect(highSpeedSyncFactor(1 / 60, 1 / 200)).toBe(1);
	});

	it('at 1/400 with sync 1/200: one stop for pulsing plus one for the shutter share', () => {
		expect(-Math.log2(highSpeedSyncFactor(1 / 400, 1 / 200))).toBeCloseTo(2, 12);
		expect(highSpeedSyncGuideNumber(40, 1 / 400, 1 / 200)).toBeCloseTo(20, 12);
	});

	it('each stop faster costs one more stop', () => {
		const a = -Math.log2(highSpeedSyncFactor(1 / 800, 1 / 200));
		const b = -Math.log2(highSpeedSyncFactor(1 / 1600, 1 / 200));
		expect(b - a).toBeCloseTo(1, 12);
	});
});

describe('laws (fast-check)', () => {
	const gn = fc.double({ min: 1, max: 200, noNaN: true });
	const dist = fc.double({ min: 0.01, max: 100, noNaN: true });
	const iso = fc.double({ min: 25, max: 102400, noNaN: true });
	const power = fc.double({ min: 1 / 256, max: 0.5, noNaN: true });
	const ap = fc.double({ min: 1, max: 64, noNaN: true });

	it('doubling the distance costs two stops', () => {
		fc.assert(
			fc.property(gn, dist, ap, (g, d, n) => {
				const stops = Math.log2(flashExposure(g, 2 * d, n)) - Math.log2(flashExposure(g, d, n));
				expect(stops).toBeCloseTo(-2, 9);
			})
		);
	});

	it('doubling the ISO gains one stop', () => {
		fc.assert(
			fc.property(gn, dist, iso, ap, (g, d, s, n) => {
				const a = flashExposure(effectiveGuideNumber({ guideNumber: g, iso: s }), d, n);
				const b = flashExposure(effectiveGuideNumber({ guideNumber: g, iso: 2 * s }), d, n);
				expect(Math.log2(b / a)).toBeCloseTo(1, 9);
			})
		);
	});

	it('doubling the power gains one stop', () => {
		fc.assert(
			fc.property(gn, dist, power, ap, (g, d, p, n) => {
				const a = flashExposure(effectiveGuideNumber({ guideNumber: g, power: p }), d, n);
				const b = flashExposure(effectiveGuideNumber({ guideNumber: g, power: 2 * p }), d, n);
				expect(Math.log2(b / a)).toBeCloseTo(1, 9);
			})
		);
	});

	it('never NaN or Infinity for valid input', () => {
		fc.assert(
			fc.property(
				fc.record({
					guideNumber: fc.double({ min: 0.01, max: 1000, noNaN: true }),
					distance: fc.double({ min: 0.001, max: 1000, noNaN: true }),
					iso: fc.double({ min: 1, max: 1e7, noNaN: true }),
					power: fc.double({ min: 1e-9, max: 1, noNaN: true }),
					lossStops: fc.double({ min: 0, max: 30, noNaN: true }),
					magnification: fc.double({ min: 0, max: 100, noNaN: true }),
					pupilMagnification: fc.double({ min: 0.05, max: 20, noNaN: true }),
					aperture: fc.double({ min: 0.5, max: 512, noNaN: true })
				}),
				(input) => {
					const r = flashCalc(input);
					for (const v of [r.effectiveGuideNumber, r.workingApertureForCorrect, r.markedApertureForCorrect, r.exposureOffsetStops, r.requiredPower, r.nearestPowerStep?.residualStops]) {
						expect(Number.isFinite(v)).toBe(true);
					}
				}
			)
		);
	});
});
