/**
 * The request edge: rules that hold for every route, so no route has to remember them.
 *
 * - Form posts from another origin are refused (SvelteKit's own check, done here so that a path under
 *   `/api/` answers in API.md's error shape; `kit.csrf` in svelte.config.js hands the check to us).
 * - Text that PostgreSQL cannot store (a NUL, a lone surrogate) in a query or a form body is refused with
 *   400 naming the field. JSON bodies meet the same rule in `parseJsonBody` (http.ts), which parses them anyway,
 *   and the shots upload's multipart body in its route, which reads it as a stream.
 * - Under `/api/`, any 5xx answers in API.md's error shape, even one SvelteKit wrote.
 * - What is personal is never cached: HTML and JSON to a signed-in caller, and the notebook's API.
 */
import { error, isHttpError, isRedirect, json, text, type Handle, type HandleServerError, type RequestEvent } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { stringify } from 'devalue';
import { printableKey, unstorableTextProblem } from '$lib/json-limits';
import { apiError, bodyMediaType, invalidInput } from './http';

const WRITES = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);
/** The bodies a plain HTML form can send to another site without asking first (SvelteKit's list). */
const FORM_TYPES = new Set(['application/x-www-form-urlencoded', 'multipart/form-data', 'text/plain']);

const isApi = (event: RequestEvent) => event.url.pathname.startsWith('/api/');
const SHOTS_UPLOAD = /^\/api\/v1\/setups\/[^/]+\/shots\/?$/;

/**
 * Each request's unexpected error id, for an answer SvelteKit wrote as HTML without it. Keyed by the
 * request: SvelteKit hands `handleError` an event object of its own.
 */
const errorIds = new WeakMap<Request, string>();

/** An unexpected error's id: in the log beside the stack and in the answer, so a report can be matched. */
function reportUnexpected(e: unknown, event: RequestEvent): string {
	const errorId = crypto.randomUUID();
	console.error(`[${errorId}] ${event.request.method} ${event.url.pathname}`, e);
	errorIds.set(event.request, errorId);
	return errorId;
}

const UNEXPECTED = 'Something went wrong on our side; nothing you sent was lost. Try again, or report the error id.';

/** SvelteKit's hook for errors nobody expected: logged with an id, answered without details. */
export const handleUnexpected: HandleServerError = ({ error: e, event, status, message }) => {
	if (status < 500) return { message };
	return { message: UNEXPECTED, errorId: reportUnexpected(e, event) };
};

/**
 * SvelteKit's cross-site form check, in the same terms: a write whose body a form could have sent, from
 * an origin other than this site's, is refused with 403.
 */
const refuseCrossSiteForms: Handle = ({ event, resolve }) => {
	const { method } = event.request;
	const type = bodyMediaType(event.request);
	if (!WRITES.has(method) || type === null || !FORM_TYPES.has(type)) return resolve(event);
	if (event.request.headers.get('origin') === event.url.origin) return resolve(event);
	const message = `Cross-site ${method} form submissions are forbidden`;
	if (isApi(event)) return apiError(403, message, [{ path: [], message: 'send the request from this site, or send JSON' }]);
	if (event.request.headers.get('accept') === 'application/json') return json({ message }, { status: 403 });
	return text(message, { status: 403 });
};

/** The first field of a form or query whose name or text cannot be stored; files are not text and are skipped. */
export function unstorableField(form: Iterable<[string, FormDataEntryValue]>): { field: string; message: string } | null {
	for (const [name, value] of form) {
		const nameProblem = unstorableTextProblem(name);
		if (nameProblem) return { field: printableKey(name), message: `(a field name) ${nameProblem}` };
		if (typeof value !== 'string') continue;
		const problem = unstorableTextProblem(value);
		if (problem) return { field: name, message: problem };
	}
	return null;
}

/** The named form action a page request asks for (`?/notes`), as SvelteKit reads it. */
function actionName(url: URL): string {
	for (const [key] of url.searchParams) if (key.startsWith('/')) return key.slice(1);
	return 'default';
}

/**
 * Refuses a query or form body holding text that cannot be stored, before any action or route sees it.
 * A page's form action sent by `use:enhance` gets the failure it would get from `fail(400, { action,
 * values, errors })`, so the page shows the message beside the field; a form posted without JavaScript,
 * or a page's query, gets SvelteKit's error page (400) naming the field; a path under `/api/` gets
 * API.md's 400.
 */
const refuseUnstorableText: Handle = async ({ event, resolve }) => {
	const inQuery = unstorableField(event.url.searchParams);
	if (inQuery) {
		if (isApi(event)) return invalidInput([{ path: [inQuery.field], message: inQuery.message }]);
		error(400, `${inQuery.field}: ${inQuery.message}`);
	}
	const type = bodyMediaType(event.request);
	if (!WRITES.has(event.request.method) || (type !== 'application/x-www-form-urlencoded' && type !== 'multipart/form-data')) {
		return resolve(event);
	}
	// The shots upload reads its body as it arrives and checks its fields with unstorableField itself: a
	// copy of its photographs here would cost more than the check.
	if (type === 'multipart/form-data' && SHOTS_UPLOAD.test(event.url.pathname)) return resolve(event);
	let form: FormData;
	try {
		form = await event.request.clone().formData();
	} catch {
		return resolve(event); // unreadable: the route answers it as it would any malformed form
	}
	const found = unstorableField(form);
	if (!found) return resolve(event);
	if (isApi(event)) return invalidInput([{ path: [found.field], message: found.message }]);
	if ((event.request.headers.get('accept') ?? '').includes('application/json') && event.request.method === 'POST') {
		const values: Record<string, string> = {};
		for (const [name, value] of form) if (typeof value === 'string' && !(name in values)) values[name] = value;
		const data = { action: actionName(event.url), values, errors: { [found.field]: found.message } };
		return json({ type: 'failure', status: 400, data: stringify(data) }, { status: 400 });
	}
	error(400, `${found.field}: ${found.message}`);
};

/** An answer SvelteKit wrote for an error (`{ message }`, maybe an `errorId`), not one a route chose. */
function isKitErrorBody(body: unknown): body is { message: string; errorId?: string } {
	if (!body || typeof body !== 'object') return false;
	const keys = Object.keys(body);
	return typeof (body as { message?: unknown }).message === 'string' && keys.every((k) => k === 'message' || k === 'errorId');
}

/** A 5xx under `/api/` in API.md's shape; an answer already in a JSON shape of its own is kept. */
async function inApiShape(event: RequestEvent, response: Response): Promise<Response> {
	const errorId = errorIds.get(event.request);
	if ((response.headers.get('content-type') ?? '').includes('json')) {
		const body: unknown = await response
			.clone()
			.json()
			.catch(() => null);
		if (!isKitErrorBody(body)) return response;
		const id = body.errorId ?? errorId;
		return apiError(response.status, body.message, [], id ? { errorId: id } : {});
	}
	return apiError(response.status, UNEXPECTED, [], errorId ? { errorId } : {});
}

const NOTEBOOK_API = /^\/api\/v1\/(?:setups|gear)(?:\/|$)/;

/**
 * `Cache-Control: no-store` on what is personal: HTML and JSON answered to a signed-in caller, and every
 * answer of the notebook's API. An answer that already asks for private caching keeps it (a revision's
 * thumbnail never changes).
 */
function withoutCaching(event: RequestEvent, response: Response): Response {
	const type = response.headers.get('content-type') ?? '';
	const personal = Boolean(event.locals.user) && (type.includes('html') || type.includes('json'));
	if (!personal && !NOTEBOOK_API.test(event.url.pathname)) return response;
	if (/\bprivate\b/.test(response.headers.get('cache-control') ?? '')) return response;
	response.headers.set('cache-control', 'no-store');
	return response;
}

/** Outermost: sees every answer, including one made from an error thrown by a later hook. */
const answerSafely: Handle = async ({ event, resolve }) => {
	let response: Response;
	try {
		response = await resolve(event);
	} catch (e) {
		if (!isApi(event) || isRedirect(e)) throw e;
		response = isHttpError(e)
			? apiError(e.status, e.body.message)
			: apiError(500, UNEXPECTED, [], { errorId: reportUnexpected(e, event) });
	}
	if (isApi(event) && response.status >= 500) response = await inApiShape(event, response);
	return withoutCaching(event, response);
};

export const requestEdge = sequence(answerSafely, refuseCrossSiteForms, refuseUnstorableText);
