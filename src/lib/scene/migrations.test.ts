import { describe, expect, it } from 'vitest';
import { CURRENT_SCHEMA_VERSION } from './document';
import { MIGRATIONS, migrateDocument } from './migrations';
import { computeExposure } from '$lib/light/scene';
import { exposureSceneSchema } from '$lib/light/schema';

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
const KESTREL = '7e1a9b30-4c2d-4f1e-9a0b-00000000a001';
const kestrelCopy = {
	id: KESTREL,
	kind: 'flash',
	name: 'Kestrel 40 speedlight',
	spec: { guideNumberM: 28, lowestPower: 1 / 256, syncSpeedS: 1 / 250, calibrationOffsetStops: -0.3, mainsPowered: false },
	copiedAt: '2026-10-06T18:40:00.000Z'
};

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
			schemaVersion: 3,
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
			schemaVersion: 3,
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
	},
	/**
	 * Version 2: the editor multiplied the shelf's −0.3 stop into the guide number (28 × 2^(−0.15) =
	 * 25.24 m, rounded to 0.01), and a calibration from a test shot (GN 26 measured against 28) sat on
	 * the gear copy. Version 3 keeps the shelf's guide number and carries both in the light's offset.
	 */
	2: {
		stored: {
			schemaVersion: 2,
			scene: { ...scene, lights: [{ ...scene.lights[0], guideNumber: 25.24 }] },
			plan: { elements: { rake: { kind: 'flash', label: 'Kestrel 40', gearId: KESTREL } } },
			notes: '',
			gear: [{ ...kestrelCopy, spec: { ...kestrelCopy.spec, calibration: { id: KESTREL, guideNumberM: 26, ratedGuideNumberM: 28, method: 'shot', calibratedAt: '2026-11-02T10:00:00.000Z' } } }]
		},
		expected: {
			schemaVersion: 3,
			scene: { ...scene, lights: [{ ...scene.lights[0], guideNumber: 28, calibrationOffsetStops: 2 * Math.log2(25.24 / 28) + 2 * Math.log2(26 / 28) }] },
			plan: { elements: { rake: { kind: 'flash', label: 'Kestrel 40', gearId: KESTREL } } },
			notes: '',
			gear: [{ ...kestrelCopy, spec: { ...kestrelCopy.spec, calibrationOffsetStops: -0.3 + 2 * Math.log2(26 / 28) } }]
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
		expect(r.ok && r.document).toEqual({ schemaVersion: 3, scene, plan: {}, notes: '', gear: [] });
	});

	it('1 → 2: a plan of {} stays {} and a scene without ambient gets no entry; an ambient entry already there is kept', () => {
		const ambientScene = { ...scene, ambient: { ev100: 10 } };
		expect(migrateDocument({ schemaVersion: 1, scene: ambientScene, plan: {} })).toMatchObject({ ok: true, document: { schemaVersion: 3, plan: {} } });
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

	it('2 → 3: a revision predicts exactly as version 2 computed it (its guide number × measured / rated)', () => {
		// Version 2's exposure: the stored guide number (calibration baked in) scaled by measured / rated.
		const stored = FIXTURES[2].stored as { scene: unknown };
		const v2Scene = exposureSceneSchema.parse(stored.scene);
		const v2 = computeExposure({ ...v2Scene, lights: v2Scene.lights.map((l) => (l.kind === 'flash' ? { ...l, guideNumber: l.guideNumber * (26 / 28) } : l)) });
		const r = migrateDocument(structuredClone(FIXTURES[2].stored));
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		expect(computeExposure(r.document.scene).total.exposureOffsetStops).toBeCloseTo(v2.total.exposureOffsetStops!, 12);
	});

	it('2 → 3: a guide number typed by hand (not the shelf’s baked figure) and a flash without a gear copy are left as they are', () => {
		const typedByHand = { ...(FIXTURES[2].stored as object), scene: { ...scene, lights: [{ ...scene.lights[0], guideNumber: 30 }] }, gear: [kestrelCopy] };
		const r = migrateDocument(structuredClone(typedByHand));
		expect(r.ok && r.document.scene.lights[0]).toEqual({ ...scene.lights[0], guideNumber: 30 });
		const noCopy = migrateDocument({ ...(FIXTURES[2].stored as object), gear: [] });
		expect(noCopy.ok && noCopy.document.scene.lights[0]).toEqual({ ...scene.lights[0], guideNumber: 25.24 });
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
