/**
 * Making a setup from the new-setup form (studio, title, subject): the same checks for the notebook's
 * small form and the editor's new-setup page, then POST /api/v1/setups. Field errors come back by name.
 */
import type { SetupDocument } from '$lib/scene/document';
import { callApi, issuesByField, type Fetch } from './api';

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

export async function createSetupFrom(fetchFn: Fetch, values: NewSetupValues, document: SetupDocument, thumbnailPng?: string | null): Promise<CreateOutcome> {
	if (!values.title.trim()) return { ok: false, status: 400, errors: { title: 'Give the setup a title.' } };
	const r = await callApi<{ id: string }>(fetchFn, '/api/v1/setups', {
		method: 'POST',
		body: {
			...(values.studioId ? { studioId: values.studioId } : {}),
			title: values.title,
			subject: values.subject,
			document,
			...(thumbnailPng ? { thumbnailPng } : {})
		}
	});
	if (r.ok) return { ok: true, id: r.data.id };
	const errors = issuesByField(r.issues, ['studioId', 'title', 'subject']);
	if (!Object.keys(errors).length || (r.status !== 400 && !errors.form)) errors.form = r.message;
	return { ok: false, status: r.status, errors };
}
