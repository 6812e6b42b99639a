import { json } from '@sveltejs/kit';
import { apiError, apiRoute, bodyMediaType, invalidInput } from '$lib/server/http';
import { unstorableField } from '$lib/server/edge';
import { requireUser } from '$lib/server/authz';
import { listShots, shotLimits, uploadShots, type UploadFile } from '$lib/server/shots';
import { readUploadForm, type UploadForm } from '$lib/server/shots/upload-form';
import { shotListQuerySchema, shotUploadFieldsSchema } from '$lib/shots/types';
import { zodErrorResponse } from '$lib/server/http';
import type { RequestHandler } from './$types';

/** The setup's shots (`?trashed=1`: its trash), sessions and the means of actual − predicted. */
export const GET: RequestHandler = apiRoute(async ({ locals, params, url }) => {
	const query = shotListQuerySchema.safeParse(Object.fromEntries(url.searchParams));
	if (!query.success) return zodErrorResponse(query.error);
	return json(await listShots(locals.user, params.id, { trashed: query.data.trashed === '1' || query.data.trashed === 'true' }));
});

/**
 * Upload: a multipart form with one or more files in `files` (and optionally `sessionId`,
 * `revisionNumber`). 201 when every file went in, 207 when some did not: `{ created, failed }`, each
 * failure naming its file and what is wrong. A file is stored whole or not at all.
 */
export const POST: RequestHandler = apiRoute(async ({ locals, params, request }) => {
	requireUser(locals.user);
	if (bodyMediaType(request) !== 'multipart/form-data') {
		return apiError(415, 'Send the files as multipart/form-data in a field named files.', [{ path: ['files'], message: 'send multipart/form-data' }]);
	}
	let form: UploadForm;
	try {
		form = await readUploadForm(request, 'files', shotLimits().maxBytes);
	} catch {
		return apiError(400, 'The form could not be read (cut off, or larger than the server takes in one request).', [
			{ path: ['files'], message: 'send the files in a field named files' }
		]);
	}
	const unstorable = unstorableField(Object.entries(form.fields));
	if (unstorable) return invalidInput([{ path: [unstorable.field], message: unstorable.message }]);
	const fields = shotUploadFieldsSchema.safeParse({
		sessionId: form.fields.sessionId || undefined,
		revisionNumber: form.fields.revisionNumber || undefined
	});
	if (!fields.success) return zodErrorResponse(fields.error);
	const files: UploadFile[] = form.files.map((f) => ({ name: f.name, type: f.type, size: f.size, bytes: async () => f.bytes }));
	const result = await uploadShots(locals.user, params.id, files, fields.data);
	return json(result, { status: result.failed.length === 0 ? 201 : result.created.length ? 207 : 400 });
});
