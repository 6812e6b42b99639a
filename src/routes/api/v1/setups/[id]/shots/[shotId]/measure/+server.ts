import { json } from '@sveltejs/kit';
import { apiRoute, parseJsonBody } from '$lib/server/http';
import { requireUser } from '$lib/server/authz';
import { measureShot } from '$lib/server/shots';
import { shotMeasureSchema } from '$lib/shots/types';
import type { RequestHandler } from './$types';

/** The actual exposure: a region of the original (fractions of the upright picture) or a meter reading. */
export const POST: RequestHandler = apiRoute(async ({ locals, params, request }) => {
	requireUser(locals.user);
	const body = await parseJsonBody(request, shotMeasureSchema);
	if (!body.ok) return body.response;
	return json(await measureShot(locals.user, params.id, params.shotId, body.data));
});
