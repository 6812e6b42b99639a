import { describe, expect, it } from 'vitest';
import { buildSetupExport, exportFileName, looksTruncated, MAX_EXPORT_BYTES, parseSetupExport } from './export';
import { migrateDocument } from './migrations';

const scene = {
	camera: { iso: 400, aperture: 11, shutter: 1 / 8, magnification: 1 },
	subject: { position: [0, 0, 0.03] },
	ambient: { ev100: 10 },
	lights: [{ id: 'fill', kind: 'flash', position: [0.25, -0.25, 0.2], guideNumber: 40, power: 1 / 128, lossStops: 1 }]
};
const parsed = migrateDocument({ schemaVersion: 1, scene, plan: { elements: { fill: { label: 'Fill' } } }, notes: '# Moss' });
if (!parsed.ok) throw new Error(parsed.message);
const document = parsed.document;

function file(overrides: Record<string, unknown> = {}) {
	return JSON.stringify(
		{ ...buildSetupExport({ title: 'Dew on moss', subject: 'Moss', tags: ['workshop'], document }, new Date('2026-10-17T10:05:00Z')), ...overrides },
		null,
		'\t'
	);
}

describe('parseSetupExport', () => {
	it('reads back what buildSetupExport wrote', () => {
		const r = parseSetupExport(file());
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		expect(r.value).toMatchObject({ formatVersion: 1, kind: 'squarelaw.setup', title: 'Dew on moss', subject: 'Moss', tags: ['workshop'], exportedAt: '2026-10-17T10:05:00.000Z' });
		expect(r.value.document).toEqual(document);
	});

	it('reads a file with a byte-order mark and an older document version', () => {
		expect(parseSetupExport('\uFEFF' + file()).ok).toBe(true);
		const old = parseSetupExport(file({ document: { schemaVersion: 0, scene, notes: ['line one', 'line two'] } }));
		expect(old.ok && old.value.document.notes).toBe('line one\nline two');
	});

	it('names an empty file', () => {
		for (const text of ['', '   \n']) {
			const r = parseSetupExport(text);
			expect(!r.ok && r.problem).toBe('empty');
		}
	});

	it('says a file is truncated wherever it is cut', () => {
		const text = file().trim();
		for (let cut = 1; cut < text.length; cut += 7) {
			const r = parseSetupExport(text.slice(0, cut));
			expect(r.ok, `cut at ${cut}`).toBe(false);
			if (!r.ok) {
				expect(r.problem, `cut at ${cut}: ${r.message}`).toBe('truncated');
				expect(r.message).toMatch(/cut short \(truncated\)/);
			}
		}
	});

	it('says malformed JSON is not JSON', () => {
		for (const text of ['{"kind": squarelaw}', "{'kind': 'squarelaw.setup'}", '{"a": 1,}', '}{', 'kind=squarelaw.setup']) {
			const r = parseSetupExport(text);
			expect(!r.ok && r.problem, text).toBe('not-json');
			expect(!r.ok && r.message).toMatch(/not valid JSON/);
		}
	});

	it('refuses an oversized file before reading it', () => {
		const big = file({ padding: 'x'.repeat(MAX_EXPORT_BYTES) });
		const r = parseSetupExport(big);
		expect(!r.ok && r.problem).toBe('too-large');
		expect(!r.ok && r.message).toMatch(/too large .* at most 1024 KiB/);
	});

	it('says a foreign JSON file is not a Squarelaw setup file', () => {
		const foreign = [
			JSON.stringify({ type: 'FeatureCollection', features: [] }),
			JSON.stringify([1, 2, 3]),
			JSON.stringify('squarelaw.setup'),
			'42',
			'null',
			JSON.stringify({ kind: 'squarelaw.workshop', formatVersion: 1 }),
			JSON.stringify({ formatVersion: 1, title: 'x', document })
		];
		for (const text of foreign) {
			const r = parseSetupExport(text);
			expect(!r.ok && r.problem, text).toBe('foreign');
			expect(!r.ok && r.message).toMatch(/not a Squarelaw setup file/);
		}
	});

	it('says a file from a newer Squarelaw is newer', () => {
		const r = parseSetupExport(file({ formatVersion: 2 }));
		expect(!r.ok && r.problem).toBe('newer');
		expect(!r.ok && r.issues[0].path).toEqual(['formatVersion']);
	});

	it('names the invalid field of a file that is otherwise ours', () => {
		const cases: [Record<string, unknown>, string][] = [
			[{ formatVersion: '1' }, 'formatVersion'],
			[{ title: '' }, 'title'],
			[{ tags: 'minerals' }, 'tags'],
			[{ exportedAt: 'yesterday' }, 'exportedAt'],
			[{ document: { ...document, scene: { ...scene, camera: { ...scene.camera, shutter: -1 } } } }, 'document.scene.camera.shutter'],
			[{ document: { ...document, schemaVersion: 9 } }, 'document.schemaVersion'],
			[{ document: undefined }, 'document']
		];
		for (const [overrides, field] of cases) {
			const r = parseSetupExport(file(overrides));
			expect(r.ok, field).toBe(false);
			if (!r.ok) {
				expect(r.problem).toBe('invalid');
				expect(r.issues.map((i) => i.path.join('.'))).toContain(field);
				expect(r.message).toContain(field);
			}
		}
	});

	it('refuses anything but text', () => {
		expect(parseSetupExport(undefined).ok).toBe(false);
		expect(parseSetupExport({ kind: 'squarelaw.setup' }).ok).toBe(false);
	});
});

describe('looksTruncated', () => {
	it('tells an unfinished text from a finished one', () => {
		expect(looksTruncated('{"a": [1, 2')).toBe(true);
		expect(looksTruncated('{"a": "b\\"')).toBe(true);
		expect(looksTruncated('{"a": "}"}')).toBe(false);
		expect(looksTruncated('{"a": 1}}')).toBe(false);
		expect(looksTruncated('{"a": 1,}')).toBe(false);
	});
});

describe('exportFileName', () => {
	it('makes a plain file name with the revision', () => {
		expect(exportFileName('Quartz cluster on black velvet', 4)).toBe('quartz-cluster-on-black-velvet-r4.squarelaw.json');
		expect(exportFileName('Ménière’s “geode” / 2', 1)).toBe('meniere-s-geode-2-r1.squarelaw.json');
		expect(exportFileName('***', 2)).toBe('setup-r2.squarelaw.json');
	});
});
