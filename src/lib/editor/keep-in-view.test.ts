import { describe, expect, it } from 'vitest';
import { keepInViewDelta } from './viewport';

describe('keepInViewDelta', () => {
	const v = { zoom: 1000, panX: 400, panY: 300 }; // an 800 × 600 stage shows x −0.4 … 0.4 m, y −0.3 … 0.3 m
	it('leaves the view alone while the element is in view', () => {
		expect(keepInViewDelta(v, 800, 600, { minX: -0.1, minY: -0.1, maxX: 0.1, maxY: 0.1 })).toBeNull();
	});
	it('pans just enough to bring an element dragged past the edge back in, with a margin', () => {
		// Right edge at 0.45 m = 850 px: 50 px out, plus the 32 px margin.
		expect(keepInViewDelta(v, 800, 600, { minX: 0.4, minY: 0, maxX: 0.45, maxY: 0.02 })).toEqual([-82, 0]);
		expect(keepInViewDelta(v, 800, 600, { minX: -0.1, minY: -0.35, maxX: 0, maxY: -0.3 })).toEqual([0, 82]);
	});
	it('shows the start of an element larger than the view', () => {
		const d = keepInViewDelta(v, 800, 600, { minX: -1, minY: -0.1, maxX: 1, maxY: 0.1 })!;
		expect(d[0]).toBe(-(-1000 + 400) + 32);
	});
});
