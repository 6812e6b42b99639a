/** Only a path on this site is accepted as the place to return to after sign-in (no open redirects). */
export function safeReturnPath(value: string | null, origin: string, fallback = '/studios'): string {
	if (!value) return fallback;
	try {
		const url = new URL(value, origin);
		if (url.origin === origin) return url.pathname + url.search;
	} catch {
		/* not a URL */
	}
	return fallback;
}
