import { isHttpError, json, type RequestEvent } from '@sveltejs/kit';
import type { z } from 'zod';
import { MAX_JSON_BODY_BYTES } from '$lib/scene/inputs';
import { RuleViolation } from './errors';
import { findJsonProblem, MAX_BODY_DEPTH } from '$lib/json-limits';

/** The error shape fixed by API.md for every JSON route. */
export interface ApiErrorBody {
	error: { message: string; issues: { path: string[]; message: string }[] };
}

export function apiError(
	status: number,
	message: string,
	issues: { path: string[]; message: string }[] = [],
	extra: Record<string, unknown> = {}
) {
	return json({ error: { message, issues }, ...extra } satisfies ApiErrorBody, { status });
}

/** The message of a 400 for bad input: it names the first field at fault. */
export function invalidInputMessage(issues: { path: string[]; message: string }[]): string {
	const first = issues[0];
	const where = first && first.path.length ? `${first.path.join('.')}: ` : '';
	return `Invalid input. ${where}${first?.message ?? 'check the body'}`;
}

/** API.md's 400 answer (/api/v1/openapi.json) naming every field at fault; the message names the first. */
export function invalidInput(issues: { path: string[]; message: string }[]) {
	return apiError(400, invalidInputMessage(issues), issues);
}

/** A zod error's issues with their paths as text, as the API's error body and the forms name fields. */
export function zodIssues(error: z.ZodError): { path: string[]; message: string }[] {
	return error.issues.map((issue) => ({ path: issue.path.map(String), message: issue.message }));
}

/** Turns a zod error into API.md's 400 answer, naming every field at fault. */
export function zodErrorResponse(error: z.ZodError) {
	return invalidInput(zodIssues(error));
}

/** The media type of a request's body, lower-case without parameters; null when not given. */
export function bodyMediaType(request: Request): string | null {
	const header = request.headers.get('content-type');
	return header ? header.split(';')[0].trim().toLowerCase() : null;
}

const notJson = () =>
	apiError(415, 'The body must be JSON, sent with Content-Type: application/json.', [
		{ path: [], message: 'send Content-Type: application/json' }
	]);

/** Derived with the thumbnail and document limits in `$lib/scene/inputs`, so a valid save always fits. */
export const DEFAULT_MAX_BODY_BYTES = MAX_JSON_BODY_BYTES;

type ParseResult<T> = { ok: true; data: T } | { ok: false; response: Response };

/**
 * Reads a JSON body with a size limit and validates it with `schema`.
 * A body that is not `application/json` gets 415, oversized bodies 413; unreadable JSON, text that
 * cannot be stored (NUL, a lone surrogate), nesting past `MAX_BODY_DEPTH` and schema failures get 400
 * naming the field; nothing here can throw a 500.
 */
export async function parseJsonBody<S extends z.ZodType>(
	request: Request,
	schema: S,
	maxBytes = DEFAULT_MAX_BODY_BYTES
): Promise<ParseResult<z.output<S>>> {
	const type = bodyMediaType(request);
	if (type !== null && type !== 'application/json') return { ok: false, response: notJson() };
	const declared = Number(request.headers.get('content-length') ?? '0');
	if (declared > maxBytes) {
		return { ok: false, response: apiError(413, `Body too large: at most ${maxBytes} bytes.`) };
	}
	let text: string;
	try {
		text = await readLimited(request, maxBytes);
	} catch (e) {
		if (e instanceof BodyTooLarge) {
			return { ok: false, response: apiError(413, `Body too large: at most ${maxBytes} bytes.`) };
		}
		return { ok: false, response: apiError(400, 'The body could not be read.') };
	}
	if (text.length && type === null) return { ok: false, response: notJson() };
	let raw: unknown;
	try {
		raw = text.length ? JSON.parse(text) : undefined;
	} catch {
		return {
			ok: false,
			response: apiError(400, 'The body is not valid JSON.', [{ path: [], message: 'Expected a JSON object' }])
		};
	}
	// One rule for every text field, and a bound on nesting, before any schema or the database sees it.
	const problem = findJsonProblem(raw, { maxDepth: MAX_BODY_DEPTH });
	if (problem) return { ok: false, response: invalidInput([problem]) };
	const parsed = schema.safeParse(raw);
	if (!parsed.success) return { ok: false, response: zodErrorResponse(parsed.error) };
	return { ok: true, data: parsed.data };
}

class BodyTooLarge extends Error {}

async function readLimited(request: Request, maxBytes: number): Promise<string> {
	if (!request.body) return '';
	const reader = request.body.getReader();
	const chunks: Uint8Array[] = [];
	let total = 0;
	for (;;) {
		const { done, value } = await reader.read();
		if (done) break;
		total += value.byteLength;
		// Past the limit the rest is read and dropped rather than cut off, so the client, still sending,
		// receives the 413 instead of a reset connection. adapter-node's BODY_SIZE_LIMIT caps the drain.
		if (total <= maxBytes) chunks.push(value);
	}
	if (total > maxBytes) throw new BodyTooLarge();
	// Buffer's own UTF-8 decoding (malformed bytes become U+FFFD, as with TextDecoder), without a copy
	// when the body came in one chunk, as a small one does.
	const bytes = chunks.length === 1 ? chunks[0] : Buffer.concat(chunks);
	return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('utf8');
}

/**
 * Reads a body as text with a size limit (for uploads such as a setup file). Returns null when the
 * body is over `maxBytes`.
 */
export async function readBodyText(request: Request, maxBytes: number): Promise<string | null> {
	const declared = Number(request.headers.get('content-length') ?? '0');
	if (declared > maxBytes) return null;
	try {
		return await readLimited(request, maxBytes);
	} catch (e) {
		if (e instanceof BodyTooLarge) return null;
		throw e;
	}
}

/**
 * Wraps a JSON route handler so that a refusal thrown with SvelteKit's `error()` (401, 403, 404, …) or a
 * `RuleViolation` becomes the API's error body with the same status. A RuleViolation may carry `issues`
 * (else its `field` names the one at fault) and `extra` fields for the body (e.g. `latestRevision` on a
 * 409). Anything else is a bug and is left to SvelteKit.
 */
export function apiRoute<E extends RequestEvent>(handler: (event: E) => Response | Promise<Response>) {
	return async (event: E): Promise<Response> => {
		try {
			const response = await handler(event);
			// A body refused unread leaves the rest of it on the socket: tell the client not to reuse it.
			if (response.status === 413) response.headers.set('connection', 'close');
			return response;
		} catch (e) {
			if (isHttpError(e)) return apiError(e.status, e.body.message);
			if (e instanceof RuleViolation) {
				const extra = (e as RuleViolation & { extra?: Record<string, unknown> }).extra;
				return apiError(e.status, e.message, e.issues, extra ?? {});
			}
			throw e;
		}
	};
}
