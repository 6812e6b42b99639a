import { json } from '@sveltejs/kit';
import { apiRoute, parseJsonBody } from '$lib/server/http';
import { requireUser } from '$lib/server/authz';
import { getShot, trashShot, updateShot } from '$lib/server/shots';
import { shotUpdateSchema } from '$lib/shots/types';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiRoute(async ({ locals, params }) => json(await getShot(locals.user, params.id, params.shotId)));

/** Typed values (null clears one), the revision the shot was made from, its shooting session. */
export const PATCH: RequestHandler = apiRoute(async ({ locals, params, request }) => {
	requireUser(locals.user);
	const body = await parseJsonBody(request, shotUpdateSchema);
	if (!body.ok) return body.response;
	return json(await updateShot(locals.user, params.id, params.shotId, body.data));
});

/** To the trash (restore with POST …/restore). */
export const DELETE: RequestHandler = apiRoute(async ({ locals, params }) => json(await trashShot(locals.user, params.id, params.shotId)));
