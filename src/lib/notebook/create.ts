/**
 * Making a setup from the new-setup form (studio, title, subject): one reading of the form and the same
 * checks and error messages for the notebook's small form and the editor's new-setup page, whether the
 * browser sends it to POST /api/v1/setups (`createSetupFrom`) or a form action calls the service
 * (`createSetupFromForm` in `$lib/server/setups-changes`). Field errors come back by name.
 */
import type { SetupDocument } from '$lib/scene/document';
import { callApi, issuesByField, type ApiIssue, type Fetch } from './api';

export type NewSetupValues = {
	studioId: string;
	title: string;
	subject: string;
};

export type CreateOutcome =
	| { ok: true; id: string }
	| { ok: false; status: number; errors: Record<string, string> };

export function readNewSetupForm(form: FormData): NewSetupValues {
	return {
		studioId: String(form.get('studioId') ?? ''),
		title: String(form.get('title') ?? ''),
		subject: String(form.get('subject') ?? '')
	};
}

/** What the form says before anything is sent: a setup needs a title. */
export function newSetupProblems(values: NewSetupValues): Record<string, string> | null {
	return values.title.trim() ? null : { title: 'Give the setup a title.' };
}

/** The input of POST /api/v1/setups (`setupCreateSchema`) from the form and the plan. */
export function newSetupInput(values: NewSetupValues, document: SetupDocument, thumbnailPng?: string | null) {
	return {
		...(values.studioId ? { studioId: values.studioId } : {}),
		title: values.title,
		subject: values.subject,
		document,
		...(thumbnailPng ? { thumbnailPng } : {})
	};
}

/** A refusal as the form shows it: each field's first issue beside it, anything else under the form. */
export function newSetupErrors(failure: { status: number; message: string; issues: ApiIssue[] }): Record<string, string> {
	const errors = issuesByField(failure.issues, ['studioId', 'title', 'subject']);
	if (!Object.keys(errors).length || (failure.status !== 400 && !errors.form)) errors.form = failure.message;
	return errors;
}

/** From the browser (the editor's new-setup page, with its plan and thumbnail). */
export async function createSetupFrom(fetchFn: Fetch, values: NewSetupValues, document: SetupDocument, thumbnailPng?: string | null): Promise<CreateOutcome> {
	const problems = newSetupProblems(values);
	if (problems) return { ok: false, status: 400, errors: problems };
	const r = await callApi<{ id: string }>(fetchFn, '/api/v1/setups', { method: 'POST', body: newSetupInput(values, document, thumbnailPng) });
	return r.ok ? { ok: true, id: r.data.id } : { ok: false, status: r.status, errors: newSetupErrors(r) };
}
