import { requireUser } from '$lib/server/authz';
import { lessonForViewer } from '$lib/server/workshops';

export async function load({ locals, params, url }) {
	const user = requireUser(locals.user, url);
	const { workshop, lesson, steps } = await lessonForViewer(user, params.id, params.lessonId);
	return {
		workshop: { id: workshop.id, title: workshop.title },
		title: lesson.title,
		// A handout goes to students: never the presenter's notes.
		lessons: [{ lesson: { ...lesson, presenterNotes: null, presenterNotesHtml: null }, steps }],
		unitSystem: user.unitSystem
	};
}
