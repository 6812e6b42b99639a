import { describe, expect, it } from 'vitest';
import { computeExposure } from '$lib/light/scene';
import { exposureSceneSchema } from '$lib/light/schema';
import { setupDocumentSchema, type SetupDocumentInput } from '$lib/scene/document';
import { addElement, removeElements } from '../commands';
import { setElementProperties } from '../commands-properties';
import { applyDiff } from './diff';
import { documentFromModel, modelFromDocument } from './document';
import { CURRENT_SCHEMA_VERSION } from '$lib/scene/version';

/** The quartz cluster as the notebook stores it: plan entries with gear ids, a fitted softbox, a label, a print frame. */
const GEAR_FLASH = '11111111-1111-4111-8111-111111111111';
const GEAR_BOX = '22222222-2222-4222-8222-222222222222';
const quartz: SetupDocumentInput = {
	schemaVersion: CURRENT_SCHEMA_VERSION,
	scene: {
		camera: { iso: 100, aperture: 16, shutter: 1 / 200, magnification: 0.4 },
		subject: { position: [0, 0, 0.04] },
		lights: [
			{ id: 'key', kind: 'flash', position: [-0.3, 0.2, 0.35], guideNumber: 40, power: 0.25, lossStops: 1.5, beamAngleDeg: 90 },
			{ id: 'card', kind: 'reflector', position: [0.25, -0.05, 0.06], areaM2: 0.04, reflectance: 0.85, surface: 'diffuse', source: 'key' }
		]
	},
	plan: {
		elements: {
			subject: { kind: 'subject', label: 'Quartz cluster', widthM: 0.09, depthM: 0.07, heightM: 0.08, colour: '#e8e4dc' },
			camera: { kind: 'camera', label: 'Corvid M2', position: [0, -0.42, 0.22], rotationDeg: 90 },
			lens: { kind: 'label', label: 'Heron 100 mm macro', attachedTo: 'camera' },
			key: { kind: 'flash', label: 'Kestrel 40 in softbox', rotationDeg: -35, gearId: GEAR_FLASH },
			softbox: { kind: 'modifier', label: '30 cm softbox', widthM: 0.3, depthM: 0.3, attachedTo: 'key', gearId: GEAR_BOX },
			card: { kind: 'reflector', label: 'White card', widthM: 0.2, depthM: 0.01, rotationDeg: 160, colour: '#ffffff' },
			velvet: { kind: 'background', label: 'Black velvet', position: [0, 0.05, 0], widthM: 0.6, depthM: 0.5, colour: '#141414', locked: true }
		},
		viewport: { center: [0, 0], widthM: 1.2, depthM: 1 }
	},
	notes: '# Quartz on velvet',
	gear: []
};

describe('reading and writing the notebook’s setup document', () => {
	const doc = setupDocumentSchema.parse(quartz);
	const { model, notes } = modelFromDocument(doc);

	it('reads what the notebook wrote: labels, sizes, positions of plan-only elements, the fitted modifier', () => {
		expect(notes).toEqual([]);
		const els = model.elements;
		expect(els.subject).toMatchObject({ kind: 'subject', label: 'Quartz cluster', widthM: 0.09, depthM: 0.07, heightM: 0.04 });
		expect(els.camera).toMatchObject({ kind: 'camera', xM: 0, yM: -0.42, heightM: 0.22, rotationDeg: 90 });
		expect(els.velvet).toMatchObject({ kind: 'background', colour: '#141414', locked: true, widthM: 0.6 });
		expect(els.key.kind === 'flash' && els.key.modifier).toEqual({ name: '30 cm softbox', beamAngleDeg: 90, lossStops: 1.5, sizeM: 0.3 });
		expect(els.key.kind === 'flash' && els.key.otherLossStops).toBe(0);
		expect(els.card).toMatchObject({ kind: 'reflector', label: 'White card', widthM: 0.2 });
		expect(Object.keys(els)).not.toContain('lens');
		expect(Object.keys(els)).not.toContain('softbox');
	});

	it('computes the same exposure as the document’s own scene seen from the plan’s camera', () => {
		// The plan's camera gives the scene its place (the subject faces it: Lambert's cosine law).
		const before = computeExposure(exposureSceneSchema.parse({ ...doc.scene, camera: { ...doc.scene.camera, position: [0, -0.42, 0.22] } }));
		const after = computeExposure(exposureSceneSchema.parse(documentFromModel(model).scene));
		expect(after.total.x / before.total.x).toBeCloseTo(1, 9);
	});

	it('writes a document the notebook’s schema accepts, keeping what the editor does not use', () => {
		const out = documentFromModel(model, doc.notes, doc.gear);
		const checked = setupDocumentSchema.safeParse(JSON.parse(JSON.stringify(out)));
		expect(checked.success, JSON.stringify(checked.error?.issues)).toBe(true);
		const els = out.plan.elements!;
		expect(els.key.gearId).toBe(GEAR_FLASH);
		expect(els.subject.heightM).toBe(0.08); // the subject's own height, not the editor's
		expect(els.subject.colour).toBe('#e8e4dc');
		expect(els.softbox).toEqual(quartz.plan!.elements!.softbox);
		expect(els.lens).toEqual(quartz.plan!.elements!.lens);
		expect(out.plan.viewport).toEqual({ center: [0, 0], widthM: 1.2, depthM: 1 });
		expect(out.notes).toBe('# Quartz on velvet');
	});

	it('drops a fitted modifier with its light, and writes a new element in the document’s terms', () => {
		let m = model;
		for (const c of [removeElements(['key']), addElement('diffuser', { xM: 0.1, yM: 0.2, heightM: 0.15 })]) {
			const r = c(m);
			if (!r.ok) throw new Error(r.error.message);
			m = applyDiff(m, r.diff);
		}
		const r = setElementProperties('diffuser-1', { panelHeightM: 0.5 })(m);
		if (!r.ok) throw new Error(r.error.message);
		m = applyDiff(m, r.diff);
		const out = documentFromModel(m);
		expect(out.plan.elements!.softbox).toBeUndefined();
		expect(out.plan.elements!.key).toBeUndefined();
		expect(out.plan.elements!['diffuser-1']).toMatchObject({ kind: 'diffuser', position: [0.1, 0.2, 0.15], heightM: 0.5, lossStops: 1 });
		expect(setupDocumentSchema.safeParse(JSON.parse(JSON.stringify(out))).success).toBe(true);
	});

	it('lays out an empty plan ({}) and writes a valid document from it', () => {
		const bare = setupDocumentSchema.parse({ ...quartz, plan: {} });
		const read = modelFromDocument(bare);
		expect(Object.values(read.model.elements).map((e) => e.kind).sort()).toEqual(['camera', 'flash', 'reflector', 'subject']);
		expect(setupDocumentSchema.safeParse(JSON.parse(JSON.stringify(documentFromModel(read.model)))).success).toBe(true);
	});
});
