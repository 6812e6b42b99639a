/**
 * One question, answered: read the typed fields, build the API body, ask the calculation, describe the
 * answer. The live client sends the body to the API route with `fetch` (and an AbortSignal); the form
 * actions and the page load run the same route's schema and engine directly (no internal HTTP).
 */
import type { UnitSystem } from '$lib/light/format';
import type { FieldErrors, FieldValues } from './fields';
import { readFields } from './parse';
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

/** How a body reaches its calculation: over HTTP from the browser, or a direct call on the server. */
export type Send = (route: string, body: unknown) => Promise<{ ok: true; data: unknown } | { ok: false; message: string; issues: ApiIssue[] }>;

/** The browser's way: POST to the API route; a newer request aborts this one through `signal`. */
export function sendByFetch(signal?: AbortSignal): Send {
	return async (route, body) => {
		const response = await fetch(route, {
			method: 'POST',
			headers: { 'content-type': 'application/json', accept: 'application/json' },
			body: JSON.stringify(body),
			signal
		});
		let data: unknown;
		try {
			data = await response.json();
		} catch {
			return { ok: false, message: `The calculator answered ${response.status} without a result.`, issues: [] };
		}
		if (response.ok) return { ok: true, data };
		const err = (data as { error?: { message?: string; issues?: ApiIssue[] } })?.error;
		return { ok: false, message: err?.message ?? `Error ${response.status}`, issues: err?.issues ?? [] };
	};
}

export async function answerQuestion(question: Question, values: FieldValues, units: UnitSystem, send: Send): Promise<Outcome> {
	const read = readFields(question.fields, values, units);
	if (!read.ok) return { ok: false, errors: read.errors };
	const body = question.toBody(read.parsed, units);
	const result = await send(question.route, body);
	if (!result.ok) return { ok: false, errors: errorsFromApi(question, result.issues, result.message) };
	return { ok: true, answer: question.describe(body, result.data, units) };
}
