import { json } from '@sveltejs/kit';
import { apiRoute } from '$lib/server/http';
import { requireUser } from '$lib/server/authz';
import { requiredRevisionNumber } from '$lib/server/api-params';
import { getSetupRevision } from '$lib/server/setups';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiRoute(async ({ locals, params }) => {
	const user = requireUser(locals.user);
	return json(await getSetupRevision(user, params.id, requiredRevisionNumber(params.n)));
});
