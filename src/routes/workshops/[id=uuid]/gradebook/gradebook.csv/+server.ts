import { csvFileName, gradebook, gradebookCsv } from '$lib/server/exercises';

/** The workshop's whole gradebook as CSV, for reviewers: a line a student and exercise. */
export async function GET({ locals, params }) {
	const { workshop, exercises } = await gradebook(locals.user, params.id);
	return new Response(gradebookCsv(exercises), {
		headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${csvFileName(workshop, 'gradebook')}"` }
	});
}
