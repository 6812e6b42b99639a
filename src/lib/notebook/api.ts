/**
 * Calling the setups API from the browser (the save panel, the notebook's search as you type, the
 * editor's new-setup page): one client and one error parser, for the contract in /api/v1/openapi.json.
 * Server code calls the services in `$lib/server` instead.
 */
import type { SetupDocument } from '$lib/scene/document';

export type Fetch = typeof fetch;

export interface ApiIssue {
	path: string[];
	message: string;
}

export type ApiResult<T> =
	| { ok: true; status: number; data: T }
	| { ok: false; status: number; message: string; issues: ApiIssue[]; body: Record<string, unknown> | null };

/** Sends a JSON request and reads the API's answer or its error body; never throws for an HTTP status. */
export async function callApi<T>(
	fetchFn: Fetch,
	path: string,
	init: { method?: string; body?: unknown; rawBody?: string; signal?: AbortSignal } = {}
): Promise<ApiResult<T>> {
	const headers: Record<string, string> = { accept: 'application/json' };
	let body: string | undefined;
	if (init.rawBody !== undefined) {
		headers['content-type'] = 'application/json';
		body = init.rawBody;
	} else if (init.body !== undefined) {
		headers['content-type'] = 'application/json';
		body = JSON.stringify(init.body);
	}
	const res = await fetchFn(path, { method: init.method ?? 'GET', headers, body, signal: init.signal });
	if (res.status === 204) return { ok: true, status: 204, data: null as T };
	let parsed: unknown = null;
	const text = await res.text();
	if (text) {
		try {
			parsed = JSON.parse(text);
		} catch {
			parsed = null;
		}
	}
	if (res.ok) return { ok: true, status: res.status, data: parsed as T };
	const bodyObj = parsed && typeof parsed === 'object' ? (parsed as Record<string, unknown>) : null;
	const err = bodyObj?.error;
	let message = `The request failed (HTTP ${res.status}).`;
	let issues: ApiIssue[] = [];
	if (err && typeof err === 'object') {
		const e = err as { message?: unknown; issues?: unknown };
		if (typeof e.message === 'string') message = e.message;
		if (Array.isArray(e.issues)) issues = e.issues.filter(isIssue);
	} else if (typeof err === 'string') {
		message = err;
	} else if (bodyObj && typeof bodyObj.message === 'string') {
		message = bodyObj.message;
	}
	return { ok: false, status: res.status, message, issues, body: bodyObj };
}

function isIssue(v: unknown): v is ApiIssue {
	return !!v && typeof v === 'object' && Array.isArray((v as ApiIssue).path) && typeof (v as ApiIssue).message === 'string';
}

/**
 * API issues as form errors keyed by their dotted path (`spec.guideNumberM`), the first message per
 * field. `strip` removes a leading path segment the form does not show (e.g. `document`). Issues with
 * no path, or a path no field claims, land under `form`.
 */
export function issuesByField(issues: ApiIssue[], fields?: readonly string[], fallback = 'form'): Record<string, string> {
	const out: Record<string, string> = {};
	for (const issue of issues) {
		const key = issue.path.join('.');
		const field = !fields ? key || fallback : (fields.find((f) => key === f || key.startsWith(f + '.')) ?? fallback);
		const text = field === fallback && key ? `${key}: ${issue.message}` : issue.message;
		if (!(field in out)) out[field] = text;
	}
	return out;
}

/** The list of the setups API (`GET /api/v1/setups`): its items are typed once, by the service that makes them. */
export type { SetupListItem, SetupListPage as SetupList } from '$lib/server/setups';

export interface SetupRecord<D = SetupDocument> {
	id: string;
	title: string;
	subject: string;
	tags: string[];
	studioId: string;
	revisionNumber: number;
	document: D;
	derivedFrom: { setupId: string; revisionNumber: number } | null;
	derivatives: { id: string; title: string }[];
	[extra: string]: unknown;
}

export interface RevisionSummary {
	number: number;
	authorName: string | null;
	createdAt: string;
	message: string | null;
	[extra: string]: unknown;
}

export interface RevisionRecord<D = SetupDocument> {
	number: number;
	document: D;
	authorName?: string | null;
	createdAt?: string;
	message?: string | null;
	[extra: string]: unknown;
}
