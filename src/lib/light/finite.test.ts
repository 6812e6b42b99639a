import { describe, expect, it } from 'vitest';
import { findNonFinite } from './finite';

describe('findNonFinite', () => {
	it('finds NaN and Infinity with their path; passes finite values and nulls', () => {
		expect(findNonFinite({ a: 1, b: [1, 2, { c: null }], d: 'x' })).toBeNull();
		expect(findNonFinite({ a: 1, b: [1, { c: Number.NaN }] })).toEqual(['b', '1', 'c']);
		expect(findNonFinite([0, -Infinity])).toEqual(['1']);
		expect(findNonFinite(Infinity)).toEqual([]);
	});
});
