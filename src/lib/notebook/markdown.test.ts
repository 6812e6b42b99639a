import { describe, expect, it } from 'vitest';
import { renderNotes } from './markdown';

describe('renderNotes', () => {
	it('renders Markdown: emphasis, lists and links', () => {
		const html = renderNotes('**Velvet** under the base.\n\n- card at 20 cm\n- f/16\n\n[club](https://fernhill.example/)');
		expect(html).toContain('<strong>Velvet</strong>');
		expect(html).toContain('<li>card at 20 cm</li>');
		expect(html).toContain('<a href="https://fernhill.example/" rel="noopener noreferrer nofollow">club</a>');
	});

	it('never makes a second h1: headings move down under the page’s h1 and the notes’ h2', () => {
		const html = renderNotes('# Quartz cluster\n\n## Cleaning\n\n###### Smallest\n\n<h1>typed as HTML</h1>');
		expect(html).not.toMatch(/<h1|<h2/);
		expect(html).toContain('<h3>Quartz cluster</h3>');
		expect(html).toContain('<h4>Cleaning</h4>');
		expect(html).toContain('<h6>Smallest</h6>');
		expect(html).toContain('<h3>typed as HTML</h3>');
	});

	it('removes scripts, event handlers and javascript: links', () => {
		const html = renderNotes('<script>alert(1)</script>\n\n<img src="x.png" onerror="alert(2)">\n\n[x](javascript:alert(3))');
		expect(html).not.toMatch(/<script|onerror|javascript:/i);
	});

	it('drops images from other hosts, so no request leaves the machine', () => {
		expect(renderNotes('![a](https://elsewhere.example/a.png)')).not.toContain('<img');
		expect(renderNotes('![a](//elsewhere.example/a.png)')).not.toContain('<img');
		expect(renderNotes('<img src="https://elsewhere.example/a.png">')).not.toContain('<img');
	});

	const setupId = '0b6f4f7e-3c1a-4a57-9d55-2f1e8c0d9a10';

	it("shows images from the product's own image routes: a revision's thumbnail, a setup's shots", () => {
		const thumb = `/api/v1/setups/${setupId}/revisions/3/thumbnail`;
		expect(renderNotes(`![plan](${thumb})`)).toContain(`<img src="${thumb}" alt="plan" />`);
		const shot = `/api/v1/setups/${setupId}/shots/7c1e/full.jpg`;
		expect(renderNotes(`![shot](${shot})`)).toContain(`<img src="${shot}" alt="shot" />`);
	});

	it('never loads a sign-in link, or any other path of this site, as an image', () => {
		const attempts = [
			'/auth/callback/nodemailer?token=abc&email=victim%40example.com',
			'/auth/signout',
			'/signout',
			'/uploads/a.png',
			'/api/v1/setups',
			`/api/v1/setups/${setupId}/export`,
			// Paths a browser resolves to another route: dot segments, escaped dots, backslashes, a query.
			`/api/v1/setups/${setupId}/shots/../../../../auth/callback/nodemailer`,
			`/api/v1/setups/${setupId}/shots/%2e%2e/%2e%2e/%2e%2e/%2e%2e/auth/signout`,
			`/api/v1/setups/${setupId}/shots/a\\..\\..\\..\\auth`,
			`/api/v1/setups/${setupId}/revisions/3/thumbnail?next=/auth/signout`,
			`/api/v1/setups/../../auth/callback/nodemailer/revisions/1/thumbnail`,
			`api/v1/setups/${setupId}/revisions/3/thumbnail`,
			`http://127.0.0.1:3000/api/v1/setups/${setupId}/revisions/3/thumbnail`,
			'data:image/png;base64,iVBORw0KGgo='
		];
		for (const src of attempts) {
			expect(renderNotes(`![x](${src})`), src).not.toContain('<img');
			expect(renderNotes(`<img src="${src}" alt="x">`), src).not.toContain('<img');
		}
		// As a link the sign-in path is only text to click, never fetched by the page.
		expect(renderNotes('[sign in](/auth/signin)')).toContain('<a href="/auth/signin"');
	});

	it('reads an entity-encoded path as the browser would before deciding', () => {
		expect(renderNotes('<img src="&#47;auth&#47;signout">')).not.toContain('<img');
		expect(renderNotes(`<img src="/api/v1/setups/${setupId}/shots/a&#x2f;..&#x2f;..&#x2f;..&#x2f;..&#x2f;auth&#x2f;signout">`)).not.toContain('<img');
	});

	it('gives nothing for empty notes', () => {
		expect(renderNotes('  \n')).toBe('');
	});
});
