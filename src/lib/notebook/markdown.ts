/**
 * Setup notes are Markdown, rendered on the server with `marked` and cleaned with `sanitize-html`
 * before they reach a page: no scripts, styles or event handlers, images only from the product's own
 * image routes, and links open safely. Import this from server code only (sanitize-html is not meant for the browser bundle).
 */
import { Marked } from 'marked';
import sanitizeHtml from 'sanitize-html';

const marked = new Marked({ gfm: true, breaks: true, async: false });

/** How many levels a heading in the notes moves down: the page's h1 and the notes' own h2 are above. */
export const NOTES_HEADING_SHIFT = 2;

const ALLOWED = {
	allowedTags: [
		'p', 'br', 'hr', 'h1', 'h2', 'h3', 'h4', 'h5', 'h6', 'blockquote', 'pre', 'code',
		'ul', 'ol', 'li', 'strong', 'em', 'del', 's', 'a', 'table', 'thead', 'tbody', 'tr', 'th', 'td', 'img', 'sup', 'sub'
	],
	allowedAttributes: {
		a: ['href', 'title', 'rel'],
		img: ['src', 'alt', 'title'],
		th: ['align'],
		td: ['align'],
		code: ['class']
	},
	allowedSchemes: ['http', 'https', 'mailto'],
	allowedSchemesByTag: { img: [] },
	allowProtocolRelative: false,
	// The notes sit under the page's h1 and their own h2 ("Notes"): a "# heading" in them is an h3, and
	// every level below moves down with it (h6 stays h6), so a note never adds a second h1.
	transformTags: {
		...Object.fromEntries([1, 2, 3, 4, 5, 6].map((level) => [`h${level}`, `h${Math.min(6, level + NOTES_HEADING_SHIFT)}`])),
		a: (tagName: string, attribs: Record<string, string>) => ({
			tagName,
			attribs: { ...attribs, rel: 'noopener noreferrer nofollow' }
		}),
		// Any other image is dropped (turned into a tag that is not allowed, so it vanishes).
		img: (tagName: string, attribs: Record<string, string>) =>
			isOwnImage(attribs.src ?? '') ? { tagName, attribs } : { tagName: 'dropped-image', attribs: {} }
	}
} satisfies sanitizeHtml.IOptions;

/**
 * The product's own image routes: a revision's thumbnail and a setup's shots. A browser loads an image
 * with the reader's cookies, so notes may not point one anywhere else on this site (a sign-in link under
 * `/auth/` would sign the reader in as someone else) nor off the machine. Segments are plain names: no
 * dots, escapes or backslashes that a browser would resolve to another path.
 */
const OWN_IMAGE = /^\/api\/v1\/setups\/[A-Za-z0-9-]+\/(?:revisions\/\d+\/thumbnail|shots(?:\/[A-Za-z0-9_-]+(?:\.[A-Za-z0-9]+)?)+)$/;

export function isOwnImage(src: string): boolean {
	return OWN_IMAGE.test(src);
}

/** Markdown to safe HTML. Empty notes give an empty string. */
export function renderNotes(markdown: string): string {
	if (!markdown.trim()) return '';
	const html = marked.parse(markdown) as string;
	return sanitizeHtml(html, ALLOWED);
}
