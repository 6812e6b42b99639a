import { json } from '@sveltejs/kit';
import { apiRoute, parseJsonBody, zodErrorResponse } from '$lib/server/http';
import { requireUser } from '$lib/server/authz';
import { createGear, listGear } from '$lib/server/gear';
import { gearCreateSchema, gearQuerySchema } from '$lib/scene/gear';
import type { RequestHandler } from './$types';

/** A studio's gear shelf (`?studio=`, default the caller's personal studio; `?kind=`; `?retired=1` to include retired). */
export const GET: RequestHandler = apiRoute(async ({ locals, url }) => {
	const user = requireUser(locals.user);
	const query = gearQuerySchema.safeParse(Object.fromEntries(url.searchParams));
	if (!query.success) return zodErrorResponse(query.error);
	const { studio, kind, retired } = query.data;
	return json(await listGear(user, { studioId: studio, kind, includeRetired: retired === '1' || retired === 'true' }));
});

/** A new item on the shelf: `{ studioId?, kind, name, spec, notes? }` → 201 the item. */
export const POST: RequestHandler = apiRoute(async ({ locals, request }) => {
	const user = requireUser(locals.user);
	const body = await parseJsonBody(request, gearCreateSchema);
	if (!body.ok) return body.response;
	return json(await createGear(user, body.data), { status: 201 });
});
