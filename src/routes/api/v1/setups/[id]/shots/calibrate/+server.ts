import { json } from '@sveltejs/kit';
import { apiRoute, parseJsonBody } from '$lib/server/http';
import { requireUser } from '$lib/server/authz';
import { calibrateFlash } from '$lib/server/calibrations';
import { calibrationSchema } from '$lib/shots/types';
import type { RequestHandler } from './$types';

/** Calibrates a gear-shelf flash from a measured shot of this setup or a flash-meter reading: 201. */
export const POST: RequestHandler = apiRoute(async ({ locals, params, request }) => {
	requireUser(locals.user);
	const body = await parseJsonBody(request, calibrationSchema);
	if (!body.ok) return body.response;
	return json(await calibrateFlash(locals.user, params.id, body.data), { status: 201 });
});
