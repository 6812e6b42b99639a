import { json } from '@sveltejs/kit';
import { apiRoute } from '$lib/server/http';
import { requireUser } from '$lib/server/authz';
import { revisionNumberFrom } from '$lib/server/api-params';
import { setupExposure } from '$lib/server/setups';
import type { RequestHandler } from './$types';

/** The POST /api/v1/exposure answer for the latest revision (or `?revision=n`), computed from the stored scene. */
export const GET: RequestHandler = apiRoute(async ({ locals, params, url }) => {
	const user = requireUser(locals.user);
	const revision = revisionNumberFrom(url.searchParams.get('revision'), 'revision') ?? undefined;
	return json(await setupExposure(user, params.id, revision));
});
