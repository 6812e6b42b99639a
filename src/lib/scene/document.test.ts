import { describe, expect, it } from 'vitest';
import { CURRENT_SCHEMA_VERSION, MAX_NOTES_CHARS, referencedGearIds, setupDocumentSchema } from './document';
import { MAX_DOCUMENT_DEPTH, MAX_DOCUMENT_ENTRIES } from '$lib/json-limits';

const scene = {
	camera: { iso: 100, aperture: 16, shutter: 1 / 200, magnification: 0.5 },
	subject: { position: [0, 0, 0.04] },
	lights: [{ id: 'key', kind: 'flash', position: [-0.3, 0.2, 0.35], guideNumber: 40, power: 0.25 }]
};

function paths(result: ReturnType<typeof setupDocumentSchema.safeParse>) {
	return result.success ? [] : result.error.issues.map((i) => i.path.join('.'));
}

describe('setupDocumentSchema', () => {
	it('accepts a scene alone, with an empty plan and empty notes (API.md)', () => {
		const r = setupDocumentSchema.safeParse({ schemaVersion: CURRENT_SCHEMA_VERSION, scene, plan: {}, notes: '' });
		expect(r.success).toBe(true);
		expect(r.data).toEqual({ schemaVersion: CURRENT_SCHEMA_VERSION, scene, plan: {}, notes: '', gear: [] });
		const bare = setupDocumentSchema.safeParse({ schemaVersion: CURRENT_SCHEMA_VERSION, scene });
		expect(bare.success && bare.data.plan).toEqual({});
		expect(bare.success && bare.data.notes).toBe('');
	});

	it('checks the scene with the exposure schema and names the field', () => {
		const bad = { ...scene, lights: [{ ...scene.lights[0], power: 2 }] };
		expect(paths(setupDocumentSchema.safeParse({ schemaVersion: CURRENT_SCHEMA_VERSION, scene: bad }))).toEqual(['scene.lights.0.power']);
		const unknownKind = { ...scene, lights: [{ ...scene.lights[0], kind: 'laser' }] };
		expect(paths(setupDocumentSchema.safeParse({ schemaVersion: CURRENT_SCHEMA_VERSION, scene: unknownKind }))[0]).toMatch(/^scene\.lights\.0/);
	});

	it('checks plan elements and keeps fields a newer editor adds', () => {
		const plan = {
			elements: {
				key: { kind: 'flash', label: 'Key', rotationDeg: -35, widthM: 0.1, colour: '#f2c14e', futureField: { a: 1 } },
				velvet: { kind: 'background', position: [0, 0.05, 0], widthM: 0.6, depthM: 0.5, locked: true }
			},
			viewport: { center: [0, 0], widthM: 1.2, depthM: 1 }
		};
		const ok = setupDocumentSchema.safeParse({ schemaVersion: CURRENT_SCHEMA_VERSION, scene, plan });
		expect(ok.success).toBe(true);
		expect(ok.data?.plan.elements?.key).toMatchObject({ futureField: { a: 1 } });
		const bad = setupDocumentSchema.safeParse({
			schemaVersion: CURRENT_SCHEMA_VERSION,
			scene,
			plan: { elements: { key: { rotationDeg: Number.NaN, colour: 'red', kind: 'spaceship', widthM: -1, gearId: 'x' } } }
		});
		expect(paths(bad).sort()).toEqual(
			['plan.elements.key.colour', 'plan.elements.key.gearId', 'plan.elements.key.kind', 'plan.elements.key.rotationDeg', 'plan.elements.key.widthM'].sort()
		);
	});

	it('bounds what the loose objects keep: nesting and entries, naming the field', () => {
		const deepValue = (levels: number) => JSON.parse('{"a":'.repeat(levels) + '1' + '}'.repeat(levels));
		// futureField's object is at level 4 (the document is 0): 28 nested objects end at level 31, 29 at 32.
		const within = { elements: { key: { kind: 'flash', futureField: deepValue(28) } } };
		expect(setupDocumentSchema.safeParse({ schemaVersion: CURRENT_SCHEMA_VERSION, scene, plan: within }).success).toBe(true);
		for (const levels of [29, 2000, 10_000]) {
			const r = setupDocumentSchema.safeParse({ schemaVersion: CURRENT_SCHEMA_VERSION, scene, plan: { elements: { key: { futureField: deepValue(levels) } } } });
			expect(r.success, `${levels} levels`).toBe(false);
			expect(paths(r)[0]).toMatch(/^plan\.elements\.key\.futureField(\.a)+$/);
			expect(r.error?.issues[0].message).toBe(`nests more than ${MAX_DOCUMENT_DEPTH} levels deep`);
		}
		const wide = { elements: { key: { futureField: Array(MAX_DOCUMENT_ENTRIES + 1).fill(0) } }, viewport: { extra: {} } };
		expect(paths(setupDocumentSchema.safeParse({ schemaVersion: CURRENT_SCHEMA_VERSION, scene, plan: wide }))).toEqual(['plan.elements.key.futureField']);
		const manyKeys = Object.fromEntries(Array.from({ length: MAX_DOCUMENT_ENTRIES + 1 }, (_, i) => [`k${i}`, i]));
		expect(paths(setupDocumentSchema.safeParse({ schemaVersion: CURRENT_SCHEMA_VERSION, scene, plan: { viewport: manyKeys } }))).toEqual(['plan.viewport']);
	});

	it('refuses text that cannot be stored anywhere in the document', () => {
		expect(paths(setupDocumentSchema.safeParse({ schemaVersion: CURRENT_SCHEMA_VERSION, scene, notes: 'a\u0000b' }))).toEqual(['notes']);
		expect(paths(setupDocumentSchema.safeParse({ schemaVersion: CURRENT_SCHEMA_VERSION, scene, notes: 'a\ud800b' }))).toEqual(['notes']);
		const label = { elements: { key: { label: 'Key\u0000' } } };
		expect(paths(setupDocumentSchema.safeParse({ schemaVersion: CURRENT_SCHEMA_VERSION, scene, plan: label }))).toEqual(['plan.elements.key.label']);
	});

	it('limits notes', () => {
		const r = setupDocumentSchema.safeParse({ schemaVersion: CURRENT_SCHEMA_VERSION, scene, notes: 'x'.repeat(MAX_NOTES_CHARS + 1) });
		expect(paths(r)).toEqual(['notes']);
		expect(paths(setupDocumentSchema.safeParse({ schemaVersion: CURRENT_SCHEMA_VERSION, scene, notes: ['a', 'b'] }))).toEqual(['notes']);
	});

	it('checks the gear copies against their kind and refuses a copy held twice', () => {
		const id = '7e1a9b30-4c2d-4f1e-9a0b-00000000a001';
		const copy = { id, kind: 'flash', name: 'Kestrel 40', spec: { guideNumberM: 40, lowestPower: 1 / 256, syncSpeedS: 1 / 250 }, copiedAt: '2026-10-06T18:40:00Z' };
		expect(setupDocumentSchema.safeParse({ schemaVersion: CURRENT_SCHEMA_VERSION, scene, gear: [copy] }).success).toBe(true);
		expect(paths(setupDocumentSchema.safeParse({ schemaVersion: CURRENT_SCHEMA_VERSION, scene, gear: [{ ...copy, spec: { guideNumberM: -3 } }] }))).toContain('gear.0.spec.guideNumberM');
		expect(paths(setupDocumentSchema.safeParse({ schemaVersion: CURRENT_SCHEMA_VERSION, scene, gear: [copy, copy] }))).toEqual(['gear.1.id']);
	});

	it('refuses another schemaVersion (older ones go through migrateDocument)', () => {
		expect(paths(setupDocumentSchema.safeParse({ schemaVersion: 0, scene }))).toEqual(['schemaVersion']);
	});

	it('lists the gear the plan refers to, once each', () => {
		const a = '7e1a9b30-4c2d-4f1e-9a0b-00000000a001';
		const b = '7e1a9b30-4c2d-4f1e-9a0b-00000000b001';
		expect(referencedGearIds({ plan: { elements: { x: { gearId: b }, y: { gearId: a }, z: { gearId: b }, w: {} } } })).toEqual([a, b]);
		expect(referencedGearIds({ plan: {} })).toEqual([]);
		const lens = '7e1a9b30-4c2d-4f1e-9a0b-00000000d001';
		const fitted = { cam: { kind: 'camera' as const, lens: { name: 'Heron', gearId: lens } }, key: { modifier: { gearId: b } } };
		expect(referencedGearIds({ plan: { elements: fitted } })).toEqual([b, lens]);
	});
});
