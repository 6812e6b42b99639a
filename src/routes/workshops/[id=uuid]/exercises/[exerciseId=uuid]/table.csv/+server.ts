import { csvFileName, exerciseTable, gradebookCsv } from '$lib/server/exercises';

/** The table of one exercise as CSV, for reviewers. */
export async function GET({ locals, params }) {
	const { exercise, workshop, rows } = await exerciseTable(locals.user, params.id, params.exerciseId);
	return new Response(gradebookCsv([{ exercise, rows }]), {
		headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${csvFileName(workshop, exercise.title)}"` }
	});
}
