// No request may leave the machine: fonts, styles and scripts are served by the app itself. The shared
// fixture already fails any test that sends one; this test names the rule and checks the font too.
import { expect, test } from './fixtures';

test('home, sign-in and calculator pages load everything from 127.0.0.1, Work Sans included', async ({ page, baseURL }) => {
	const requests: { url: string; status: number | null; type: string }[] = [];
	page.on('response', (response) => {
		requests.push({ url: response.url(), status: response.status(), type: response.headers()['content-type'] ?? '' });
	});
	page.on('requestfailed', (request) => requests.push({ url: request.url(), status: null, type: '' }));

	for (const path of ['/', '/signin', '/calc']) {
		const response = await page.goto(path, { waitUntil: 'networkidle' });
		expect(response?.status(), path).toBe(200);
		// The content security policy lets the browser fetch only from the app itself.
		const csp = response!.headers()['content-security-policy'] ?? '';
		for (const directive of ["default-src 'self'", "font-src 'self'", "connect-src 'self'"]) {
			expect(csp, path).toContain(directive);
		}
		// The page's text is set in Work Sans, and the face is really loaded (not a fallback).
		const family = await page.evaluate(() => getComputedStyle(document.body).fontFamily);
		expect(family, path).toMatch(/^"?Work Sans"?/);
		const loaded = await page.evaluate(async () => {
			await document.fonts.ready;
			return [...document.fonts].filter((f) => f.family.replace(/"/g, '') === 'Work Sans' && f.status === 'loaded').length;
		});
		expect(loaded, `Work Sans faces loaded on ${path}`).toBeGreaterThan(0);
	}

	const app = new URL(baseURL!);
	expect(requests.length).toBeGreaterThan(3);
	for (const r of requests) {
		expect(new URL(r.url).hostname, r.url).toBe('127.0.0.1');
		expect(new URL(r.url).port, r.url).toBe(app.port);
	}
	const fonts = requests.filter((r) => /work-sans-latin-\d+-normal[^/]*\.woff2$/.test(new URL(r.url).pathname));
	expect(fonts.length, 'Work Sans woff2 files fetched from the app').toBeGreaterThan(0);
	for (const font of fonts) {
		expect(font.status, font.url).toBe(200);
		expect(font.type, font.url).toMatch(/font\/woff2/);
	}
	expect(requests.some((r) => /\.css$/.test(new URL(r.url).pathname) && r.status === 200), 'a stylesheet from the app').toBe(true);
});
