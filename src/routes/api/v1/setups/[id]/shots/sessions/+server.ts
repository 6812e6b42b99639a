import { json } from '@sveltejs/kit';
import { apiRoute, parseJsonBody } from '$lib/server/http';
import { requireUser } from '$lib/server/authz';
import { createSession } from '$lib/server/shots-sessions';
import { sessionCreateSchema } from '$lib/shots/types';
import type { RequestHandler } from './$types';

/** A new shooting session (date and note): 201. */
export const POST: RequestHandler = apiRoute(async ({ locals, params, request }) => {
	requireUser(locals.user);
	const body = await parseJsonBody(request, sessionCreateSchema);
	if (!body.ok) return body.response;
	return json(await createSession(locals.user, params.id, body.data), { status: 201 });
});
