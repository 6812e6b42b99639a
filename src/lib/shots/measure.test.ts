import { describe, expect, it } from 'vitest';
import {
	guideNumberFromMeter,
	guideNumberFromShot,
	luminance709,
	meanLuminance8,
	offsetFromLuminance,
	offsetFromMeter,
	srgbToLinear
} from './measure';

describe('sRGB decoding (IEC 61966-2-1:1999 §5.2)', () => {
	it('is linear below the threshold and meets the power curve there', () => {
		expect(srgbToLinear(0)).toBe(0);
		expect(srgbToLinear(1)).toBeCloseTo(1, 12);
		expect(srgbToLinear(0.04045)).toBeCloseTo(0.04045 / 12.92, 12);
		// The two pieces meet at the threshold (the standard's curve is continuous there to about 1e-7).
		expect(((0.04045 + 0.055) / 1.055) ** 2.4).toBeCloseTo(0.04045 / 12.92, 6);
	});
	it('puts 18 % linear grey at about 118 of 255 (IEC 61966-2-1; the issue’s check value)', () => {
		expect(srgbToLinear(118 / 255)).toBeCloseTo(0.1812, 3);
		expect(offsetFromLuminance(srgbToLinear(118 / 255))).toBeCloseTo(0, 1);
	});
});

describe('relative luminance (ITU-R BT.709-6 item 3.3)', () => {
	it('weighs R, G, B as 0.2126, 0.7152, 0.0722 and sums to 1 for white', () => {
		expect(luminance709(1, 0, 0)).toBe(0.2126);
		expect(luminance709(0, 1, 0)).toBe(0.7152);
		expect(luminance709(0, 0, 1)).toBe(0.0722);
		expect(luminance709(1, 1, 1)).toBeCloseTo(1, 12);
	});
	it('averages pixels through the table as the formula would', () => {
		const px = new Uint8Array([255, 0, 0, 0, 255, 0, 0, 0, 255, 118, 118, 118]);
		const expected = (0.2126 + 0.7152 + 0.0722 + srgbToLinear(118 / 255)) / 4;
		expect(meanLuminance8(px, 3)).toBeCloseTo(expected, 12);
		expect(meanLuminance8(new Uint8Array([255, 9, 0, 9]), 2)).toBeCloseTo(0.5, 12);
	});
});

describe('offsets in stops', () => {
	it('is one stop per doubling of luminance, none for black', () => {
		expect(offsetFromLuminance(0.36)).toBeCloseTo(1, 12);
		expect(offsetFromLuminance(0.09)).toBeCloseTo(-1, 12);
		expect(offsetFromLuminance(0)).toBeNull();
	});
	it('reads a meter: f/16 asked at f/11 is one stop over (common practice: a stop per √2)', () => {
		expect(offsetFromMeter(16, 11.3137)).toBeCloseTo(1, 3);
		expect(offsetFromMeter(8, 8)).toBe(0);
	});
});

describe('guide number from a reading (GN = N·d / (√(ISO/100)·√power·2^(−loss/2)), as the engine)', () => {
	it('gives N × d at ISO 100, full power, no loss', () => {
		expect(guideNumberFromMeter({ aperture: 8, distanceM: 5, iso: 100, power: 1, lossStops: 0 })).toBeCloseTo(40, 12);
	});
	it('takes ISO, power and modifier loss out of the reading', () => {
		// f/16 at 1 m, ISO 400 (×2 in GN), 1/4 power (×1/2), 2 stops lost (×1/2): GN 16·1/(2·0.5·0.5) = 32.
		expect(guideNumberFromMeter({ aperture: 16, distanceM: 1, iso: 400, power: 0.25, lossStops: 2 })).toBeCloseTo(32, 12);
	});
});

describe('guide number from a test shot', () => {
	it('gives 2/3 stop under as GN × 2^(−1/3) when the flash is all the light', () => {
		expect(guideNumberFromShot(40, -2 / 3, 1)).toBeCloseTo(40 * 2 ** (-1 / 3), 10);
	});
	it('gives the rest of the light to the other sources as planned', () => {
		// Flash planned at 80 %; the shot shows exactly as planned: the flash is as rated.
		expect(guideNumberFromShot(40, 0, 0.8)).toBeCloseTo(40, 12);
		// Measured total 0.5 of planned; ambient 0.2 planned: flash gives 0.3 of its planned 0.8.
		expect(guideNumberFromShot(40, -1, 0.8)).toBeCloseTo(40 * Math.sqrt(0.3 / 0.8), 12);
		expect(guideNumberFromShot(40, -3, 0.5)).toBeNull();
	});
});
