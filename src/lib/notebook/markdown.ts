/**
 * Setup notes are Markdown, rendered on the server with `marked` and cleaned with `sanitize-html`
 * before they reach a page: no scripts, styles or event handlers, images only from the product's own
 * image routes, and links open safely. Import this from server code only (sanitize-html is not meant for the browser bundle).
 */
import { Marked } from 'marked';
import sanitizeHtml from 'sanitize-html';

const marked = new Marked({ gfm: true, breaks: true, async: false });

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
	transformTags: {
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
