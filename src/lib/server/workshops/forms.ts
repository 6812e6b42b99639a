// The workshop pages' form actions: parse with the input's zod schema (each message beside its field),
// then run the service through runAction (a broken rule beside its field, a refusal as its status).
import { fail } from '@sveltejs/kit';
import type { z } from 'zod';
import { runAction } from '$lib/server/actions';

/** Each field's first message, keyed by the field's top-level name (`form` for the whole form). */
export function fieldMessages(error: z.ZodError): Record<string, string> {
	const out: Record<string, string> = {};
	for (const issue of error.issues) out[String(issue.path[0] ?? 'form')] ??= issue.message;
	return out;
}

export async function formAction<S extends z.ZodType, T>(
	action: string,
	schema: S,
	raw: unknown,
	work: (input: z.output<S>) => Promise<T>,
	values: Record<string, unknown> = {}
) {
	const parsed = schema.safeParse(raw);
	if (!parsed.success) return fail(400, { action, errors: fieldMessages(parsed.error), values });
	return runAction(action, () => work(parsed.data));
}

/** A form's text field, '' when absent. */
export const text = (form: FormData, name: string) => String(form.get(name) ?? '');

/**
 * A `datetime-local` value ("2027-01-14T18:30") read in the zone of the browser that sent it: the form
 * carries the browser's offset from UTC in minutes (`Date#getTimezoneOffset`), UTC without JavaScript.
 * Anything that is not such a value is passed on as it came, for the schema to name.
 */
export function localToIso(value: string, offsetMinutes: string): string {
	const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/.exec(value.trim());
	const offset = Number(offsetMinutes);
	if (!m || !Number.isFinite(offset) || Math.abs(offset) > 14 * 60) return value;
	const [, y, mo, d, h, mi] = m.map(Number);
	const utc = new Date(Date.UTC(y, mo - 1, d, h, mi) + offset * 60_000);
	// 2027-02-30 would roll over to March: refuse it rather than move it.
	if (new Date(Date.UTC(y, mo - 1, d)).getUTCDate() !== d) return value;
	return utc.toISOString();
}
