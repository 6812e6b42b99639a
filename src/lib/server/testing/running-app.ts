// For tests that run against what `npm test` starts (the database, the built app at TEST_BASE_URL and
// its mail fake at DEV_MAIL_URL). Imports nothing of the database, so a test that only speaks HTTP can
// use it too.

/** Fails at once, naming what is missing, when such a test is run outside `npm test`. */
export function requireTestEnv(...names: string[]): void {
	const missing = names.filter((name) => !process.env[name]);
	if (missing.length) {
		throw new Error(
			`${missing.join(', ')} ${missing.length === 1 ? 'is' : 'are'} not set: run these tests through \`npm test\`, which starts the database, the app and its mail fake.`
		);
	}
}

/** A form post as a browser without JavaScript sends it (so SvelteKit answers with the page, not JSON). */
export function post(path: string, form: Record<string, string>, cookie?: string) {
	const base = process.env.TEST_BASE_URL!;
	return fetch(new URL(path, base), {
		method: 'POST',
		redirect: 'manual',
		headers: {
			origin: base,
			accept: 'text/html',
			'content-type': 'application/x-www-form-urlencoded',
			...(cookie ? { cookie } : {})
		},
		body: new URLSearchParams(form)
	});
}
