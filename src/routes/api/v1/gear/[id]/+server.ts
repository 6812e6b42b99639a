import { json } from '@sveltejs/kit';
import { apiRoute, parseJsonBody } from '$lib/server/http';
import { requireUser } from '$lib/server/authz';
import { getGear, updateGear } from '$lib/server/gear';
import { gearUpdateSchema } from '$lib/scene/gear';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiRoute(async ({ locals, params }) => json(await getGear(locals.user, params.id)));

/** `{ name?, spec?, notes?, retired? }`: edit, retire (`retired: true`) or return an item to the shelf. */
export const PATCH: RequestHandler = apiRoute(async ({ locals, params, request }) => {
	const user = requireUser(locals.user);
	const body = await parseJsonBody(request, gearUpdateSchema);
	if (!body.ok) return body.response;
	return json(await updateGear(user, params.id, body.data));
});
