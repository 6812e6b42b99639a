import { apiRoute } from '$lib/server/http';
import { shotImage } from '$lib/server/shots';
import type { RequestHandler } from './$types';

/** original (as uploaded), preview (upright JPEG, 1600 px) or thumbnail (320 px); asks authz every time. */
export const GET: RequestHandler = apiRoute(async ({ locals, params }) => {
	const image = await shotImage(locals.user, params.id, params.shotId, params.variant);
	const headers: Record<string, string> = {
		'content-type': image.contentType,
		// Private: the image is only for callers authz lets through; it never changes under its URL.
		'cache-control': 'private, max-age=86400',
		'x-content-type-options': 'nosniff'
	};
	if (params.variant === 'original') headers['content-disposition'] = `inline; filename*=UTF-8''${encodeURIComponent(image.fileName)}`;
	return new Response(image.bytes as Uint8Array<ArrayBuffer>, { headers });
});
