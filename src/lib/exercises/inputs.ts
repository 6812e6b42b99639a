/**
 * The exercise inputs: one zod schema per input, shared by the pages' forms, the JSON routes and the
 * services. Targets are checked by $lib/scene/targets.ts; every message names its field.
 */
import { z } from 'zod';
import { targetsSchema } from '$lib/scene/targets';
import { TARGET_KINDS, type Target, type TargetKind } from '$lib/light/targets';
import { markdown, moment, revisionNumber } from '$lib/workshops/inputs';
import { REVIEW_STATES } from './states';

export const MAX_HAND_IN_SHOTS = 24;

const title = z
	.string({ error: 'Give the exercise a title.' })
	.trim()
	.min(1, 'Give the exercise a title.')
	.max(200, 'An exercise title has at most 200 characters.');

export const exerciseCreateSchema = z.object({
	title,
	brief: markdown('The brief').default(''),
	setupId: z.uuid({ error: 'Choose the starting setup.' }),
	/** Omitted: the setup's latest revision when the exercise is set. */
	revisionNumber: revisionNumber.optional(),
	dueAt: moment('due date'),
	targets: targetsSchema.default([])
});
export type ExerciseCreateInput = z.output<typeof exerciseCreateSchema>;

export const exerciseUpdateSchema = z.object({
	title,
	brief: markdown('The brief'),
	dueAt: moment('due date'),
	targets: targetsSchema
});
export type ExerciseUpdateInput = z.output<typeof exerciseUpdateSchema>;

export const handInSchema = z.object({
	setupId: z.uuid({ error: 'Choose the setup you hand in.' }),
	/** Omitted: the setup's latest revision at the moment of handing in. */
	revisionNumber: revisionNumber.optional(),
	shotIds: z
		.array(z.uuid({ error: 'Each shot must be named by its id.' }))
		.max(MAX_HAND_IN_SHOTS, `A hand-in has at most ${MAX_HAND_IN_SHOTS} shots.`)
		.default([]),
	note: z.string({ error: 'The note must be text.' }).max(5000, 'A note has at most 5000 characters.').default('')
});
export type HandInInput = z.output<typeof handInSchema>;

export const reviewSchema = z.object({
	state: z.enum(REVIEW_STATES, { error: 'Choose accepted or another try.' }),
	feedback: markdown('The feedback').default('')
});
export type ReviewInput = z.output<typeof reviewSchema>;

/**
 * The targets a form sends: for each kind a box `target-<kind>` and the bounds `target-<kind>-min`
 * and `-max`, in the order of TARGET_KINDS. Empty bounds are open; text that is no number is kept
 * as NaN for the schema to name.
 */
export function targetsFromForm(form: FormData): { kind: TargetKind; min?: number; max?: number }[] {
	const out: { kind: TargetKind; min?: number; max?: number }[] = [];
	for (const kind of TARGET_KINDS) {
		if (!form.has(`target-${kind}`)) continue;
		const t: { kind: TargetKind; min?: number; max?: number } = { kind };
		for (const side of ['min', 'max'] as const) {
			const raw = String(form.get(`target-${kind}-${side}`) ?? '').trim();
			if (raw !== '') t[side] = Number(raw.replace(',', '.'));
		}
		out.push(t);
	}
	return out;
}

/** A form's field name for a schema path: targets.1.max is the box of the second target sent. */
export function formFieldOf(path: PropertyKey[], targets: { kind: TargetKind }[]): string {
	if (path[0] === 'targets' && typeof path[1] === 'number' && targets[path[1]]) {
		const side = path[2] === 'min' || path[2] === 'max' ? `-${String(path[2])}` : '';
		return `target-${targets[path[1]].kind}${side}`;
	}
	return String(path[0] ?? 'form');
}

export type { Target };
