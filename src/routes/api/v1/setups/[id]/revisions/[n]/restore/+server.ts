import { json } from '@sveltejs/kit';
import { apiRoute, parseJsonBody } from '$lib/server/http';
import { requireUser } from '$lib/server/authz';
import { requiredRevisionNumber } from '$lib/server/api-params';
import { restoreRevision } from '$lib/server/setups';
import { setupRestoreSchema } from '$lib/scene/inputs';
import type { RequestHandler } from './$types';

/** A new revision that copies revision n: 200 `{ revisionNumber }`. Optional body `{ message?, baseRevision? }`. */
export const POST: RequestHandler = apiRoute(async ({ locals, params, request }) => {
	const user = requireUser(locals.user);
	const n = requiredRevisionNumber(params.n);
	const body = await parseJsonBody(request, setupRestoreSchema);
	if (!body.ok) return body.response;
	return json(await restoreRevision(user, params.id, n, body.data));
});
