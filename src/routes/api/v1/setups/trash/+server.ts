import { json } from '@sveltejs/kit';
import { apiRoute, zodErrorResponse } from '$lib/server/http';
import { requireUser } from '$lib/server/authz';
import { listTrash } from '$lib/server/setups';
import { queryObject, setupListQuerySchema } from '$lib/scene/inputs';
import type { RequestHandler } from './$types';

/** Deleted setups, newest deletion first; same query as the list. Restore with POST …/:id/untrash. */
export const GET: RequestHandler = apiRoute(async ({ locals, url }) => {
	const user = requireUser(locals.user);
	const query = setupListQuerySchema.safeParse(queryObject(url));
	if (!query.success) return zodErrorResponse(query.error);
	return json(await listTrash(user, query.data));
});
