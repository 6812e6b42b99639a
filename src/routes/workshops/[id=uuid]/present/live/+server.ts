// POST { stepId }: the instructor's projector moved to a step (null: stopped presenting). Stores the
// live position and tells every app server's followers (NOTIFY). Session only (no tokens outside /api).
import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireUser } from '$lib/server/authz';
import { apiRoute, parseJsonBody } from '$lib/server/http';
import { moveLive } from '$lib/server/live/present-data';
import type { RequestHandler } from './$types';

const moveSchema = z.object({ stepId: z.uuid({ error: 'must be the id of a step of this workshop' }).nullable() });

export const POST: RequestHandler = apiRoute(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	const body = await parseJsonBody(request, moveSchema);
	if (!body.ok) return body.response;
	return json(await moveLive(user, params.id, body.data.stepId));
});
