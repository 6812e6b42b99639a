import { env } from '$env/dynamic/private';
import { building } from '$app/environment';
import { redirect, type Handle, type ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { authHandle } from './auth';
import { emailSchema } from '$lib/schemas/account';
import { userForAccessToken } from '$lib/server/db/queries/tokens';
import { hitRateLimits, type RateRule } from '$lib/server/db/queries/rate-limits';
import { tokenMayReach, tokenMayUse } from '$lib/server/authz';
import { apiError } from '$lib/server/http';
import { provesAddress, rememberProvenAddress, signInProofCookie } from '$lib/server/signin-proof';
import { answerDuringOutage, handleOutages, identifyThroughOutages } from '$lib/server/outage';
import { handleUnexpected, requestEdge } from '$lib/server/edge';
import { startRefundRetries } from '$lib/server/workshops/seats';

export const handleError = handleOutages(handleUnexpected);

/** Once the server starts: refunds that failed while the payment provider was away are tried again every few minutes. */
export const init: ServerInit = () => {
	if (!building) startRefundRetries();
};

/**
 * Sign-in links per IP address per 15 minutes. A workshop of thirty students behind one hall router
 * shares one address, so the default is generous; the per-address limit (5) is what stops abuse of a mailbox.
 */
function signInLimitPerIp(): number {
	const n = Number(env.SQUARELAW_SIGNIN_LIMIT_PER_IP);
	return Number.isInteger(n) && n > 0 ? n : 100;
}

const SESSION_COOKIES = ['authjs.session-token', '__Secure-authjs.session-token'];

const SIGN_IN_WINDOW_MS = 15 * 60_000;

/**
 * The limits on a request for a sign-in link. A browser that used a link for this address recently
 * (see `signin-proof.ts`) is counted in a bucket of its own, so strangers who use up the address's
 * limit cannot lock its owner out; both buckets keep the mailbox from being flooded.
 */
function signInRules(email: string, ip: string, proven: boolean): RateRule[] {
	if (proven) return [{ bucket: `signin:proven:${email}`, limit: 5, windowMs: SIGN_IN_WINDOW_MS }];
	return [
		{ bucket: `signin:addr:${email}`, limit: 5, windowMs: SIGN_IN_WINDOW_MS },
		{ bucket: `signin:ip:${ip}`, limit: signInLimitPerIp(), windowMs: SIGN_IN_WINDOW_MS }
	];
}

/**
 * Checks a sign-in link request before Auth.js sees it: a malformed address is sent back to the form
 * with a message, and requests are limited per address and per IP. The answer is the same whether or
 * not the address has an account.
 */
const guardSignInRequests: Handle = async ({ event, resolve }) => {
	if (event.request.method === 'POST' && event.url.pathname === '/auth/signin/nodemailer') {
		let raw = '';
		let callbackUrl = '';
		try {
			const form = await event.request.clone().formData();
			raw = String(form.get('email') ?? '');
			callbackUrl = String(form.get('callbackUrl') ?? '');
		} catch {
			redirect(303, '/signin?error=InvalidEmail');
		}
		// Back to the form with the address as typed and where the person was going (the sign-in page
		// only accepts a path on this site as callbackUrl).
		const back = (code: string, email: string) => {
			const params = new URLSearchParams({ error: code, email: email.slice(0, 254) });
			if (callbackUrl) params.set('callbackUrl', callbackUrl.slice(0, 2048));
			return `/signin?${params}`;
		};
		const parsed = emailSchema.safeParse(raw);
		if (!parsed.success) redirect(303, back('InvalidEmail', raw));
		const proven = provesAddress(event.cookies.get(signInProofCookie()), parsed.data, env.AUTH_SECRET);
		const limits = await hitRateLimits(signInRules(parsed.data, event.getClientAddress(), proven));
		if (!limits.allowed) redirect(303, back('RateLimited', parsed.data));
	}
	return resolve(event);
};

/**
 * Puts the caller on `locals.user`: from a bearer token for scripts, else from the session cookie. A
 * bearer token is answered here when it cannot be used: outside the JSON API (401), unknown, revoked or
 * expired (401), or read-only on a write (403).
 */
const identify: Handle = async ({ event, resolve }) => {
	event.locals.user = null;
	event.locals.authMethod = null;
	const header = event.request.headers.get('authorization');
	if (header?.toLowerCase().startsWith('bearer ')) {
		if (!tokenMayReach(event.url.pathname)) {
			return apiError(401, 'Personal access tokens work only on the JSON API (/api/v1/…). Pages and forms need a browser sign-in.');
		}
		const found = await userForAccessToken(header.slice(7).trim());
		if (!found) return apiError(401, 'This access token is unknown, revoked or expired. Make a new one on your account page.');
		if (!tokenMayUse(found.scope, event.request.method)) {
			return apiError(403, 'This access token is read-only: it may read (GET) but not change anything.');
		}
		event.locals.user = found.user;
		event.locals.authMethod = 'token';
	} else if (SESSION_COOKIES.some((name) => event.cookies.get(name))) {
		// Only ask Auth.js (and the database) when a session cookie is present; its one lookup brings the user.
		const session = await event.locals.auth();
		event.locals.user = session?.caller ?? null;
		event.locals.authMethod = event.locals.user ? 'session' : null;
	}
	return resolve(event);
};

const securityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	response.headers.set('x-content-type-options', 'nosniff');
	response.headers.set('referrer-policy', 'same-origin');
	if (!response.headers.has('x-frame-options')) response.headers.set('x-frame-options', 'DENY');
	return response;
};

export const handle = sequence(
	requestEdge,
	answerDuringOutage,
	guardSignInRequests,
	rememberProvenAddress,
	authHandle,
	identifyThroughOutages(identify),
	securityHeaders
);
