/**
 * Squarelaw's own setup file: one revision of one setup, to keep, mail or import elsewhere.
 * See README.md beside this file for the format.
 */
import { z } from 'zod';
import type { SetupDocument } from './document';
import { documentInputSchema, subjectField, tagsField, titleField } from './inputs';
import { findJsonProblem, MAX_BODY_DEPTH } from '$lib/json-limits';

export const EXPORT_FORMAT_VERSION = 1;
export const EXPORT_KIND = 'squarelaw.setup';
/** A setup file holds one revision; even a busy plan is far below this. */
export const MAX_EXPORT_BYTES = 1024 * 1024;
export const EXPORT_MEDIA_TYPE = 'application/vnd.squarelaw.setup+json';
export const EXPORT_FILE_SUFFIX = '.squarelaw.json';

export interface SetupExport {
	formatVersion: typeof EXPORT_FORMAT_VERSION;
	kind: typeof EXPORT_KIND;
	title: string;
	subject: string;
	tags: string[];
	document: SetupDocument;
	exportedAt: string;
	/** Where it came from, for the reader's information; an import never links to it. */
	source?: { setupId: string; revisionNumber: number; studioName?: string };
}

/** The query string of `POST /api/v1/setups/import`: the studio to import into (default the caller's personal one). */
export const importQuerySchema = z.object({ studio: z.uuid({ error: 'must be a studio id' }).optional() });

export const setupExportSchema = z.object({
	formatVersion: z.literal(EXPORT_FORMAT_VERSION),
	kind: z.literal(EXPORT_KIND),
	title: titleField,
	subject: subjectField,
	tags: tagsField.default([]),
	document: documentInputSchema,
	exportedAt: z.iso.datetime({ offset: true, error: 'must be an ISO date-time' }),
	source: z
		.object({
			setupId: z.string().max(100),
			revisionNumber: z.number().int().min(1),
			studioName: z.string().max(200).optional()
		})
		.optional()
});

export function buildSetupExport(input: Omit<SetupExport, 'formatVersion' | 'kind' | 'exportedAt'>, now = new Date()): SetupExport {
	return {
		formatVersion: EXPORT_FORMAT_VERSION,
		kind: EXPORT_KIND,
		title: input.title,
		subject: input.subject,
		tags: input.tags,
		document: input.document,
		exportedAt: now.toISOString(),
		...(input.source ? { source: input.source } : {})
	};
}

/** A file name for an export: the title in plain letters and the revision number. */
export function exportFileName(title: string, revisionNumber: number): string {
	const slug =
		title
			.normalize('NFKD')
			.replace(/[\u0300-\u036f]/g, '')
			.toLowerCase()
			.replace(/[^a-z0-9]+/g, '-')
			.replace(/^-+|-+$/g, '')
			.slice(0, 60) || 'setup';
	return `${slug}-r${revisionNumber}${EXPORT_FILE_SUFFIX}`;
}

export type ExportProblem = 'too-large' | 'empty' | 'truncated' | 'not-json' | 'foreign' | 'newer' | 'invalid';

export type ParseExportResult =
	| { ok: true; value: SetupExport }
	| { ok: false; problem: ExportProblem; message: string; issues: { path: string[]; message: string }[] };

const problem = (p: ExportProblem, message: string, issues: { path: string[]; message: string }[] = [{ path: [], message }]) =>
	({ ok: false, problem: p, message, issues }) as const;

/**
 * Reads a setup file's text. Every refusal says what is wrong: too large, empty, cut short, not JSON,
 * not a Squarelaw setup file at all, from a newer Squarelaw, or a named field that is invalid.
 */
export function parseSetupExport(text: unknown): ParseExportResult {
	if (typeof text !== 'string') return problem('foreign', 'This is not a setup file: expected text.');
	const bytes = new TextEncoder().encode(text).length;
	if (bytes > MAX_EXPORT_BYTES) {
		return problem(
			'too-large',
			`The file is too large (${Math.ceil(bytes / 1024)} KiB); a setup file is at most ${MAX_EXPORT_BYTES / 1024} KiB.`
		);
	}
	const body = text.replace(/^\uFEFF/, '');
	if (body.trim() === '') return problem('empty', 'The file is empty.');
	let raw: unknown;
	try {
		raw = JSON.parse(body);
	} catch (e) {
		if (looksTruncated(body)) {
			return problem('truncated', 'The file is cut short (truncated): its JSON ends before it is complete. Export it again.');
		}
		const detail = e instanceof Error ? e.message : String(e);
		return problem('not-json', `The file is not valid JSON (${detail}).`);
	}
	if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) {
		const found = Array.isArray(raw) ? 'a list' : raw === null ? 'null' : `a ${typeof raw}`;
		return problem('foreign', `This is not a Squarelaw setup file: it holds ${found}, not an object.`);
	}
	const obj = raw as Record<string, unknown>;
	if (obj.kind !== EXPORT_KIND) {
		const what = typeof obj.kind === 'string' ? `its kind is "${obj.kind.slice(0, 60)}"` : 'it has no "kind"';
		return problem('foreign', `This is not a Squarelaw setup file (${what}; expected "${EXPORT_KIND}").`, [
			{ path: ['kind'], message: `must be "${EXPORT_KIND}"` }
		]);
	}
	const fv = obj.formatVersion;
	if (typeof fv === 'number' && Number.isInteger(fv) && fv > EXPORT_FORMAT_VERSION) {
		return problem(
			'newer',
			`The file was made by a newer version of Squarelaw (formatVersion ${fv}); this one reads formatVersion ${EXPORT_FORMAT_VERSION}.`,
			[{ path: ['formatVersion'], message: `must be at most ${EXPORT_FORMAT_VERSION}` }]
		);
	}
	if (fv !== EXPORT_FORMAT_VERSION) {
		return problem('invalid', `The file's formatVersion must be ${EXPORT_FORMAT_VERSION}.`, [
			{ path: ['formatVersion'], message: `must be ${EXPORT_FORMAT_VERSION}` }
		]);
	}
	// The same rule as every request body: text that can be stored, nesting within bounds.
	const unstorable = findJsonProblem(obj, { maxDepth: MAX_BODY_DEPTH });
	if (unstorable) {
		return problem('invalid', `The setup file is not valid: ${unstorable.path.join('.') || 'file'} ${unstorable.message}.`, [unstorable]);
	}
	const parsed = setupExportSchema.safeParse(obj);
	if (!parsed.success) {
		const issues = parsed.error.issues.map((i) => ({ path: i.path.map(String), message: i.message }));
		const first = issues[0];
		return problem('invalid', `The setup file is not valid: ${first.path.join('.') || 'file'} ${first.message}.`, issues);
	}
	return { ok: true, value: parsed.data as SetupExport };
}

/**
 * Whether JSON text stops in the middle: inside a string, or with objects or arrays still open.
 * (JSON.parse's messages differ between engines, so this is checked by scanning.)
 */
export function looksTruncated(text: string): boolean {
	let depth = 0;
	let inString = false;
	let escaped = false;
	for (let i = 0; i < text.length; i++) {
		const c = text[i];
		if (inString) {
			if (escaped) escaped = false;
			else if (c === '\\') escaped = true;
			else if (c === '"') inString = false;
			continue;
		}
		if (c === '"') inString = true;
		else if (c === '{' || c === '[') depth++;
		else if (c === '}' || c === ']') {
			depth--;
			if (depth < 0) return false;
		}
	}
	if (inString || depth > 0) return true;
	// A top-level value cut inside a literal: `tru`, `12e`, a trailing `,` or `:`.
	return /[,:]\s*$/.test(text);
}
