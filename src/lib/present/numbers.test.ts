import { describe, expect, it } from 'vitest';
import type { ApertureRow } from '$lib/light/scene';
import { offsetText, rowsAround } from './numbers';

// Third-stop marked apertures (common practice: the marked series f/8, 9, 10, 11, 13, 14, 16, 18, 20, 22).
const MARKED = [8, 9, 10, 11, 13, 14, 16, 18, 20, 22];
const rows = MARKED.map((aperture): ApertureRow => ({
	aperture,
	label: `f/${aperture}`,
	workingAperture: aperture * 1.4,
	exposureOffsetStops: 0,
	flashOffsetStops: null,
	ambientOffsetStops: null,
	dofMm: null,
	airyDiskUm: 1,
	diffractionLimited: false
}));

describe('aperture-table rows around the set aperture', () => {
	it('takes two third stops either side of f/16', () => {
		const around = rowsAround(rows, 16);
		expect(around.rows.map((r) => r.aperture)).toEqual([13, 14, 16, 18, 20]);
		expect(around.rows[around.setIndex].aperture).toBe(16);
	});

	it('takes fewer rows at the end of the table', () => {
		const around = rowsAround(rows, 22);
		expect(around.rows.map((r) => r.aperture)).toEqual([18, 20, 22]);
		expect(around.setIndex).toBe(2);
	});

	it('finds the nearest row in stops to an aperture between marks (f/15 is nearer f/16: log2(16/15) < log2(15/14))', () => {
		expect(rowsAround(rows, 15, 0).rows.map((r) => r.aperture)).toEqual([16]);
	});

	it('is empty for an empty table', () => {
		expect(rowsAround([], 16)).toEqual({ rows: [], setIndex: -1 });
	});
});

describe('offsets as the hall reads them', () => {
	it('writes a sign, one decimal and a true minus', () => {
		expect(offsetText(0.66)).toBe('+0.7');
		expect(offsetText(-1.26)).toBe('−1.3');
		expect(offsetText(0.01)).toBe('0.0');
		expect(offsetText(null)).toBe('no light');
	});
});

describe('the presenter window’s elapsed time', async () => {
	const { elapsedText } = await import('./clock');
	it('writes hours, minutes and seconds', () => {
		expect(elapsedText(0)).toBe('0:00:00');
		expect(elapsedText(425_900)).toBe('0:07:05');
		expect(elapsedText(3_600_000 + 61_000)).toBe('1:01:01');
		expect(elapsedText(-5)).toBe('0:00:00');
	});
});
