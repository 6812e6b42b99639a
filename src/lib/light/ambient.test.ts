import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	ambientCalc,
	ambientExposure,
	ambientOffsetStops,
	ev100FromIlluminance,
	ev100FromLuminance,
	ev100FromMeterReading,
	ev100FromSkyPreset,
	exposureValue,
	illuminanceFromEv100,
	shutterForAmbientUnder,
	shutterForCorrect
} from './ambient';
import * as ambientModule from './ambient';
import { ambientCalcSchema } from './schema';

const base = { calibrationC: 250, calibrationK: 12.5, iso: 100, magnification: 0, pupilMagnification: 1, lossStops: 0, syncSpeed: 1 / 200 };

describe('APEX and the exposure value', () => {
	it('EV 0 is f/1 at 1 s', () => {
		// Source: APEX, ANSI PH2.5-1960 / ASA PH2.5: EV = Av + Tv with Av = log2 N², Tv = log2(1/t) (from memory).
		expect(exposureValue(1, 1)).toBe(0);
	});

	it('f/16 at 1/125 s is EV 15 (to within 0.03)', () => {
		// Source: APEX as above; log2(256 × 125) = 14.97, the nominal EV 15.
		expect(exposureValue(16, 1 / 125)).toBeCloseTo(14.97, 2);
	});

	it('f/8 at 1/60 s is about EV 12', () => {
		// Source: APEX as above; log2(64 × 60) = 11.9.
		expect(exposureValue(8, 1 / 60)).toBeCloseTo(11.91, 2);
	});

	it('one stop of aperture (×√2) is one EV', () => {
		// Source: APEX, Av = 2·log2 N.
		expect(exposureValue(11.3137, 1) - exposureValue(8, 1)).toBeCloseTo(1, 4);
	});

	it('a meter reading of f/8 at 1/125 s at ISO 400 is EV 11.97 at ISO 100', () => {
		// Source: APEX, Sv = log2(ISO/3.125): two stops of ISO above 100 lower EV100 by 2 (from memory).
		expect(ev100FromMeterReading(8, 1 / 125, 400)).toBeCloseTo(exposureValue(8, 1 / 125) - 2, 12);
	});
});

describe('meter calibration constants (ISO 2720)', () => {
	it('incident, flat receptor C = 250: EV 0 at ISO 100 is 2.5 lux', () => {
		// Source: ISO 2720:1974 incident-light calibration N²/t = E·S/C, C = 250 for a flat receptor
		// (from memory; also listed in ANSI PH3.49).
		expect(illuminanceFromEv100(0, 250)).toBe(2.5);
		expect(ev100FromIlluminance(2.5, 250)).toBeCloseTo(0, 12);
	});

	it('incident C = 250: 81 920 lux is EV 15 (bright sun)', () => {
		// Source: as above, 2.5 × 2^15 = 81 920 lux.
		expect(ev100FromIlluminance(81920, 250)).toBeCloseTo(15, 12);
	});

	it('hemispherical receptor C = 330 reads 0.4 EV lower for the same light', () => {
		// Source: ISO 2720 gives C between 320 and 540 for hemispherical receptors; 320–340 is the
		// usual figure (from memory). log2(330/250) = 0.40.
		expect(ev100FromIlluminance(1000, 250) - ev100FromIlluminance(1000, 330)).toBeCloseTo(0.4, 2);
	});

	it('reflected K = 12.5: 1 cd/m² is EV 3 at ISO 100', () => {
		// Source: ISO 2720 reflected calibration N²/t = L·S/K, K = 12.5 (from memory); log2(100/12.5) = 3.
		expect(ev100FromLuminance(1, 12.5)).toBeCloseTo(3, 12);
	});

	it('reflected K = 12.5 agrees with APEX Bv + Sv', () => {
		// Source: APEX Bv = log2(L / (0.3 K)), Sv = log2(0.3 S) (ANSI PH2.5; from memory).
		const L = 4000;
		const bv = Math.log2(L / (0.3 * 12.5));
		const sv = Math.log2(0.3 * 100);
		expect(ev100FromLuminance(L)).toBeCloseTo(bv + sv, 12);
	});

	it('K = 14 reads 0.16 EV lower than K = 12.5', () => {
		// Source: ISO 2720 allows K from 10.6 to 13.4 and some makers use 14 (from memory); log2(14/12.5).
		expect(ev100FromLuminance(100, 12.5) - ev100FromLuminance(100, 14)).toBeCloseTo(0.163, 3);
	});
});

describe('sky presets: common practice ("sunny 16")', () => {
	it('bright sun is EV 15, one stop per step duller down to open shade at 11', () => {
		// Common practice: the "sunny 16" rule, f/16 at 1/ISO in bright sun, f/11 hazy, f/8 overcast,
		// f/5.6 heavy overcast, f/4 open shade.
		expect(ev100FromSkyPreset('bright-sun')).toBe(15);
		expect(ev100FromSkyPreset('hazy-sun')).toBe(14);
		expect(ev100FromSkyPreset('overcast')).toBe(13);
		expect(ev100FromSkyPreset('heavy-overcast')).toBe(12);
		expect(ev100FromSkyPreset('open-shade')).toBe(11);
	});

	it('sunny 16: EV 15 at ISO 100 and f/16 wants about 1/128 s', () => {
		// Common practice: sunny 16 (f/16 at 1/ISO); 1/128 is the exact EV 15 time.
		expect(shutterForCorrect(15, 100, 16)).toBeCloseTo(1 / 128, 12);
	});
});

describe('ambient offsets and the flash balance (API.md)', () => {
	it('offset is 0 at the shutter for a correct exposure', () => {
		const t = shutterForCorrect(12, 200, 11, 1);
		expect(ambientOffsetStops(12, 200, t, 11, 1)).toBeCloseTo(0, 12);
	});

	it('ambient X is 2^offset', () => {
		expect(Math.log2(ambientExposure(13, 400, 1 / 60, 22))).toBeCloseTo(ambientOffsetStops(13, 400, 1 / 60, 22), 12);
	});

	it('two stops under the flash is a quarter of the correct ambient time', () => {
		expect(shutterForAmbientUnder(12, 100, 16, 2)).toBeCloseTo(shutterForCorrect(12, 100, 16) / 4, 12);
	});

	it('ambient route from lux at 1:1, f/16: the bellows factor is in the shutter', () => {
		const r = ambientCalc({ ...base, illuminanceLux: 2560, aperture: 16, shutter: 1 / 4, magnification: 1, balanceUnderStops: 1 });
		expect(r.ev100).toBeCloseTo(10, 12); // log2(2560·100/250) = log2(1024)
		expect(r.workingAperture).toBe(32);
		expect(r.shutterForCorrect).toBeCloseTo(1, 12); // 32² / 2^10
		expect(r.exposureOffsetStops).toBeCloseTo(-2, 12);
		expect(r.shutterForBalance).toBeCloseTo(0.5, 12);
		expect(r.balanceFasterThanSync).toBe(false);
	});

	it('ambient route flags a balance shutter faster than sync', () => {
		const r = ambientCalc({ ...base, skyPreset: 'bright-sun', aperture: 8, balanceUnderStops: 1 });
		expect(r.shutterForBalance).toBeCloseTo(1 / 1024, 12);
		expect(r.balanceFasterThanSync).toBe(true);
	});

	it('property: doubling the ISO gains one stop of ambient', () => {
		fc.assert(
			fc.property(
				fc.double({ min: -5, max: 20, noNaN: true }),
				fc.double({ min: 25, max: 51200, noNaN: true }),
				fc.double({ min: 1e-4, max: 30, noNaN: true }),
				fc.double({ min: 1, max: 64, noNaN: true }),
				(ev, iso, t, n) => {
					expect(ambientOffsetStops(ev, 2 * iso, t, n) - ambientOffsetStops(ev, iso, t, n)).toBeCloseTo(1, 9);
				}
			)
		);
	});

	it('property: never NaN for valid input', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 1e-6, max: 1e7, noNaN: true }),
				fc.double({ min: 1, max: 1e7, noNaN: true }),
				fc.double({ min: 0.5, max: 512, noNaN: true }),
				fc.double({ min: 1e-6, max: 1e5, noNaN: true }),
				fc.double({ min: 0, max: 100, noNaN: true }),
				(lux, iso, n, t, m) => {
					const r = ambientCalc({ ...base, illuminanceLux: lux, iso, aperture: n, shutter: t, magnification: m, balanceUnderStops: 3 });
					for (const v of [r.ev100, r.workingAperture, r.exposureOffsetStops, r.shutterForCorrect, r.shutterForBalance, r.illuminanceLux]) {
						expect(Number.isFinite(v)).toBe(true);
					}
				}
			)
		);
	});
});

describe('marked shutter speeds', () => {
	it('the third-stop series runs 1/8000 s to 30 s, with “1/125” really 1/128 s', () => {
		// Source: shutter speeds in ISO 2721 / APEX Tv steps are powers of 2 labelled with rounded values
		// (from memory: 1/125 = 2^−7, 1/60 = 2^−6).
		const { MARKED_SHUTTER_SPEEDS } = ambientModule;
		expect(MARKED_SHUTTER_SPEEDS).toHaveLength(55);
		expect(MARKED_SHUTTER_SPEEDS[0].label).toBe('1/8000 s');
		expect(MARKED_SHUTTER_SPEEDS.at(-1)!.label).toBe('30 s');
		expect(MARKED_SHUTTER_SPEEDS.find((s) => s.label === '1/125 s')!.exactS).toBe(1 / 128);
		expect(MARKED_SHUTTER_SPEEDS.find((s) => s.label === '1 s')!.exactS).toBe(1);
	});

	it('1/62 s rounds to 1/60 s (really 1/64); beyond the ends it stops at 1/8000 and 30 s', () => {
		const { nearestMarkedShutter } = ambientModule;
		expect(nearestMarkedShutter(1 / 62).label).toBe('1/60 s');
		expect(nearestMarkedShutter(1 / 62).residualStops).toBeCloseTo(Math.log2(62 / 64), 12);
		expect(nearestMarkedShutter(1e-5).label).toBe('1/8000 s');
		expect(nearestMarkedShutter(100).label).toBe('30 s');
	});
});

describe('flash and ambient add (issue 15, item 12)', () => {
	it('both at correct is one stop over; keeping the ambient 1 stop under, the flash goes down 0.58 stop', () => {
		// Source: exposures add linearly (common practice): 1 + 1 = 2 is one stop; 1 + ½ = 1.5 is log2(1.5) = 0.585.
		const even = ambientCalc(ambientCalcSchema.parse({ ev100: 12, aperture: 16, balanceUnderStops: 0 }));
		expect(even.balanceSumOffsetStops).toBeCloseTo(1, 12);
		const under = ambientCalc(ambientCalcSchema.parse({ ev100: 12, aperture: 16, balanceUnderStops: 1 }));
		expect(under.flashCompensationStops).toBeCloseTo(-Math.log2(1.5), 12);
		// The shutter follows the flash down, so the ambient stays 1 stop under it.
		expect(under.shutterForCompensatedBalance! / under.shutterForBalance!).toBeCloseTo(1 / 1.5, 12);
	});
});
