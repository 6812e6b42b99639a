/**
 * The targets of an exercise as data: a list of { kind, min, max }, checked here and evaluated by
 * $lib/light/targets.ts. A ranged target needs at least one bound and its bounds in order; each kind
 * has the limits of what the engine can give. Messages name the field (targets.0.max).
 */
import { z } from 'zod';
import { TARGET_KINDS, TARGET_LABELS, type Target, type TargetKind } from '$lib/light/targets';

export const MAX_TARGETS = 12;

/** What a bound of each kind may be. */
const LIMITS: Record<TargetKind, { min: number; max: number; whole?: boolean }> = {
	exposureOffset: { min: -10, max: 10 },
	lightingRatio: { min: 1, max: 1000 },
	aperture: { min: 0.5, max: 512 },
	depthOfField: { min: 0, max: 0 },
	lightCount: { min: 0, max: 100, whole: true },
	keyLightAngle: { min: 0, max: 180 },
	flashPower: { min: 0, max: 0 }
};

const bound = z.number({ error: 'must be a number' }).refine(Number.isFinite, 'must be a number');

export const targetSchema = z
	.object({
		kind: z.enum(TARGET_KINDS, { error: `must be one of ${TARGET_KINDS.join(', ')}` }),
		min: bound.optional(),
		max: bound.optional()
	})
	.superRefine((t, ctx) => {
		const { ranged, name } = TARGET_LABELS[t.kind];
		if (!ranged) {
			for (const side of ['min', 'max'] as const) {
				if (t[side] !== undefined) ctx.addIssue({ code: 'custom', path: [side], message: `${name} takes no range: leave it empty` });
			}
			return;
		}
		if (t.min === undefined && t.max === undefined) {
			ctx.addIssue({ code: 'custom', path: ['min'], message: 'the range is empty: give a lowest value, a highest value, or both' });
			return;
		}
		const limits = LIMITS[t.kind];
		for (const side of ['min', 'max'] as const) {
			const v = t[side];
			if (v === undefined) continue;
			if (v < limits.min || v > limits.max) ctx.addIssue({ code: 'custom', path: [side], message: `must be from ${limits.min} to ${limits.max}` });
			else if (limits.whole && !Number.isInteger(v)) ctx.addIssue({ code: 'custom', path: [side], message: 'must be a whole number' });
		}
		if (t.min !== undefined && t.max !== undefined && t.min > t.max) {
			ctx.addIssue({ code: 'custom', path: ['max'], message: `the range is inverted: the highest value (${t.max}) is below the lowest (${t.min})` });
		}
	})
	.transform((t): Target => {
		const out: Target = { kind: t.kind };
		if (t.min !== undefined) out.min = t.min;
		if (t.max !== undefined) out.max = t.max;
		return out;
	});

export const targetsSchema = z
	.array(targetSchema)
	.max(MAX_TARGETS, `an exercise has at most ${MAX_TARGETS} targets`)
	.superRefine((list, ctx) => {
		const seen = new Set<string>();
		list.forEach((t, i) => {
			if (seen.has(t.kind)) ctx.addIssue({ code: 'custom', path: [i, 'kind'], message: `${TARGET_LABELS[t.kind].name} is already a target` });
			seen.add(t.kind);
		});
	});

export type { Target };
