/**
 * The inputs of the setups API, one zod schema each, shared by the API routes, the pages' forms and the
 * browser. A `document` in any input may be of an older `schemaVersion`; it is migrated, then checked.
 */
import { z } from 'zod';
import { migrateDocument } from './migrations';

export const MAX_TITLE_CHARS = 200;
export const MAX_SUBJECT_CHARS = 200;
export const MAX_TAGS = 20;
export const MAX_TAG_CHARS = 40;
export const MAX_MESSAGE_CHARS = 500;
export const MAX_PAGE_SIZE = 100;

// ---------- The size of a save: the thumbnail and body limits, derived here in one place ----------

/** The editor draws a plan thumbnail at most this many pixels on its longer side (`Workspace.thumbnail`). */
export const THUMBNAIL_BOX_PX = 360;
/**
 * A plan thumbnail's PNG at most. The worst the editor can make is a square of THUMBNAIL_BOX_PX that
 * does not compress at all: 4 bytes a pixel plus a filter byte a row (518,760 bytes), deflate's stored
 * blocks and the PNG chunks around them, a little over 519,000 bytes. So every thumbnail it makes fits.
 */
export const MAX_THUMBNAIL_BYTES = 512 * 1024;
const PNG_DATA_URL_PREFIX = 'data:image/png;base64,';
/** The longest `thumbnailPng` text: MAX_THUMBNAIL_BYTES as base64, with the optional data-URL prefix. */
export const MAX_THUMBNAIL_BASE64_CHARS = PNG_DATA_URL_PREFIX.length + 4 * Math.ceil(MAX_THUMBNAIL_BYTES / 3);
/** The largest setup document a body carries, as JSON text. */
export const MAX_DOCUMENT_JSON_BYTES = 256 * 1024;
/** Room for a save's other fields (title, subject, tags, message, gear ids), every character escaped. */
const MAX_SAVE_FIELDS_BYTES = 32 * 1024;
/**
 * The JSON body limit of the API (`parseJsonBody`): the largest document with the largest thumbnail
 * and every other field of a save, so a thumbnail the schema accepts is never refused as too large
 * (413) before the schema can name it. adapter-node's BODY_SIZE_LIMIT must be at least this.
 */
export const MAX_JSON_BODY_BYTES = MAX_DOCUMENT_JSON_BYTES + MAX_THUMBNAIL_BASE64_CHARS + MAX_SAVE_FIELDS_BYTES;

export const titleField = z
	.string({ error: 'must be text' })
	.trim()
	.min(1, 'must not be empty')
	.max(MAX_TITLE_CHARS, `must be at most ${MAX_TITLE_CHARS} characters`);

export const subjectField = z
	.string({ error: 'must be text' })
	.trim()
	.max(MAX_SUBJECT_CHARS, `must be at most ${MAX_SUBJECT_CHARS} characters`);

/** Tags are kept trimmed and lower-case, without repeats, so `Quartz` and `quartz ` are one tag. */
export const tagField = z
	.string({ error: 'must be text' })
	.trim()
	.toLowerCase()
	.min(1, 'must not be empty')
	.max(MAX_TAG_CHARS, `must be at most ${MAX_TAG_CHARS} characters`)
	.regex(/^[^,\u0000-\u001f]+$/, 'must not hold commas or control characters');

export const tagsField = z
	.array(tagField, { error: 'must be a list of tags' })
	.max(MAX_TAGS, `at most ${MAX_TAGS} tags`)
	.transform((tags) => [...new Set(tags)]);

export const messageField = z
	.string({ error: 'must be text' })
	.trim()
	.max(MAX_MESSAGE_CHARS, `must be at most ${MAX_MESSAGE_CHARS} characters`);

/** Any known schemaVersion in, the current version out; issues name the field inside the document. */
export const documentInputSchema = z.unknown().transform((raw, ctx) => {
	const result = migrateDocument(raw);
	if (!result.ok) {
		for (const issue of result.issues) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
		return z.NEVER;
	}
	return result.document;
});

const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

/** A PNG thumbnail of the plan as base64 (optionally a `data:image/png;base64,` URL), checked and decoded. */
export const thumbnailField = z
	.string({ error: 'must be a base64 PNG' })
	.max(MAX_THUMBNAIL_BASE64_CHARS, `must be at most ${MAX_THUMBNAIL_BYTES / 1024} KiB`)
	.transform((text, ctx) => {
		const b64 = text.startsWith(PNG_DATA_URL_PREFIX) ? text.slice(PNG_DATA_URL_PREFIX.length) : text;
		if (!/^[A-Za-z0-9+/]*={0,2}$/.test(b64)) {
			ctx.addIssue({ code: 'custom', message: 'must be base64' });
			return z.NEVER;
		}
		// atob rather than Buffer: this schema also runs in the browser.
		let binary: string;
		try {
			binary = atob(b64);
		} catch {
			ctx.addIssue({ code: 'custom', message: 'must be base64' });
			return z.NEVER;
		}
		const bytes = Uint8Array.from(binary, (c) => c.charCodeAt(0));
		if (bytes.length < 8 || PNG_SIGNATURE.some((b, i) => bytes[i] !== b)) {
			ctx.addIssue({ code: 'custom', message: 'must be a PNG image' });
			return z.NEVER;
		}
		if (bytes.length > MAX_THUMBNAIL_BYTES) {
			ctx.addIssue({ code: 'custom', message: `must be at most ${MAX_THUMBNAIL_BYTES / 1024} KiB` });
			return z.NEVER;
		}
		return bytes;
	});

const studioIdField = z.uuid({ error: 'must be a studio id' });
const gearIdList = z.array(z.uuid({ error: 'must be a gear id' })).max(100, 'at most 100 gear ids');

/** `POST /api/v1/setups` */
export const setupCreateSchema = z.object({
	studioId: studioIdField.optional(),
	title: titleField,
	subject: subjectField,
	tags: tagsField.default([]),
	document: documentInputSchema,
	message: messageField.optional(),
	thumbnailPng: thumbnailField.optional()
});
export type SetupCreateInput = z.output<typeof setupCreateSchema>;

/** `PUT /api/v1/setups/:id` */
export const setupSaveSchema = z.object({
	baseRevision: z.number({ error: 'must be a revision number' }).int('must be a whole number').min(1, 'must be at least 1'),
	document: documentInputSchema,
	title: titleField.optional(),
	subject: subjectField.optional(),
	tags: tagsField.optional(),
	message: messageField.optional(),
	thumbnailPng: thumbnailField.optional(),
	/** Gear ids whose copies in the document should be taken again from the gear shelf now. */
	refreshGear: gearIdList.optional()
});
export type SetupSaveInput = z.output<typeof setupSaveSchema>;

/** `POST /api/v1/setups/:id/duplicate` */
export const setupDuplicateSchema = z.object({
	subject: subjectField.min(1, 'must not be empty: name the new subject'),
	title: titleField.optional(),
	studioId: studioIdField.optional(),
	/** Duplicate an older revision rather than the latest. */
	revisionNumber: z.number({ error: 'must be a revision number' }).int('must be a whole number').min(1, 'must be at least 1').optional()
});
export type SetupDuplicateInput = z.output<typeof setupDuplicateSchema>;

/** `POST /api/v1/setups/:id/revisions/:n/restore` (the body is optional). */
export const setupRestoreSchema = z
	.object({
		message: messageField.optional(),
		/** When given, the restore is refused with 409 unless this is still the latest revision. */
		baseRevision: z.number({ error: 'must be a revision number' }).int('must be a whole number').min(1, 'must be at least 1').optional()
	})
	.default({});

export const SETUP_SORTS = ['updated', 'created', 'title', 'subject'] as const;

const pageNumber = (fallback: number, max: number) =>
	z
		.string()
		.regex(/^\d+$/, 'must be a whole number')
		.transform(Number)
		.pipe(z.number().int().min(1, 'must be at least 1').max(max, `must be at most ${max}`))
		.optional()
		.transform((v) => v ?? fallback);

/** The query string of `GET /api/v1/setups` (and of the trash list). */
export const setupListQuerySchema = z.object({
	q: z.string().trim().max(200, 'must be at most 200 characters').optional().transform((v) => v || undefined),
	tag: z.string().trim().toLowerCase().max(MAX_TAG_CHARS, `must be at most ${MAX_TAG_CHARS} characters`).optional().transform((v) => v || undefined),
	subject: z.string().trim().max(MAX_SUBJECT_CHARS, `must be at most ${MAX_SUBJECT_CHARS} characters`).optional().transform((v) => v || undefined),
	studio: studioIdField.optional(),
	gear: z.uuid({ error: 'must be a gear id' }).optional(),
	sort: z.enum(SETUP_SORTS, { error: `must be one of ${SETUP_SORTS.join(', ')}` }).default('updated'),
	order: z.enum(['asc', 'desc'], { error: 'must be asc or desc' }).optional(),
	page: pageNumber(1, 1_000_000),
	pageSize: pageNumber(20, MAX_PAGE_SIZE)
});
export type SetupListQuery = z.output<typeof setupListQuerySchema>;

/** Reads a URL's query string into a plain object for `setupListQuerySchema` (first value of each). */
export function queryObject(url: URL): Record<string, string> {
	const out: Record<string, string> = {};
	for (const [k, v] of url.searchParams) if (!(k in out)) out[k] = v;
	return out;
}
