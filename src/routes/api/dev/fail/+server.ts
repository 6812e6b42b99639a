import { apiError } from '$lib/server/http';
import { devMailboxEnabled } from '$lib/server/dev-mail';

/**
 * Development and tests only (where the local mailbox is open, never in production): a route that fails
 * the way a bug would, so the answer to an unexpected error can be checked end to end.
 */
export function GET() {
	if (!devMailboxEnabled()) return apiError(404, 'Not found.');
	throw new Error('A deliberate failure of /api/dev/fail');
}
