// The exercise pages' forms: the form's fields to the input schemas' shape, and each schema message
// back beside its own field (a target's bound included: targets.1.max is the box it came from).
import { fail } from '@sveltejs/kit';
import type { z } from 'zod';
import { runAction } from '$lib/server/actions';
import { localToIso, text } from '$lib/server/workshops/forms';
import { formFieldOf, targetsFromForm } from '$lib/exercises/inputs';

/** Every text field of the form, to fill it again after a refusal. */
export function formValues(form: FormData): Record<string, string> {
	const out: Record<string, string> = {};
	for (const [k, v] of form.entries()) if (typeof v === 'string') out[k] = v;
	return out;
}

/** An exercise form's fields as the exercise schemas take them. */
export function exerciseFromForm(form: FormData) {
	const revision = text(form, 'revisionNumber').trim();
	return {
		title: text(form, 'title'),
		brief: text(form, 'brief'),
		setupId: text(form, 'setupId') || undefined,
		revisionNumber: revision === '' ? undefined : revision,
		dueAt: localToIso(text(form, 'dueAt'), text(form, 'tzOffset') || '0'),
		targets: targetsFromForm(form)
	};
}

/** Parses `raw` with `schema` (each message beside its field) and runs the work as any page action. */
export async function exerciseFormAction<S extends z.ZodType, T>(action: string, schema: S, raw: ReturnType<typeof exerciseFromForm>, form: FormData, work: (input: z.output<S>) => Promise<T>) {
	const parsed = schema.safeParse(raw);
	if (!parsed.success) {
		const errors: Record<string, string> = {};
		for (const issue of parsed.error.issues) errors[formFieldOf(issue.path, raw.targets)] ??= issue.message;
		return fail(400, { action, errors, values: formValues(form) });
	}
	const result = await runAction(action, () => work(parsed.data));
	// A broken rule goes back with the form's values, so nothing typed is lost.
	if (result && typeof result === 'object' && 'status' in result && 'data' in result) (result.data as Record<string, unknown>).values = formValues(form);
	return result;
}
