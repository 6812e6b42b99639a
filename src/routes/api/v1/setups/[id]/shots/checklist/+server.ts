import { json } from '@sveltejs/kit';
import { apiRoute, parseJsonBody } from '$lib/server/http';
import { requireUser } from '$lib/server/authz';
import { getChecklist, setChecklist } from '$lib/server/shots-sessions';
import { checklistSchema } from '$lib/shots/types';
import type { RequestHandler } from './$types';

/** The pre-shot checklist of the setup's studio. */
export const GET: RequestHandler = apiRoute(async ({ locals, params }) => json(await getChecklist(locals.user, params.id)));

/** Replaces the studio's checklist (editors and owners). */
export const PUT: RequestHandler = apiRoute(async ({ locals, params, request }) => {
	requireUser(locals.user);
	const body = await parseJsonBody(request, checklistSchema);
	if (!body.ok) return body.response;
	return json(await setChecklist(locals.user, params.id, body.data.items));
});
