import { describe, expect, it } from 'vitest';
import { renderNotes } from './markdown';

describe('renderNotes', () => {
	it('renders Markdown: emphasis, lists and links', () => {
		const html = renderNotes('**Velvet** under the base.\n\n- card at 20 cm\n- f/16\n\n[club](https://fernhill.example/)');
		expect(html).toContain('<strong>Velvet</strong>');
		expect(html).toContain('<li>card at 20 cm</li>');
		expect(html).toContain('<a href="https://fernhill.example/" rel="noopener noreferrer nofollow">club</a>');
	});

	it('removes scripts, event handlers and javascript: links', () => {
		const html = renderNotes('<script>alert(1)</script>\n\n<img src="x.png" onerror="alert(2)">\n\n[x](javascript:alert(3))');
		expect(html).not.toMatch(/<script|onerror|javascript:/i);
	});

	it('drops images from other hosts, so no request leaves the machine', () => {
		expect(renderNotes('![a](https://elsewhere.example/a.png)')).not.toContain('<img');
		expect(renderNotes('![a](//elsewhere.example/a.png)')).not.toContain('<img');
		expect(renderNotes('![a](/uploads/a.png)')).toContain('<img src="/uploads/a.png" alt="a" />');
	});

	it('gives nothing for empty notes', () => {
		expect(renderNotes('  \n')).toBe('');
	});
});
