import { apiRoute } from '$lib/server/http';
import { requireUser } from '$lib/server/authz';
import { revisionNumberFrom } from '$lib/server/api-params';
import { exportSetup, setupFileResponse } from '$lib/server/setups-export';
import type { RequestHandler } from './$types';

/** The setup file of the latest revision (or `?revision=n`), as a download. */
export const GET: RequestHandler = apiRoute(async ({ locals, params, url }) => {
	const user = requireUser(locals.user);
	const revision = revisionNumberFrom(url.searchParams.get('revision'), 'revision') ?? undefined;
	return setupFileResponse(await exportSetup(user, params.id, revision));
});
