// Answers during a database outage: 503 with our words instead of a sign-out (401, a redirect to
// /signin), a 500 or a hung request, and the session cookie left alone. Recovery needs nothing: the
// next request after the database returns is answered as usual.
import { json, type Handle, type HandleServerError, type RequestEvent } from '@sveltejs/kit';
import { getRequestEvent } from '$app/server';
import { env } from '$env/dynamic/private';
import { DatabaseUnreachable, isDatabaseUnreachable } from '$lib/server/db/unreachable';
import { apiError } from '$lib/server/http';
import { OUTAGE_MESSAGE, OUTAGE_REASON, OUTAGE_TITLE } from '$lib/outage';

/** How long a client should wait before asking again (the Retry-After header), in seconds. */
const RETRY_AFTER_S = 5;

const outageError: App.Error = { message: OUTAGE_MESSAGE, reason: OUTAGE_REASON };

function databasePort(): number | null {
	try {
		return Number(new URL(env.DATABASE_URL ?? '').port || 5432);
	} catch {
		return null;
	}
}

function unreachable(e: unknown): boolean {
	return isDatabaseUnreachable(e, databasePort());
}

/** The calculation API and health need no database and no caller: they keep answering during an outage. */
export function needsNoDatabase(routeId: string | null): boolean {
	return routeId === '/api/v1/exposure' || routeId === '/api/v1/health' || (routeId?.startsWith('/api/v1/calc/') ?? false);
}

/**
 * Marks the current request as having met an unreachable database. Auth.js logs and swallows the
 * errors of its own lookups (a failed session lookup reads as "no session"), so its logger calls this.
 * Says whether the error was an unreachable database.
 */
export function noteIfUnreachable(e: unknown): boolean {
	if (!unreachable(e)) return false;
	try {
		getRequestEvent().locals.databaseUnreachable = true;
	} catch {
		/* outside a request: nothing to mark */
	}
	return true;
}

/**
 * Route errors (a load or an endpoint whose query failed): an unreachable database gets our words and
 * the mark for `answerDuringOutage`; every other error goes on to `next`.
 */
export function handleOutages(next: HandleServerError): HandleServerError {
	return (input) => {
		if (!unreachable(input.error)) return next(input);
		input.event.locals.databaseUnreachable = true;
		return outageError;
	};
}

/**
 * Wraps `identify`: when the caller's session or token could not be looked up because the database
 * is away, the request is an outage, never an anonymous caller, except on the routes that need no
 * caller at all (the calculation API), which go on as for an anonymous one.
 */
export function identifyThroughOutages(identify: Handle): Handle {
	return async ({ event, resolve }) => {
		const callerOptional = needsNoDatabase(event.route.id);
		try {
			return await identify({
				event,
				resolve: (e, opts) => {
					if (e.locals.databaseUnreachable && !callerOptional) throw new DatabaseUnreachable();
					return resolve(e, opts);
				}
			});
		} catch (e) {
			// Errors of the route itself never reach here (SvelteKit turns them into responses).
			if (!callerOptional || !unreachable(e)) throw e;
			event.locals.user = null;
			event.locals.authMethod = null;
			return resolve(event);
		}
	};
}

/**
 * First in the chain: any request that met an unreachable database (thrown out of a hook, reported
 * by `handleError` or by Auth.js's logger) is answered with 503: API.md's error body for JSON routes,
 * SvelteKit's error shape for a client-side navigation or an enhanced form, and a page of our own for
 * everything else.
 */
export const answerDuringOutage: Handle = async ({ event, resolve }) => {
	let response: Response;
	try {
		response = await resolve(event);
	} catch (e) {
		if (!unreachable(e)) throw e;
		return outageAnswer(event);
	}
	if (event.locals.databaseUnreachable && !needsNoDatabase(event.route.id)) return outageAnswer(event);
	return response;
};

function outageAnswer(event: RequestEvent): Response {
	console.error(`[outage] ${event.request.method} ${event.url.pathname}: 503, the database is unreachable`);
	// `securityHeaders` is further down the chain and never sees these answers.
	const headers = {
		'retry-after': String(RETRY_AFTER_S),
		'cache-control': 'no-store',
		'x-content-type-options': 'nosniff',
		'referrer-policy': 'same-origin',
		'x-frame-options': 'DENY'
	};
	let response: Response;
	if (event.url.pathname.startsWith('/api/')) {
		response = apiError(503, `${OUTAGE_TITLE}. ${OUTAGE_MESSAGE}`);
	} else if (event.isDataRequest) {
		// SvelteKit's client shows this body on the error page, with the status.
		response = json(outageError, { status: 503 });
	} else if (event.request.headers.get('x-sveltekit-action') === 'true') {
		// A form sent by `use:enhance` reads an action result.
		response = json({ type: 'error', error: outageError }, { status: 503 });
	} else {
		response = new Response(outagePage(), {
			status: 503,
			headers: {
				'content-type': 'text/html; charset=utf-8',
				// The page's own policy: its one script is the theme switch, its style is inline.
				'content-security-policy':
					"default-src 'none'; script-src 'self'; style-src 'unsafe-inline'; img-src 'self'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'"
			}
		});
	}
	for (const [name, value] of Object.entries(headers)) response.headers.set(name, value);
	return response;
}

/**
 * A page that needs nothing the outage could take away: no layout data, no database, no built
 * assets but the favicon and the theme switch (`static/theme.js`, which sets the dark class).
 */
function outagePage(): string {
	return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="color-scheme" content="light dark">
<title>${OUTAGE_TITLE} · Squarelaw</title>
<link rel="icon" href="/favicon.svg" type="image/svg+xml">
<script src="/theme.js"></script>
<style>
	:root { --bg: #f7f5f0; --card: #ffffff; --line: #c6ccd1; --text: #171b1f; --muted: #5a6570; --accent: #d9822b; --btn: #252b31; --btn-text: #f7f5f0; }
	html.dark { --bg: #0e1114; --card: #171b1f; --line: #363e46; --text: #e3e6e8; --muted: #a0a9b1; --accent: #f2b872; --btn: #e3e6e8; --btn-text: #171b1f; }
	html { background: var(--bg); color: var(--text); font-family: 'Work Sans', system-ui, sans-serif; }
	body { margin: 0; padding: 3rem 1rem; }
	main { max-width: 32rem; margin: 0 auto; background: var(--card); border: 1px solid var(--line); border-top: 4px solid var(--accent); border-radius: 8px; padding: 1.5rem; }
	.brand { display: flex; align-items: center; gap: 0.5rem; margin: 0 0 1rem; font-weight: 600; letter-spacing: 0.04em; }
	.brand img { width: 1.5rem; height: 1.5rem; }
	h1 { font-size: 1.5rem; font-weight: 600; margin: 0 0 0.75rem; }
	p { line-height: 1.5; margin: 0 0 1rem; }
	.small { color: var(--muted); font-size: 0.875rem; }
	a.btn { display: inline-block; background: var(--btn); color: var(--btn-text); padding: 0.5rem 1rem; border-radius: 6px; text-decoration: none; font-weight: 500; }
	a { color: inherit; }
</style>
<noscript><style>@media (prefers-color-scheme: dark) { :root { --bg: #0e1114; --card: #171b1f; --line: #363e46; --text: #e3e6e8; --muted: #a0a9b1; --accent: #f2b872; --btn: #e3e6e8; --btn-text: #171b1f; } }</style></noscript>
</head>
<body>
<main data-testid="outage">
	<p class="brand"><img src="/favicon.svg" alt="">SQUARELAW</p>
	<h1>${OUTAGE_TITLE}</h1>
	<p>${OUTAGE_MESSAGE}</p>
	<p><a class="btn" href="">Try again</a></p>
	<p class="small">Error 503: the service is unavailable for now.</p>
</main>
</body>
</html>
`;
}
