import { describe, expect, it } from 'vitest';
import { computeExposure } from '$lib/light/scene';
import { setupDocumentSchema, type SetupDocument } from '$lib/scene/document';
import { CURRENT_SCHEMA_VERSION } from '$lib/scene/version';
import { hiddenClosure, stepDocument, stepElements, stepExposure, visibleElementIds } from './step-document';

/** The quartz cluster of the demo: a flash in a softbox, a white card lit by it, a flag off the lens. */
function quartz(): SetupDocument {
	return setupDocumentSchema.parse({
		schemaVersion: CURRENT_SCHEMA_VERSION,
		scene: {
			camera: { iso: 200, aperture: 16, shutter: 1 / 200, magnification: 0.4 },
			subject: { position: [0, 0, 0.04] },
			lights: [
				{ id: 'key', kind: 'flash', position: [-0.3, 0.2, 0.35], guideNumber: 28, power: 0.25, lossStops: 1.7 },
				{ id: 'card', kind: 'reflector', position: [0.15, -0.05, 0.08], areaM2: 0.06, reflectance: 0.85, surface: 'diffuse', source: 'key' }
			],
			flags: [{ id: 'flag', from: [-0.2, -0.15], to: [-0.08, -0.25] }]
		},
		plan: {
			elements: {
				subject: { kind: 'subject', label: 'Quartz cluster' },
				camera: { kind: 'camera', label: 'Camera', position: [0, -0.42, 0.22] },
				key: { kind: 'flash', label: 'Key in softbox' },
				softbox: { kind: 'modifier', label: '30 cm softbox', attachedTo: 'key' },
				card: { kind: 'reflector', label: 'White card' },
				flag: { kind: 'flag', label: 'Black flag' }
			}
		},
		notes: '',
		gear: []
	});
}

describe('a step shows some elements of one revision', () => {
	it('lists every element, with the subject and camera fixed', () => {
		const els = stepElements(quartz());
		expect(els.map((e) => e.id)).toEqual(['subject', 'camera', 'key', 'softbox', 'card', 'flag']);
		expect(els.filter((e) => e.fixed).map((e) => e.id)).toEqual(['subject', 'camera']);
	});

	it('hides what is fitted to a hidden light and a card with no light left to return; never the subject or camera', () => {
		expect([...hiddenClosure(quartz(), ['key', 'subject'])].sort()).toEqual(['card', 'key', 'softbox']);
		expect(visibleElementIds(quartz(), ['card', 'flag'])).toEqual(['subject', 'camera', 'key', 'softbox']);
	});

	it('leaves hidden elements out of the plan and the scene', () => {
		const shown = stepDocument(quartz(), ['card', 'flag']);
		expect(Object.keys(shown.plan.elements ?? {})).toEqual(['subject', 'camera', 'key', 'softbox']);
		expect(shown.scene.lights.map((l) => l.id)).toEqual(['key']);
		expect(shown.scene.flags).toEqual([]);
		// The stored document is not touched.
		expect(quartz().scene.lights).toHaveLength(2);
	});

	it('computes the exposure of what is shown: the key alone is the engine on a scene without the card', () => {
		const doc = quartz();
		const alone = stepExposure(doc, ['card', 'flag']);
		const byHand = computeExposure({ ...doc.scene, lights: [doc.scene.lights[0]], flags: [] });
		expect(alone.ok).toBe(true);
		if (!alone.ok) return;
		expect(alone.result.total.exposureOffsetStops).toBeCloseTo(byHand.total.exposureOffsetStops!, 10);
		expect(alone.result.lights.map((l) => l.id)).toEqual(['key']);
	});

	it('adding the card brightens the subject; the lens flag, off the light paths, changes nothing', () => {
		const doc = quartz();
		const alone = stepExposure(doc, ['card', 'flag']);
		const withCard = stepExposure(doc, ['flag']);
		const all = stepExposure(doc, []);
		if (!alone.ok || !withCard.ok || !all.ok) throw new Error('every step computes');
		// A diffuse card lit by the key adds light at the subject (inverse-square bounce, common practice).
		expect(withCard.result.total.exposureOffsetStops).toBeGreaterThan(alone.result.total.exposureOffsetStops!);
		expect(all.result.total.exposureOffsetStops).toBeCloseTo(withCard.result.total.exposureOffsetStops!, 10);
	});

	it('hiding every light leaves a scene the engine still answers (no light at the subject)', () => {
		const none = stepExposure(quartz(), ['key']);
		expect(none.ok).toBe(true);
		if (none.ok) expect(none.result.lights).toEqual([]);
	});
});
