import { requireUser } from '$lib/server/authz';
import { followWorkshop } from '$lib/server/live/present-data';

export async function load({ params, url, locals }) {
	const user = requireUser(locals.user, url);
	const { workshop, lessons } = await followWorkshop(user, params.id);
	return { workshop, lessons, unitSystem: user.unitSystem };
}
