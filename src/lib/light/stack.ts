/**
 * Focus stacking: how many frames and what rail step cover a subject depth (the API's rule, /api/v1/openapi.json).
 * Each frame holds one depth of field; neighbours overlap by `overlap` (0 ≤ o < 1) of it, so the rail
 * moves dof × (1 − overlap) between frames, and the frames are
 * max(1, ceil((depth − dof) / step) + 1): the first frame covers one depth of field, each further one
 * adds a step.
 */

export interface StackPlan {
	frames: number;
	stepMm: number;
}

export function stackPlan(subjectDepthMm: number, dofMm: number, overlap = 0.2): StackPlan {
	const stepMm = dofMm * (1 - overlap);
	// A hair of tolerance so 3.0000000001 steps (floating point) does not add a frame.
	const steps = Math.ceil((subjectDepthMm - dofMm) / stepMm - 1e-9);
	return { frames: Math.max(1, steps + 1), stepMm };
}

/** The depth the frames of a plan actually cover: dof + (frames − 1) × step. */
export function stackCoverageMm(plan: StackPlan, dofMm: number): number {
	return dofMm + (plan.frames - 1) * plan.stepMm;
}
