import { describe, expect, it } from 'vitest';
import { plainNumber, readLengthM, UnitParseError } from './number-text';
import { parseLengthM } from './units';

describe('plain numbers, read without the unit parser', () => {
	it('reads decimals, signs, exponents, a decimal comma and thousands commas', () => {
		expect(plainNumber('30')).toBe(30);
		expect(plainNumber(' -2.5 ')).toBe(-2.5);
		expect(plainNumber('.5')).toBe(0.5);
		expect(plainNumber('1e-3')).toBe(0.001);
		expect(plainNumber('0,3')).toBe(0.3);
		expect(plainNumber('1,500')).toBe(1500);
		expect(plainNumber('−4')).toBe(-4);
	});

	it('leaves units, fractions and words to the parser', () => {
		for (const text of ['30 cm', '1/125', '1 ft + 2 in', 'twelve', '', 'f/16', '0x10']) expect(plainNumber(text)).toBeNull();
	});
});

describe('readLengthM', () => {
	it('a bare number takes the field’s unit, as the parser would read it', async () => {
		for (const [text, unit] of [['30', 'cm'], ['12', 'in'], ['0,3', 'm'], ['250', 'mm'], ['2', 'ft']] as const) {
			expect(await readLengthM(text, unit)).toBe(parseLengthM(text, unit));
		}
	});

	it('anything else loads the parser: 30 cm, 1 ft + 2 in', async () => {
		expect(await readLengthM('30 cm', 'in')).toBeCloseTo(0.3, 12);
		// Source: international foot = 0.3048 m and inch = 0.0254 m exactly (NIST SP 811, Appendix B).
		expect(await readLengthM('1 ft + 2 in', 'cm')).toBeCloseTo(0.3556, 12);
	});

	it('refuses what is not a length, naming the problem', async () => {
		await expect(readLengthM('twelve', 'cm')).rejects.toThrow(UnitParseError);
		await expect(readLengthM('2 s', 'cm')).rejects.toThrow(/needs a length/);
	});
});
