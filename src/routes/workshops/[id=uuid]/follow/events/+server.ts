// GET: the workshop's live position as Server-Sent Events, for its students and instructors (anyone
// else: 404). See src/lib/server/live/ and DEVELOPERS.md, "Presenting and following live".
import { requireUser } from '$lib/server/authz';
import { apiRoute } from '$lib/server/http';
import { followResponse, liveHub } from '$lib/server/live';
import { livePosition, mayFollow } from '$lib/server/live/present-data';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiRoute(async ({ params, request, locals }) => {
	const user = requireUser(locals.user);
	await mayFollow(user, params.id);
	const hub = await liveHub();
	return followResponse(hub, request, params.id, () => livePosition(user, params.id));
});
