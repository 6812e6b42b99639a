import { json } from '@sveltejs/kit';
import { apiRoute, parseJsonBody } from '$lib/server/http';
import { requireUser } from '$lib/server/authz';
import { getSetup, saveSetup, trashSetup } from '$lib/server/setups';
import { setupSaveSchema } from '$lib/scene/inputs';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiRoute(async ({ locals, params }) => json(await getSetup(locals.user, params.id)));

/** Save: a new revision on `baseRevision`; 409 `{ error, latestRevision }` when that is not the latest. */
export const PUT: RequestHandler = apiRoute(async ({ locals, params, request }) => {
	const user = requireUser(locals.user);
	const body = await parseJsonBody(request, setupSaveSchema);
	if (!body.ok) return body.response;
	return json(await saveSetup(user, params.id, body.data));
});

/** To the studio's trash (204); POST …/untrash brings it back. */
export const DELETE: RequestHandler = apiRoute(async ({ locals, params }) => {
	await trashSetup(locals.user, params.id);
	return new Response(null, { status: 204 });
});
