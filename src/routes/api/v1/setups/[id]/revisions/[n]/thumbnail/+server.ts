import { apiRoute } from '$lib/server/http';
import { requireUser } from '$lib/server/authz';
import { requiredRevisionNumber } from '$lib/server/api-params';
import { getRevisionThumbnail } from '$lib/server/setups';
import type { RequestHandler } from './$types';

/** The PNG thumbnail of revision n's plan (404 when it has none). Revisions never change: cache it. */
export const GET: RequestHandler = apiRoute(async ({ locals, params }) => {
	const user = requireUser(locals.user);
	const png = await getRevisionThumbnail(user, params.id, requiredRevisionNumber(params.n));
	return new Response(png as Uint8Array<ArrayBuffer>, {
		headers: { 'content-type': 'image/png', 'cache-control': 'private, max-age=31536000, immutable' }
	});
});
