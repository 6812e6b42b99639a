import { requireUser } from '$lib/server/authz';
import { workshopLessonsForViewer, workshopOverview } from '$lib/server/workshops';

export async function load({ locals, params, url }) {
	const user = requireUser(locals.user, url);
	const [overview, lessons] = await Promise.all([workshopOverview(user, params.id), workshopLessonsForViewer(user, params.id)]);
	return {
		workshop: { id: overview.workshop.id, title: overview.workshop.title },
		title: overview.workshop.title,
		lessons: lessons.map(({ lesson, steps }) => ({ lesson: { ...lesson, presenterNotes: null, presenterNotesHtml: null }, steps })),
		unitSystem: user.unitSystem
	};
}
