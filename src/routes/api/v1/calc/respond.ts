/**
 * One handler shape for every calculation route: read and validate the body (413 / 400 from
 * `parseJsonBody`), run the engine, and answer JSON. Nothing the client sends can make a 500: an
 * unexpected throw from the engine or a result that is not finite becomes a 400 naming the problem.
 */
import type { RequestHandler } from '@sveltejs/kit';
import type { z } from 'zod';
import { apiError, DEFAULT_MAX_BODY_BYTES, parseJsonBody } from '$lib/server/http';
import { fastAcceptor, type Acceptor } from '$lib/server/fast-accept';
import { CALCULATIONS, computeJsonSafely, type Calculation, type CalculationPath } from '$lib/light/calculations';
import { exposureSceneShape, sceneRuleIssues } from '$lib/light/schema';

/**
 * Routes whose bodies are large enough for zod's parse to weigh: a valid scene is accepted by the
 * compiled check (see fast-accept.ts); anything else goes through zod and its errors.
 */
const FAST_ACCEPTORS: Partial<Record<CalculationPath, () => Acceptor<unknown>>> = {
	'/api/v1/exposure': () => fastAcceptor(exposureSceneShape, sceneRuleIssues)
};

export function calculationRoute(path: CalculationPath): RequestHandler {
	const calc = CALCULATIONS[path] as Calculation<z.ZodType>;
	const fast = FAST_ACCEPTORS[path]?.();
	return async ({ request }) => {
		const parsed = await parseJsonBody(request, calc.schema, DEFAULT_MAX_BODY_BYTES, fast);
		if (!parsed.ok) return parsed.response;
		const outcome = computeJsonSafely(calc, parsed.data);
		if (!outcome.ok) return apiError(400, outcome.message, outcome.issues);
		return jsonResponse(outcome.bytes);
	};
}

/**
 * Like kit's `json()`, but the answer comes encoded (`computeJsonSafely`), so it is encoded once:
 * `json()` encodes it to count the bytes and the response encodes it again when it is sent.
 */
function jsonResponse(bytes: Uint8Array<ArrayBuffer>): Response {
	return new Response(bytes, {
		headers: { 'content-type': 'application/json', 'content-length': String(bytes.byteLength), 'cache-control': 'no-store' }
	});
}
