import { json } from '@sveltejs/kit';
import { apiRoute, parseJsonBody, zodErrorResponse } from '$lib/server/http';
import { requireUser } from '$lib/server/authz';
import { createSetup, listSetupsFor } from '$lib/server/setups';
import { queryObject, setupCreateSchema, setupListQuerySchema } from '$lib/scene/inputs';
import type { RequestHandler } from './$types';

/** The notebook list: `?q=&tag=&subject=&gear=&studio=&sort=&order=&page=&pageSize=`. */
export const GET: RequestHandler = apiRoute(async ({ locals, url }) => {
	const user = requireUser(locals.user);
	const query = setupListQuerySchema.safeParse(queryObject(url));
	if (!query.success) return zodErrorResponse(query.error);
	return json(await listSetupsFor(user, query.data));
});

/** A new setup with its first revision: 201 `{ id, revisionNumber: 1 }`. */
export const POST: RequestHandler = apiRoute(async ({ locals, request }) => {
	const user = requireUser(locals.user);
	const body = await parseJsonBody(request, setupCreateSchema);
	if (!body.ok) return body.response;
	return json(await createSetup(user, body.data), { status: 201 });
});
