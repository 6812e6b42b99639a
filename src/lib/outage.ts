// What a person is told while the database is away: the same words on the server's own outage page,
// in JSON answers and on the error page a client-side navigation shows.

export const OUTAGE_REASON = 'database-unreachable';
export const OUTAGE_TITLE = 'The notebook is unreachable for a moment';
export const OUTAGE_MESSAGE =
	'Squarelaw cannot reach its database just now. You are still signed in and nothing you saved is lost. Try again in a minute.';
