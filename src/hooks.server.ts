import { env } from '$env/dynamic/private';
import { redirect, type Handle } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { authHandle } from './auth';
import { emailSchema } from '$lib/schemas/account';
import { getUserById } from '$lib/server/db/queries/users';
import { userForAccessToken } from '$lib/server/db/queries/tokens';
import { hitRateLimits } from '$lib/server/db/queries/rate-limits';
import { requestEdge } from '$lib/server/edge';

export { handleError } from '$lib/server/edge';

/**
 * Sign-in links per IP address per 15 minutes. A workshop of thirty students behind one hall router
 * shares one address, so the default is generous; the per-address limit (5) is what stops abuse of a mailbox.
 */
function signInLimitPerIp(): number {
	const n = Number(env.SQUARELAW_SIGNIN_LIMIT_PER_IP);
	return Number.isInteger(n) && n > 0 ? n : 100;
}

const SESSION_COOKIES = ['authjs.session-token', '__Secure-authjs.session-token'];

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
		const limits = await hitRateLimits([
			{ bucket: `signin:addr:${parsed.data}`, limit: 5, windowMs: 15 * 60_000 },
			{ bucket: `signin:ip:${event.getClientAddress()}`, limit: signInLimitPerIp(), windowMs: 15 * 60_000 }
		]);
		if (!limits.allowed) redirect(303, back('RateLimited', parsed.data));
	}
	return resolve(event);
};

/** Puts the caller on `locals.user`: from a bearer token for scripts, else from the session cookie. */
const identify: Handle = async ({ event, resolve }) => {
	event.locals.user = null;
	event.locals.authMethod = null;
	const header = event.request.headers.get('authorization');
	if (header?.toLowerCase().startsWith('bearer ')) {
		const user = await userForAccessToken(header.slice(7).trim());
		if (user) {
			event.locals.user = user;
			event.locals.authMethod = 'token';
		}
	} else if (SESSION_COOKIES.some((name) => event.cookies.get(name))) {
		// Only ask Auth.js (and the database) when a session cookie is present.
		const session = await event.locals.auth();
		const id = session?.user?.id;
		if (id) {
			event.locals.user = await getUserById(id);
			event.locals.authMethod = event.locals.user ? 'session' : null;
		}
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

export const handle = sequence(requestEdge, guardSignInRequests, authHandle, identify, securityHeaders);
