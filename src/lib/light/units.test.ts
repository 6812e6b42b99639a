import { describe, expect, it } from 'vitest';
import {
	formatDistance,
	formatFNumber,
	formatShutter,
	formatSmallLength,
	formatStops,
	guideNumberFeetToMetres,
	parseFNumber,
	parseFraction,
	parseLengthM,
	parseLengthMm,
	parseNumber,
	parseTimeS,
	UnitParseError
} from './units';

describe('parsing what people type', () => {
	it('30 cm, 0.3 m, 300 mm are all 0.3 m', () => {
		expect(parseLengthM('30 cm')).toBeCloseTo(0.3, 12);
		expect(parseLengthM('0.3 m')).toBeCloseTo(0.3, 12);
		expect(parseLengthM('300mm')).toBeCloseTo(0.3, 12);
	});

	it('1 ft is 0.3048 m and 12 in is 1 ft', () => {
		// Source: international foot = 0.3048 m exactly (NIST SP 811, Appendix B; 1959 international yard).
		expect(parseLengthM('1 ft')).toBeCloseTo(0.3048, 12);
		expect(parseLengthM('12 in')).toBeCloseTo(0.3048, 12);
		expect(parseLengthM('1 ft + 2 in')).toBeCloseTo(0.3556, 12);
	});

	it('a bare number takes the field’s unit', () => {
		expect(parseLengthM('30', 'cm')).toBeCloseTo(0.3, 12);
		expect(parseLengthM('12', 'in')).toBeCloseTo(0.3048, 12);
		expect(parseLengthMm('2')).toBe(2);
		expect(parseLengthMm('0.1 in')).toBeCloseTo(2.54, 12);
	});

	it('a decimal comma is read as a point', () => {
		expect(parseLengthM('0,3 m')).toBeCloseTo(0.3, 12);
	});

	it('shutter times: 1/125, 1/125 s, 2 s, 500 ms', () => {
		expect(parseTimeS('1/125')).toBeCloseTo(0.008, 12);
		expect(parseTimeS('1/125 s')).toBeCloseTo(0.008, 12);
		expect(parseTimeS('2 s')).toBe(2);
		expect(parseTimeS('500 ms')).toBeCloseTo(0.5, 12);
	});

	it('f-numbers as written: 16, f/16, F5.6', () => {
		expect(parseFNumber('16')).toBe(16);
		expect(parseFNumber('f/16')).toBe(16);
		expect(parseFNumber('F5.6')).toBe(5.6);
	});

	it('fractions and percentages', () => {
		expect(parseNumber('1/3')).toBeCloseTo(1 / 3, 12);
		expect(parseFraction('90 %')).toBeCloseTo(0.9, 12);
		expect(parseFraction('0.9')).toBe(0.9);
	});

	it('refuses the wrong dimension, function calls, assignments and nonsense', () => {
		expect(() => parseLengthM('2 s')).toThrow(UnitParseError);
		expect(() => parseTimeS('3 cm')).toThrow(/time/);
		expect(() => parseNumber('3 cm')).toThrow(/plain number/);
		expect(() => parseLengthM('sqrt(4) m')).toThrow(UnitParseError);
		expect(() => parseLengthM('a = 3')).toThrow(UnitParseError);
		expect(() => parseLengthM('banana')).toThrow(UnitParseError);
		expect(() => parseLengthM('')).toThrow(/empty/);
		expect(() => parseNumber('1/0')).toThrow(/finite/);
		expect(() => parseLengthM('1'.repeat(100))).toThrow(/longer/);
	});

	it('guide numbers in feet convert to metres', () => {
		// Source: 1 ft = 0.3048 m (NIST SP 811, Appendix B): GN 120 ft ≈ 36.6 m.
		expect(guideNumberFeetToMetres(120)).toBeCloseTo(36.576, 12);
	});
});

describe('formatting', () => {
	it('distances in metric and imperial', () => {
		expect(formatDistance(0.3, 'metric')).toBe('30 cm');
		expect(formatDistance(2.5, 'metric')).toBe('2.5 m');
		expect(formatDistance(0.3048, 'imperial')).toBe('12 in');
		expect(formatDistance(3.048, 'imperial')).toBe('10 ft');
	});

	it('small lengths, shutters, f-numbers and stops', () => {
		expect(formatSmallLength(1.92, 'metric')).toBe('1.92 mm');
		expect(formatSmallLength(25.4, 'imperial')).toBe('1 in (25.4 mm)');
		expect(formatShutter(1 / 125)).toBe('1/125 s');
		expect(formatShutter(2)).toBe('2 s');
		expect(formatFNumber(32)).toBe('f/32');
		expect(formatFNumber(5.6)).toBe('f/5.6');
		expect(formatFNumber(11.3137)).toBe('f/11.3');
		expect(formatStops(-2)).toBe('−2 stops');
		expect(formatStops(1)).toBe('+1 stop');
		expect(formatStops(0.04)).toBe('0 stops');
		expect(formatStops(null)).toBe('no light');
	});
});
