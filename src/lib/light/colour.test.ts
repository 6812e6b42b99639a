import { describe, expect, it } from 'vitest';
import { colourCalc, GELS, gelledKelvin, mired, miredShift, mixedWhiteBalance, nearestGel } from './colour';

describe('mired', () => {
	it('3200 K is 312.5 mired; 5500 K is 181.8 mired', () => {
		// Source: mired = 10⁶ / T (micro reciprocal degree; Hunt, The Reproduction of Colour, colour temperature
		// chapter; from memory).
		expect(mired(3200)).toBe(312.5);
		expect(mired(5500)).toBeCloseTo(181.82, 2);
	});

	it('tungsten 3200 K to daylight 5500 K is a shift of −131 mired (the classic blue conversion filter)', () => {
		// Source: the 3200 K → 5500 K blue conversion filter is rated −131 mired (Kodak Photographic Filters
		// Handbook, conversion filters; from memory).
		expect(miredShift(3200, 5500)).toBeCloseTo(-130.7, 1);
	});

	it('daylight 5500 K to 3200 K is +131 mired (the classic amber conversion filter)', () => {
		// Source: as above, the amber counterpart (from memory).
		expect(miredShift(5500, 3200)).toBeCloseTo(130.7, 1);
	});

	it('a full CTO (+159 mired) turns 6500 K into about 3200 K', () => {
		// Source: nominal full colour-temperature-orange gel, +159 mired, 6500 K → 3200 K (from memory).
		expect(gelledKelvin(6500, GELS['full-cto'].mired)).toBeCloseTo(3200, -1);
	});

	it('a full CTB (−137 mired) turns 3200 K into about 5700 K', () => {
		// Source: nominal full colour-temperature-blue gel, −137 mired, 3200 K → 5700 K (from memory).
		expect(gelledKelvin(3200, GELS['full-ctb'].mired)).toBeCloseTo(5700, -2);
	});

	it('a half CTO (+109 mired) turns 6500 K into about 3800 K', () => {
		// Source: nominal half CTO, +109 mired, 6500 K → 3800 K (from memory).
		expect(gelledKelvin(6500, GELS['half-cto'].mired)).toBeCloseTo(3800, -2);
	});

	it('the same gel shifts by the same mired whatever the source', () => {
		// Source: gels are rated in mired because the shift is source-independent in mired (Hunt, as above).
		const g = 50;
		expect(mired(gelledKelvin(3000, g)) - mired(3000)).toBeCloseTo(g, 9);
		expect(mired(gelledKelvin(7000, g)) - mired(7000)).toBeCloseTo(g, 9);
	});

	it('the nearest gel to a shift and the rest left over', () => {
		expect(nearestGel(150)).toMatchObject({ name: 'full-cto', mired: 159, residualMired: -9 });
		expect(nearestGel(3).name).toBe('none');
	});
});

describe('white balance for a mix', () => {
	it('equal shares of 3200 K and 5500 K meet at the mean mired, about 4050 K', () => {
		const mix = mixedWhiteBalance([
			{ kelvin: 3200, share: 1 },
			{ kelvin: 5500, share: 1 }
		]);
		expect(mix?.kelvin).toBeCloseTo(1e6 / ((1e6 / 3200 + 1e6 / 5500) / 2), 6);
		expect(mix?.kelvin).toBeCloseTo(4046, 0);
		expect(mix?.spreadMired).toBeCloseTo(130.68, 2);
		expect(mix?.mixed).toBe(true);
	});

	it('a source with no share does not move the balance', () => {
		const mix = mixedWhiteBalance([
			{ kelvin: 5500, share: 3 },
			{ kelvin: 2000, share: 0 }
		]);
		expect(mix?.kelvin).toBeCloseTo(5500, 9);
		expect(mix?.mixed).toBe(false);
	});

	it('no lit source: no balance', () => {
		expect(mixedWhiteBalance([{ kelvin: 5500, share: 0 }])).toBeNull();
	});

	it('colour route answers both questions and warns on a wide mix', () => {
		const r = colourCalc({ fromKelvin: 5500, toKelvin: 3200, kelvin: 5500, gel: 'full-ctb', sources: [{ kelvin: 3200, share: 1 }, { kelvin: 6500, share: 1 }] });
		expect(r.miredShift).toBeCloseTo(130.68, 2);
		expect(r.gelMired).toBe(-137);
		expect(r.resultKelvin).toBeCloseTo(1e6 / (1e6 / 5500 - 137), 9);
		expect(r.warnings).toHaveLength(1);
	});
});

describe('the gel the trade would use (issue 15, item 12)', () => {
	it('+131 mired (5500 K to 3200 K) is not answered with ½ CTO: ½ + ⅛ CTO, with its light loss', () => {
		// Source: nominal gel shifts (from memory: full CTO +159, ½ CTO +109, ⅛ CTO +26 mired); ½ CTO alone
		// leaves 22 mired, the stack ½ + ⅛ = 135 leaves −4.3 (the shift is 312.5 − 181.8 = 130.7). Losses add (from memory, the data sheet wins).
		const r = colourCalc({ fromKelvin: 5500, toKelvin: 3200 });
		expect(r.suggestedGel).toMatchObject({ gels: ['half-cto', 'eighth-cto'], mired: 135, lossStops: 0.6 });
		expect(r.suggestedGel!.residualMired).toBeCloseTo(130.68 - 135, 2);
	});

	it('a shift close to one gel gets that gel alone; a tiny shift gets none', () => {
		expect(colourCalc({ fromKelvin: 6500, toKelvin: 3200 }).suggestedGel!.gels).toEqual(['full-cto']); // +159 mired
		expect(colourCalc({ fromKelvin: 5500, toKelvin: 5600 }).suggestedGel!.gels).toEqual([]);
	});

	it('a named gel shows its loss and raises the gel caution', () => {
		const r = colourCalc({ kelvin: 5500, gel: 'full-cto' });
		expect(r.gelLossStops).toBe(0.7);
		expect(r.cautions).toHaveLength(1);
	});
});
