import { json } from '@sveltejs/kit';
import { apiRoute, parseJsonBody } from '$lib/server/http';
import { requireUser } from '$lib/server/authz';
import { duplicateSetup } from '$lib/server/setups';
import { setupDuplicateSchema } from '$lib/scene/inputs';
import type { RequestHandler } from './$types';

/** A new setup for a new subject: 201 `{ id, revisionNumber: 1, derivedFrom: { setupId, revisionNumber } }`. */
export const POST: RequestHandler = apiRoute(async ({ locals, params, request }) => {
	const user = requireUser(locals.user);
	const body = await parseJsonBody(request, setupDuplicateSchema);
	if (!body.ok) return body.response;
	return json(await duplicateSetup(user, params.id, body.data), { status: 201 });
});
