/**
 * One question, answered: read the typed fields, build the API body, ask the API route, describe the
 * answer. The page's form actions run it on the server (no JavaScript needed); the live client runs the
 * same steps in the browser with `fetch` and an AbortSignal.
 */
import type { UnitSystem } from '$lib/light/units';
import { readFields, type FieldErrors, type FieldValues } from './fields';
import type { Answer, Question } from './questions';

export type Outcome = { ok: true; answer: Answer } | { ok: false; errors: FieldErrors };

interface ApiIssue {
	path: string[];
	message: string;
}

/** Puts the API's complaints beside the fields they concern. */
function errorsFromApi(question: Question, issues: ApiIssue[], message: string): FieldErrors {
	const errors: FieldErrors = {};
	const names = new Set(question.fields.map((f) => f.name));
	for (const issue of issues) {
		const field = question.fieldFor?.(issue.path) ?? issue.path[0];
		const def = question.fields.find((f) => f.name === field);
		const key = field && names.has(field) ? field : 'form';
		errors[key] ??= def ? `${def.label} ${issue.message}` : issue.message;
	}
	if (!Object.keys(errors).length) errors.form = message;
	return errors;
}

export async function answerQuestion(
	question: Question,
	values: FieldValues,
	units: UnitSystem,
	fetcher: typeof fetch,
	signal?: AbortSignal
): Promise<Outcome> {
	const read = readFields(question.fields, values, units);
	if (!read.ok) return { ok: false, errors: read.errors };
	const body = question.toBody(read.parsed, units);
	const response = await fetcher(question.route, {
		method: 'POST',
		headers: { 'content-type': 'application/json', accept: 'application/json' },
		body: JSON.stringify(body),
		signal
	});
	let data: unknown;
	try {
		data = await response.json();
	} catch {
		return { ok: false, errors: { form: `The calculator answered ${response.status} without a result.` } };
	}
	if (!response.ok) {
		const err = (data as { error?: { message?: string; issues?: ApiIssue[] } })?.error;
		return { ok: false, errors: errorsFromApi(question, err?.issues ?? [], err?.message ?? `Error ${response.status}`) };
	}
	return { ok: true, answer: question.describe(body, data, units) };
}
