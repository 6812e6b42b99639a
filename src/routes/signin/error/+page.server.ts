const MESSAGES: Record<string, string> = {
	Verification: 'That sign-in link has expired or has already been used. Each link works once, for 15 minutes.',
	Configuration: 'Sign-in is not set up correctly on this server. Tell the operator.',
	AccessDenied: 'Sign-in was refused.'
};

export function load({ url }) {
	const code = url.searchParams.get('error') ?? '';
	return { message: MESSAGES[code] ?? 'Sign-in did not work. Ask for a new link and try again.' };
}
