import { requireUser } from '$lib/server/authz';
import { gradebook } from '$lib/server/exercises';

export async function load({ locals, params, url }) {
	const user = requireUser(locals.user, url);
	const { workshop, exercises } = await gradebook(user, params.id);
	return {
		workshop: { id: workshop.id, title: workshop.title },
		exercises: exercises.map(({ exercise, rows }) => ({ id: exercise.id, title: exercise.title, dueAt: exercise.dueAt.toISOString(), targetCount: exercise.targets.length, rows }))
	};
}
