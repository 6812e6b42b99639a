import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { stackCoverageMm, stackPlan } from './stack';

describe('stack frames and step (API.md rule)', () => {
	it('18 mm of subject with 1.92 mm DoF and 20 % overlap: 12 frames 1.536 mm apart', () => {
		const plan = stackPlan(18, 1.92, 0.2);
		expect(plan.stepMm).toBeCloseTo(1.536, 12);
		// frames = max(1, ceil((18 − 1.92) / 1.536) + 1) = ceil(10.47) + 1
		expect(plan.frames).toBe(12);
	});

	it('a subject shallower than the DoF needs one frame', () => {
		expect(stackPlan(1, 2, 0.2).frames).toBe(1);
		expect(stackPlan(2, 2, 0.2).frames).toBe(1);
	});

	it('exact multiples do not add a frame (floating point tolerance)', () => {
		// (1 + 3·0.3) with DoF 1, overlap 0.7: step 0.3 → exactly 3 steps → 4 frames
		expect(stackPlan(1.9, 1, 0.7).frames).toBe(4);
	});

	it('no overlap: step is the DoF', () => {
		expect(stackPlan(10, 1, 0)).toEqual({ frames: 10, stepMm: 1 });
	});

	it('property: the frames always cover the subject, and one frame fewer would not', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 0.01, max: 500, noNaN: true }),
				fc.double({ min: 0.01, max: 20, noNaN: true }),
				fc.double({ min: 0, max: 0.9, noNaN: true }),
				(depth, dof, overlap) => {
					const plan = stackPlan(depth, dof, overlap);
					expect(stackCoverageMm(plan, dof)).toBeGreaterThanOrEqual(depth - 1e-6 * depth);
					if (plan.frames > 1) {
						expect(stackCoverageMm({ ...plan, frames: plan.frames - 1 }, dof)).toBeLessThan(depth + 1e-6 * depth);
					}
				}
			)
		);
	});
});
