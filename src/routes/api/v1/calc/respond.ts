/**
 * One handler shape for every calculation route: read and validate the body (413 / 400 from
 * `parseJsonBody`), run the engine, and answer JSON. Nothing the client sends can make a 500: an
 * unexpected throw from the engine or a result that is not finite becomes a 400 naming the problem.
 */
import type { RequestHandler } from '@sveltejs/kit';
import type { z } from 'zod';
import { apiError, parseJsonBody } from '$lib/server/http';
import { findNonFinite } from '$lib/light/finite';

export function calculationRoute<S extends z.ZodType>(schema: S, compute: (input: z.output<S>) => unknown): RequestHandler {
	return async ({ request }) => {
		const parsed = await parseJsonBody(request, schema);
		if (!parsed.ok) return parsed.response;
		let result: unknown;
		try {
			result = compute(parsed.data);
		} catch (e) {
			const why = e instanceof Error ? e.message : 'unknown error';
			return apiError(400, `These values could not be worked out: ${why}`, [{ path: [], message: why }]);
		}
		const bad = findNonFinite(result);
		if (bad) {
			return apiError(400, `These values give no finite result (${bad.join('.')}); check the inputs are in range.`, [
				{ path: [], message: `no finite value for ${bad.join('.')}` }
			]);
		}
		return jsonResponse(result);
	};
}

const encoder = new TextEncoder();

/**
 * Like kit's `json()`, but the text is encoded once: `json()` encodes it to count the bytes and the
 * response encodes it again when it is sent. The exposure answer is several kilobytes, so this shows.
 */
function jsonResponse(result: unknown): Response {
	const bytes = encoder.encode(JSON.stringify(result));
	return new Response(bytes, {
		headers: { 'content-type': 'application/json', 'content-length': String(bytes.byteLength), 'cache-control': 'no-store' }
	});
}
