import { json } from '@sveltejs/kit';
import { apiRoute, parseJsonBody } from '$lib/server/http';
import { requireUser } from '$lib/server/authz';
import { updateSession } from '$lib/server/shots-sessions';
import { sessionUpdateSchema } from '$lib/shots/types';
import type { RequestHandler } from './$types';

/** Date, note, and the checklist items ticked now (the whole set). */
export const PATCH: RequestHandler = apiRoute(async ({ locals, params, request }) => {
	requireUser(locals.user);
	const body = await parseJsonBody(request, sessionUpdateSchema);
	if (!body.ok) return body.response;
	return json(await updateSession(locals.user, params.id, params.sessionId, body.data));
});
