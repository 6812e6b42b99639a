import { json } from '@sveltejs/kit';
import { apiError, apiRoute, bodyMediaType, readBodyText, zodErrorResponse } from '$lib/server/http';
import { requireUser } from '$lib/server/authz';
import { importSetup } from '$lib/server/setups-export';
import { importQuerySchema, MAX_EXPORT_BYTES } from '$lib/scene/export';
import type { RequestHandler } from './$types';

const tooLarge = () =>
	apiError(413, `The file is too large; a setup file is at most ${MAX_EXPORT_BYTES / 1024} KiB.`, [
		{ path: [], message: `at most ${MAX_EXPORT_BYTES / 1024} KiB` }
	]);

/**
 * Makes a setup from a setup file (see src/lib/scene/README.md): the file's text as a JSON body, or a
 * multipart form with the file in `file` (any other body is a 415). `?studio=` picks the studio (the caller's personal one by
 * default). 201 `{ id, revisionNumber: 1 }`; a bad file is a 400 (413 when too large) naming the problem,
 * and creates nothing.
 */
export const POST: RequestHandler = apiRoute(async ({ locals, request, url }) => {
	const user = requireUser(locals.user);
	const query = importQuerySchema.safeParse({ studio: url.searchParams.get('studio') ?? undefined });
	if (!query.success) return zodErrorResponse(query.error);
	const type = bodyMediaType(request);
	let text: string | null;
	if (type === 'multipart/form-data') {
		let file: FormDataEntryValue | null = null;
		try {
			file = (await request.formData()).get('file');
		} catch {
			return apiError(400, 'The form could not be read.', [{ path: ['file'], message: 'send the setup file in a field named file' }]);
		}
		if (!(file instanceof File)) return apiError(400, 'No file was sent.', [{ path: ['file'], message: 'send the setup file in a field named file' }]);
		text = file.size > MAX_EXPORT_BYTES ? null : await file.text();
	} else if (type === 'application/json' || type === null) {
		text = await readBodyText(request, MAX_EXPORT_BYTES);
	} else {
		return apiError(415, 'Send the setup file as JSON (Content-Type: application/json) or as a form upload (multipart/form-data).', [
			{ path: [], message: 'send Content-Type: application/json' }
		]);
	}
	if (text === null) return tooLarge();
	return json(await importSetup(user, text, { studioId: query.data.studio }), { status: 201 });
});
