import { error, redirect } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/**
 * The setup file download behind the setup page's "Export JSON": the setups API's export (our own
 * format, with its `formatVersion`) of the latest revision or of `?revision=n`, passed through with its
 * file name. A refusal is the page's refusal (sign-in, 403, 404) rather than a JSON error body.
 */
export const GET: RequestHandler = async ({ params, url, fetch, locals }) => {
	if (!locals.user) redirect(303, `/signin?callbackUrl=${encodeURIComponent(url.pathname + url.search)}`);
	const revision = url.searchParams.get('revision');
	if (revision !== null && !/^\d{1,9}$/.test(revision)) error(400, 'revision must be a revision number.');
	const res = await fetch(`/api/v1/setups/${encodeURIComponent(params.id)}/export${revision ? `?revision=${revision}` : ''}`);
	if (!res.ok) {
		let message = `The setup could not be exported (HTTP ${res.status}).`;
		try {
			const body = (await res.json()) as { error?: { message?: string } };
			if (body.error?.message) message = body.error.message;
		} catch {
			/* keep the plain message */
		}
		error(res.status, message);
	}
	const headers = new Headers({
		'content-type': res.headers.get('content-type') ?? 'application/json; charset=utf-8',
		'cache-control': 'no-store'
	});
	const disposition = res.headers.get('content-disposition');
	headers.set('content-disposition', disposition ?? `attachment; filename="setup-${params.id}.squarelaw.json"`);
	return new Response(await res.text(), { headers });
};
