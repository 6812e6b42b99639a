// "This browser has used a sign-in link for this address recently": a signed, HttpOnly cookie set
// when a sign-in link works. With it, a request for a new link is counted apart from strangers'
// requests for the same address, so nobody can lock the owner out by using up the address's limit.
import { createHmac, timingSafeEqual } from 'node:crypto';
import type { Handle } from '@sveltejs/kit';
import { env } from '$env/dynamic/private';
import { emailSchema } from '$lib/schemas/account';

/** How long a proof lasts; every sign-in by link renews it. */
export const SIGNIN_PROOF_DAYS = 30;

const secure = () => (env.ORIGIN ?? '').startsWith('https://');

/** The cookie's name; over https it takes the `__Host-` prefix (Secure, whole site, no Domain). */
export function signInProofCookie(): string {
	return secure() ? '__Host-squarelaw-signin-proof' : 'squarelaw-signin-proof';
}

function mac(email: string, expiresAtS: number, secret: string): Buffer {
	return createHmac('sha256', secret).update(`squarelaw signin-proof\n${email}\n${expiresAtS}`).digest();
}

/**
 * The cookie's value: its expiry and a MAC of the address under the app's secret. The address itself
 * is not in it; a proof is checked against the address a sign-in form sends.
 */
export function signInProof(email: string, secret: string, nowMs = Date.now()): string {
	const expiresAtS = Math.floor(nowMs / 1000) + SIGNIN_PROOF_DAYS * 24 * 3600;
	return `${expiresAtS}.${mac(email, expiresAtS, secret).toString('base64url')}`;
}

/** Whether `value` is an unexpired proof, made with `secret`, that this browser used a link for `email`. */
export function provesAddress(value: string | undefined, email: string, secret: string | undefined, nowMs = Date.now()): boolean {
	if (!value || !secret) return false;
	const match = /^(\d{1,12})\.([A-Za-z0-9_-]{43})$/.exec(value);
	if (!match) return false;
	const expiresAtS = Number(match[1]);
	if (expiresAtS * 1000 <= nowMs) return false;
	return timingSafeEqual(Buffer.from(match[2], 'base64url'), mac(email, expiresAtS, secret));
}

/**
 * Before Auth.js: when a sign-in link was used and Auth.js answered with a new session, the browser
 * has proved the address in the link, and gets (or renews) its proof.
 */
export const rememberProvenAddress: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	if (event.request.method !== 'GET' || event.url.pathname !== '/auth/callback/nodemailer') return response;
	const signedIn = response.headers
		.getSetCookie()
		.some((c) => /^(__Secure-)?authjs\.session-token=[^;]+/.test(c));
	const email = emailSchema.safeParse(event.url.searchParams.get('email') ?? '');
	if (!signedIn || !email.success || !env.AUTH_SECRET) return response;
	const attributes = [
		`${signInProofCookie()}=${signInProof(email.data, env.AUTH_SECRET)}`,
		'Path=/',
		`Max-Age=${SIGNIN_PROOF_DAYS * 24 * 3600}`,
		'HttpOnly',
		'SameSite=Lax',
		...(secure() ? ['Secure'] : [])
	];
	response.headers.append('set-cookie', attributes.join('; '));
	return response;
};
