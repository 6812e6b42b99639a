import { env } from '$env/dynamic/private';
import { apiError } from '$lib/server/http';

/**
 * Development and tests only (where the local mail fake runs, never in production): a route that fails
 * the way a bug would, so the answer to an unexpected error can be checked end to end.
 */
export function GET() {
	if (!env.DEV_MAIL_URL) return apiError(404, 'Not found.');
	throw new Error('A deliberate failure of /api/dev/fail');
}
