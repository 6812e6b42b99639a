import { redirect } from '@sveltejs/kit';
import { safeReturnPath } from '$lib/server/return-path';

const MESSAGES: Record<string, string> = {
	InvalidEmail: 'That is not an e-mail address. It should look like name@example.org.',
	RateLimited: 'Too many sign-in links were asked for just now. Wait 15 minutes, then try again.',
	EmailSignin: 'The sign-in mail could not be sent. Try again in a moment.',
	Verification: 'That sign-in link has expired or was already used. Ask for a new one below.'
};

export function load({ locals, url }) {
	const returnTo = safeReturnPath(url.searchParams.get('callbackUrl') ?? url.searchParams.get('redirectTo'), url.origin);
	if (locals.user) redirect(303, returnTo);
	const code = url.searchParams.get('error');
	return {
		returnTo,
		email: url.searchParams.get('email') ?? '',
		error: code ? (MESSAGES[code] ?? 'Sign-in did not work. Try again.') : null
	};
}
