/**
 * One handler shape for every calculation route: read and validate the body with zod (413 / 400 from
 * `parseJsonBody`), run the engine, and answer JSON. Nothing the client sends can make a 500: an
 * unexpected throw from the engine or a result that is not finite becomes a 400 naming the problem.
 */
import { json, type RequestHandler } from '@sveltejs/kit';
import type { z } from 'zod';
import { apiError, parseJsonBody } from '$lib/server/http';
import { CALCULATIONS, computeSafely, type Calculation, type CalculationPath } from '$lib/light/calculations';

export function calculationRoute(path: CalculationPath): RequestHandler {
	const calc = CALCULATIONS[path] as Calculation<z.ZodType>;
	return async ({ request }) => {
		const parsed = await parseJsonBody(request, calc.schema);
		if (!parsed.ok) return parsed.response;
		const outcome = computeSafely(calc, parsed.data);
		if (!outcome.ok) return apiError(400, outcome.message, outcome.issues);
		return json(outcome.data, { headers: { 'cache-control': 'no-store' } });
	};
}
