import { error } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { exportSetup, setupFileResponse } from '$lib/server/setups-export';
import type { RequestHandler } from './$types';

/**
 * The setup file download behind the setup page's "Export JSON": the same file as the setups API's
 * export (our own format, with its `formatVersion`) of the latest revision or of `?revision=n`. A refusal
 * is the page's refusal (sign-in, 403, 404) rather than a JSON error body.
 */
export const GET: RequestHandler = async ({ params, url, locals }) => {
	const user = requireUser(locals.user, url);
	const revision = url.searchParams.get('revision');
	if (revision !== null && !/^[1-9]\d{0,8}$/.test(revision)) error(400, 'revision must be a revision number.');
	return setupFileResponse(await exportSetup(user, params.id, revision === null ? undefined : Number(revision)));
};
