import { describe, expect, it } from 'vitest';
import { CURRENT_SCHEMA_VERSION } from './document';
import { MIGRATIONS, migrateDocument } from './migrations';

const scene = {
	camera: { iso: 100, aperture: 11, shutter: 1 / 200, magnification: 0.25 },
	subject: { position: [0, 0, 0.015] },
	lights: [{ id: 'rake', kind: 'flash', position: [-0.45, 0, 0.05], guideNumber: 24, power: 0.125 }]
};

/**
 * One stored document per old version, as that version wrote it, and what it must read as today.
 * Version 0 is an invented earlier shape (it never shipped): notes as an array of lines, the drawing
 * under `layout` with `angle`, `w`, `d`, `color`.
 */
const FIXTURES: Record<number, { stored: unknown; expected: unknown }> = {
	0: {
		stored: {
			schemaVersion: 0,
			scene,
			layout: {
				rake: { label: 'Marten 24', angle: 15, w: 0.07, d: 0.05, color: '#ffeeaa', kind: 'flash' },
				subject: { label: 'Ammonite' }
			},
			notes: ['# Ammonite', '', 'Raking light from the left.']
		},
		expected: {
			schemaVersion: 2,
			scene,
			plan: {
				elements: {
					rake: { label: 'Marten 24', rotationDeg: 15, widthM: 0.07, depthM: 0.05, colour: '#ffeeaa', kind: 'flash' },
					subject: { label: 'Ammonite' }
				}
			},
			notes: '# Ammonite\n\nRaking light from the left.',
			gear: []
		}
	},
	/** Version 1: the ambient light lived only in the scene; its plan entry comes with version 2. */
	1: {
		stored: {
			schemaVersion: 1,
			scene: { ...scene, ambient: { ev100: 13, kelvin: 6500 } },
			plan: { elements: { rake: { kind: 'flash', label: 'Marten 24' }, 'ambient-1': { kind: 'label', label: 'Taken id' } }, viewport: { widthM: 1 } },
			notes: '',
			gear: []
		},
		expected: {
			schemaVersion: 2,
			scene: { ...scene, ambient: { ev100: 13, kelvin: 6500 } },
			plan: {
				elements: {
					rake: { kind: 'flash', label: 'Marten 24' },
					'ambient-1': { kind: 'label', label: 'Taken id' },
					'ambient-2': { kind: 'ambient', label: 'Ambient light', source: 'sky' }
				},
				viewport: { widthM: 1 }
			},
			notes: '',
			gear: []
		}
	}
};

describe('migrateDocument', () => {
	it('has a fixture for every migration step', () => {
		expect(MIGRATIONS.length).toBe(CURRENT_SCHEMA_VERSION);
		for (let v = 0; v < CURRENT_SCHEMA_VERSION; v++) expect(FIXTURES[v], `fixture for version ${v}`).toBeDefined();
	});

	for (const [version, { stored, expected }] of Object.entries(FIXTURES)) {
		it(`migrates a version ${version} document to the current version`, () => {
			const r = migrateDocument(structuredClone(stored));
			expect(r.ok, JSON.stringify(r)).toBe(true);
			if (!r.ok) return;
			expect(r.document).toEqual(expected);
			expect(r.migratedFrom).toBe(Number(version));
		});
	}

	it('0 → 1: a version 0 document without notes or layout gets an empty plan and empty notes', () => {
		const r = migrateDocument({ schemaVersion: 0, scene });
		expect(r.ok && r.document).toEqual({ schemaVersion: 2, scene, plan: {}, notes: '', gear: [] });
	});

	it('1 → 2: a plan of {} stays {} and a scene without ambient gets no entry; an ambient entry already there is kept', () => {
		const ambientScene = { ...scene, ambient: { ev100: 10 } };
		expect(migrateDocument({ schemaVersion: 1, scene: ambientScene, plan: {} })).toMatchObject({ ok: true, document: { schemaVersion: 2, plan: {} } });
		const noAmbient = { elements: { rake: { kind: 'flash' } } };
		expect(migrateDocument({ schemaVersion: 1, scene, plan: noAmbient })).toMatchObject({ ok: true, document: { plan: noAmbient } });
		const r = migrateDocument({ schemaVersion: 1, scene: ambientScene, plan: { elements: { rake: { kind: 'flash' } } } });
		expect(r.ok && r.document.plan.elements).toEqual({ rake: { kind: 'flash' }, 'ambient-1': { kind: 'ambient', label: 'Ambient light', source: 'sky' } });
		expect(r.ok && r.document.scene).toEqual(ambientScene);
	});

	it('1 → 2: a version 1 plan that is not an object is still named by the check', () => {
		const r = migrateDocument({ schemaVersion: 1, scene: { ...scene, ambient: { ev100: 10 } }, plan: 'drawing' });
		expect(!r.ok && r.issues[0].path).toEqual(['plan']);
	});

	it('0 → 1: a version 0 document with notes that are not lines names the field', () => {
		const r = migrateDocument({ schemaVersion: 0, scene, notes: 'one string' });
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.issues).toEqual([{ path: ['notes'], message: 'in a version 0 document, notes must be an array of lines' }]);
		const r2 = migrateDocument({ schemaVersion: 0, scene, layout: { rake: 5 } });
		expect(!r2.ok && r2.issues[0].path).toEqual(['layout', 'rake']);
	});

	it('0 → 1: a migrated document is still checked (a bad scene in an old document is named)', () => {
		const r = migrateDocument({ schemaVersion: 0, scene: { ...scene, camera: { ...scene.camera, iso: -5 } } });
		expect(!r.ok && r.issues.map((i) => i.path.join('.'))).toEqual(['scene.camera.iso']);
	});

	it('passes a current document through unchanged', () => {
		const doc = { schemaVersion: CURRENT_SCHEMA_VERSION, scene, plan: {}, notes: 'n', gear: [] };
		const r = migrateDocument(doc);
		expect(r).toEqual({ ok: true, document: doc, migratedFrom: null });
	});

	it('refuses a newer, missing or malformed schemaVersion, naming it', () => {
		const newer = migrateDocument({ schemaVersion: CURRENT_SCHEMA_VERSION + 1, scene });
		expect(!newer.ok && newer.message).toMatch(/newer version of Squarelaw/);
		for (const bad of [{ scene }, { schemaVersion: '1', scene }, { schemaVersion: 1.5, scene }, { schemaVersion: -1, scene }]) {
			const r = migrateDocument(bad);
			expect(!r.ok && r.issues[0].path).toEqual(['schemaVersion']);
		}
		for (const notObject of [null, [], 'doc', 3]) expect(migrateDocument(notObject).ok).toBe(false);
	});

	it('does not change the stored object it reads', () => {
		const stored = structuredClone(FIXTURES[0].stored);
		migrateDocument(stored);
		expect(stored).toEqual(FIXTURES[0].stored);
	});
});
