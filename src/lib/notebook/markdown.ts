/**
 * Setup notes are Markdown, rendered on the server with `marked` and cleaned with `sanitize-html`
 * before they reach a page: no scripts, styles, event handlers or off-machine images, and links open
 * safely. Import this from server code only (sanitize-html is not meant for the browser bundle).
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
	// Images only from this site (a request may never leave the machine): relative paths and data URLs.
	allowedSchemesByTag: { img: ['data'] },
	allowProtocolRelative: false,
	transformTags: {
		a: (tagName: string, attribs: Record<string, string>) => ({
			tagName,
			attribs: { ...attribs, rel: 'noopener noreferrer nofollow' }
		}),
		// An image from another host is dropped (turned into a tag that is not allowed, so it vanishes).
		img: (tagName: string, attribs: Record<string, string>) =>
			/^(?:[a-z][a-z0-9+.-]*:)?\/\//i.test((attribs.src ?? '').trim()) ? { tagName: 'dropped-image', attribs: {} } : { tagName, attribs }
	}
} satisfies sanitizeHtml.IOptions;

/** Markdown to safe HTML. Empty notes give an empty string. */
export function renderNotes(markdown: string): string {
	if (!markdown.trim()) return '';
	const html = marked.parse(markdown) as string;
	return sanitizeHtml(html, ALLOWED);
}
