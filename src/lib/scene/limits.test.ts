// The save limits agree: any thumbnail the editor makes fits the thumbnail limit, and a save with the
// largest document and the largest thumbnail fits the JSON body limit and adapter-node's limit.
import { describe, expect, it } from 'vitest';
import { noisePng } from '$lib/server/testing/png';
import { DEFAULT_MAX_BODY_BYTES } from '$lib/server/http';
import { appEnv, profiles } from '../../../scripts/lib/stack.mjs';
import {
	MAX_DOCUMENT_JSON_BYTES,
	MAX_JSON_BODY_BYTES,
	MAX_MESSAGE_CHARS,
	MAX_TAG_CHARS,
	MAX_TAGS,
	MAX_THUMBNAIL_BASE64_CHARS,
	MAX_THUMBNAIL_BYTES,
	MAX_TITLE_CHARS,
	MAX_SUBJECT_CHARS,
	setupSaveSchema,
	THUMBNAIL_BOX_PX
} from './inputs';

/** adapter-node's size notation (`512K`, `8M`, plain bytes), as its handler reads BODY_SIZE_LIMIT. */
function parseAsBytes(value: string): number {
	const multiplier = { K: 1024, M: 1024 ** 2, G: 1024 ** 3 }[value.at(-1)?.toUpperCase() ?? ''] ?? 1;
	return Number(multiplier === 1 ? value : value.slice(0, -1)) * multiplier;
}

describe('thumbnail and body limits', () => {
	it('the largest thumbnail the editor can draw, a square of noise, is within the thumbnail limit', () => {
		const png = noisePng(THUMBNAIL_BOX_PX, THUMBNAIL_BOX_PX);
		// Raw rows: 4 bytes a pixel plus a filter byte a row; noise does not compress, so the file is larger.
		expect(png.length).toBeGreaterThan(THUMBNAIL_BOX_PX * (1 + 4 * THUMBNAIL_BOX_PX));
		expect(png.length).toBeLessThanOrEqual(MAX_THUMBNAIL_BYTES);
		expect(setupSaveSchema.safeParse({ baseRevision: 1, document: {}, thumbnailPng: png.toString('base64') }).error?.issues.map((i) => i.path[0])).not.toContain('thumbnailPng');
	});

	it('a thumbnail of exactly the limit is accepted by the schema, one byte over is refused naming thumbnailPng', () => {
		const atLimit = noisePng(64, 64, { padToBytes: MAX_THUMBNAIL_BYTES });
		const over = noisePng(64, 64, { padToBytes: MAX_THUMBNAIL_BYTES + 1 });
		expect(atLimit.length).toBe(MAX_THUMBNAIL_BYTES);
		const field = (png: Buffer) => setupSaveSchema.shape.thumbnailPng.safeParse(`data:image/png;base64,${png.toString('base64')}`);
		expect(field(atLimit).success).toBe(true);
		expect(`data:image/png;base64,${atLimit.toString('base64')}`.length).toBeLessThanOrEqual(MAX_THUMBNAIL_BASE64_CHARS);
		expect(field(over).error?.issues[0].message).toBe(`must be at most ${MAX_THUMBNAIL_BYTES / 1024} KiB`);
	});

	it('the body limit holds the largest document, the largest thumbnail and every other field escaped', () => {
		const escaped = (chars: number) => '\u0001'.repeat(chars); // JSON writes each as \u0001, six bytes
		const fields = JSON.stringify({
			baseRevision: 1_000_000,
			title: escaped(MAX_TITLE_CHARS),
			subject: escaped(MAX_SUBJECT_CHARS),
			tags: Array.from({ length: MAX_TAGS }, () => escaped(MAX_TAG_CHARS)),
			message: escaped(MAX_MESSAGE_CHARS),
			refreshGear: Array.from({ length: 100 }, () => '00000000-0000-4000-8000-000000000000'),
			document: null,
			thumbnailPng: null
		});
		const largest = fields.length - 'nullnull'.length + MAX_DOCUMENT_JSON_BYTES + MAX_THUMBNAIL_BASE64_CHARS + 2;
		expect(largest).toBeLessThanOrEqual(MAX_JSON_BODY_BYTES);
		expect(DEFAULT_MAX_BODY_BYTES).toBe(MAX_JSON_BODY_BYTES);
	});

	it("adapter-node's BODY_SIZE_LIMIT, as npm start and npm test set it, is not below the body limit", () => {
		const env = appEnv(profiles.test, { url: 'postgres://unused', secrets: {}, mail: null });
		expect(parseAsBytes(env.BODY_SIZE_LIMIT)).toBeGreaterThanOrEqual(MAX_JSON_BODY_BYTES);
		expect(parseAsBytes('512K')).toBe(512 * 1024); // the adapter's own default, too small: README says so
	});
});
