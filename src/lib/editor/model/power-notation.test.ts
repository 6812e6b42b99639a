// Power notation: common practice (flash manuals write power as 1/1 … 1/256 in whole stops, with thirds
// as "+0.3" and "+0.7" above the whole stop below; one stop is a factor of two).
import { describe, expect, it } from 'vitest';
import { powerLadder } from '$lib/light/flash';
import { formatPower, parsePower } from './power-notation';

const read = (t: string) => {
	const r = parsePower(t);
	if (!r.ok) throw new Error(r.message);
	return r.power;
};

describe('parsePower', () => {
	it('reads fractions, thirds above a whole stop, decimals and stops below full', () => {
		expect(read('1/32')).toBe(1 / 32);
		expect(read(' 1 / 4 ')).toBe(0.25);
		expect(read('1/8 +0.3')).toBeCloseTo(2 ** (-3 + 1 / 3), 12);
		expect(read('1/8+0.7')).toBeCloseTo(2 ** (-3 + 2 / 3), 12);
		expect(read('1/16 -0.3')).toBeCloseTo(2 ** (-4 - 1 / 3), 12);
		expect(read('1/8 +0.5 EV')).toBeCloseTo(2 ** -2.5, 12);
		expect(read('0.25')).toBe(0.25);
		expect(read('0,5')).toBe(0.5);
		expect(read('-3 EV')).toBe(1 / 8);
		expect(read('−2 stops')).toBe(1 / 4);
		expect(read('-1ev')).toBe(0.5);
		expect(read('full')).toBe(1);
		expect(read('1/1')).toBe(1);
	});

	it('reads more than full power as a number (the element schema refuses it, naming the field)', () => {
		expect(read('+1 EV')).toBe(2);
		expect(read('2')).toBe(2);
	});

	it('refuses what is not a power, saying how to write one', () => {
		for (const bad of ['', 'half', '1/0', '1/8 +', 'abc EV', '1//8']) {
			const r = parsePower(bad);
			expect(r.ok, bad).toBe(false);
			if (!r.ok) expect(r.message).toMatch(/1\/32|divide|empty/);
		}
	});
});

describe('formatPower', () => {
	it('shows every ladder step with its usual label, and reads back to the same step', () => {
		for (const step of powerLadder) {
			expect(formatPower(step.fraction)).toBe(step.label);
			expect(read(formatPower(step.fraction))).toBeCloseTo(step.fraction, 12);
		}
	});

	it('shows values between steps to a tenth of a stop above the whole stop below', () => {
		expect(formatPower(0.03125)).toBe('1/32');
		expect(formatPower(0.03)).toBe('1/64 +0.9');
		expect(formatPower(2 ** -2.5)).toBe('1/8 +0.5');
		expect(formatPower(2 ** -0.02)).toBe('1/1');
		expect(formatPower(0)).toBe('—');
	});
});
