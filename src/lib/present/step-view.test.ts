import { describe, expect, it } from 'vitest';
import { modelFromDocument } from '$lib/editor/model/document';
import { computeExposure } from '$lib/light/scene';
import type { ExposureScene } from '$lib/light/schema';
import { keptDocument, visibleDocument, type StepDocument } from './step-view';

/** The quartz cluster with its key, a card the key lights, and a flag: three steps' worth. */
function quartz(): StepDocument {
	const scene: ExposureScene = {
		camera: { iso: 200, aperture: 16, shutter: 1 / 200, magnification: 0.4 },
		subject: { position: [0, 0, 0.04] },
		lights: [
			{ id: 'key', kind: 'flash', position: [-0.3, 0.2, 0.35], guideNumber: 28, power: 0.25, aim: [0, 0, 0.04], beamAngleDeg: 90, kelvin: 5600 },
			{ id: 'card', kind: 'reflector', position: [0.15, -0.05, 0.08], areaM2: 0.06, reflectance: 0.85, surface: 'diffuse', source: 'key' }
		],
		flags: [{ id: 'flag', from: [0.1, 0.25], to: [0.3, 0.1] }]
	};
	return {
		scene,
		plan: {
			elements: {
				subject: { kind: 'subject', label: 'Quartz cluster' },
				camera: { kind: 'camera', label: 'Camera', position: [0, -0.42, 0.22], rotationDeg: 90 },
				key: { kind: 'flash', label: 'Key' },
				card: { kind: 'reflector', label: 'White card', widthM: 0.2 },
				flag: { kind: 'flag', label: 'Black flag', widthM: 0.2 }
			}
		},
		notes: 'Quartz notes'
	};
}

const lightIds = (scene: ExposureScene) => scene.lights.map((l) => l.id).sort();

describe('a step shows its subset of the revision', () => {
	it('leaves hidden elements out of the plan and out of the exposure, keeping subject and camera', () => {
		const keyAlone = visibleDocument(quartz(), ['key']);
		expect(lightIds(keyAlone.scene)).toEqual(['key']);
		expect(keyAlone.scene.flags ?? []).toEqual([]);
		const ids = Object.keys((keyAlone.plan as { elements: object }).elements).sort();
		expect(ids).toEqual(['camera', 'key', 'subject']);

		const withCard = visibleDocument(quartz(), ['key', 'card']);
		expect(lightIds(withCard.scene)).toEqual(['card', 'key']);
		// The card adds light: the exposure with it is brighter than with the key alone (inverse-square
		// bounce, common practice), and both come from the engine itself.
		const alone = computeExposure(keyAlone.scene).total.x;
		const carded = computeExposure(withCard.scene).total.x;
		expect(carded).toBeGreaterThan(alone);
	});

	it('shows everything when the step names no subset', () => {
		const all = visibleDocument(quartz(), null);
		expect(lightIds(all.scene)).toEqual(['card', 'key']);
		expect(all.scene.flags?.map((f) => f.id)).toEqual(['flag']);
	});

	it('frames every step of a revision alike', () => {
		const a = visibleDocument(quartz(), ['key']).plan as { viewport: unknown };
		const b = visibleDocument(quartz(), ['key', 'card', 'flag']).plan as { viewport: unknown };
		expect(a.viewport).toBeDefined();
		expect(a.viewport).toEqual(b.viewport);
	});
});

describe('keeping a what-if', () => {
	it('writes the moved light over the pinned revision and keeps the hidden elements, notes and camera change', () => {
		const doc = quartz();
		const shown = modelFromDocument(visibleDocument(doc, ['key'])).model;
		const key = shown.elements.key;
		const trial = { ...shown, elements: { ...shown.elements, key: { ...key, xM: -0.2 } }, camera: { ...shown.camera, aperture: 11 } };
		const kept = keptDocument(doc, ['key'], trial);
		expect(lightIds(kept.scene)).toEqual(['card', 'key']);
		expect(kept.scene.flags?.map((f) => f.id)).toEqual(['flag']);
		expect(kept.scene.lights.find((l) => l.id === 'key')!.position[0]).toBeCloseTo(-0.2);
		expect(kept.scene.camera.aperture).toBe(11);
		expect(kept.notes).toBe('Quartz notes');
		// The frame added for the present view is not saved into a plan that had none.
		expect((kept.plan as Record<string, unknown>).viewport).toBeUndefined();
	});

	it('drops a shown element the instructor deleted, but never a hidden one', () => {
		const doc = quartz();
		const shown = modelFromDocument(visibleDocument(doc, ['key', 'card'])).model;
		const { card: _card, ...rest } = shown.elements;
		const kept = keptDocument(doc, ['key', 'card'], { ...shown, elements: rest });
		expect(lightIds(kept.scene)).toEqual(['key']);
		expect(kept.scene.flags?.map((f) => f.id)).toEqual(['flag']);
	});
});
