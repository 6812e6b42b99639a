import { requireUser } from '$lib/server/authz';
import { presenterLesson } from '$lib/server/live/present-data';

export async function load({ params, url, locals }) {
	const user = requireUser(locals.user, url);
	return await presenterLesson(user, params.id, params.lesson);
}
