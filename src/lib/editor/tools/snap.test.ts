import { describe, expect, it } from 'vitest';
import { snapPoint, snapRotation } from './snap';

describe('snapping', () => {
	it('rounds to the grid when no element is near', () => {
		const s = snapPoint([0.113, -0.047], { gridStepM: 0.05, targets: [[1, 1]], toleranceM: 0.008 });
		expect(s.point[0]).toBeCloseTo(0.1, 12);
		expect(s.point[1]).toBeCloseTo(-0.05, 12);
		expect(s.lines).toEqual([]);
	});

	it('lines up with an element on each axis on its own, and draws the guide between them', () => {
		const s = snapPoint([0.305, 0.213], { gridStepM: 0.05, targets: [[0.3, -0.2]], toleranceM: 0.008 });
		expect(s.point).toEqual([0.3, expect.closeTo(0.2, 12)]);
		expect(s.lines).toEqual([{ axis: 'x', atM: 0.3, fromM: -0.2, toM: expect.closeTo(0.2, 12) }]);
	});

	it('leaves the point alone with no grid and nothing near', () => {
		expect(snapPoint([0.123, 0.456], { gridStepM: null, targets: [], toleranceM: 0.01 }).point).toEqual([0.123, 0.456]);
	});

	it('rotation: 15° steps with Shift, else toward the subject within 3°', () => {
		expect(snapRotation(52, { stepDeg: 15, towardDeg: null }).rotationDeg).toBe(45);
		expect(snapRotation(-178.5, { stepDeg: null, towardDeg: 179 })).toEqual({ rotationDeg: 179, snapped: 'toward' });
		expect(snapRotation(170, { stepDeg: null, towardDeg: 179 }).snapped).toBeNull();
	});
});
