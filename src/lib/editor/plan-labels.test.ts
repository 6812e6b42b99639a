import { describe, expect, it } from 'vitest';
import { DEMO_SETUPS } from '$lib/server/seed/notebook-data';
import { setupDocumentSchema } from '$lib/scene/document';
import { dimensionLines } from './model/dimensions';
import { modelFromDocument } from './model/document';
import { expandBounds } from './model/geometry';
import { elementsInOrder } from './model/types';
import { AnnotationPlacer, annotationClashes, dimensionDrawing, placeAnnotations } from './plan-labels';
import { fitTarget } from './view.svelte';
import { fitBounds } from './viewport';

/** Every revision of every seeded setup, fitted as the editor fits it on a desktop and on a phone stage. */
const plans = DEMO_SETUPS.flatMap((s) => s.revisions.map((r, i) => ({ name: `${s.title}, revision ${i + 1}`, document: r.document })));
const STAGES = [
	{ name: 'desktop', widthPx: 1000, heightPx: 760 },
	{ name: 'phone', widthPx: 380, heightPx: 500 },
	// The plan's size in the browser at 390 × 844 (60 % of the height, less the page's margins).
	{ name: 'phone in the browser', widthPx: 356, heightPx: 506 }
];

describe('label placement on the seeded plans', () => {
	it('has plans to check', () => expect(plans.length).toBeGreaterThanOrEqual(4));
	for (const plan of plans) {
		for (const stage of STAGES) {
			it(`${plan.name}, ${stage.name}: no label or dimension text overlaps another or an element`, () => {
				const { model } = modelFromDocument(setupDocumentSchema.parse(plan.document));
				const view = fitBounds(expandBounds(fitTarget(model)!, 0.03), stage.widthPx, stage.heightPx);
				const elements = elementsInOrder(model);
				// The stage inside its rulers, as PlanStage passes it.
				const frame = { x0: 20 - view.panX, y0: 20 - view.panY, x1: stage.widthPx - 4 - view.panX, y1: stage.heightPx - 4 - view.panY };
				const placed = placeAnnotations({ elements, dimensions: dimensionLines(model, 'metric'), zoom: view.zoom, frame });
				expect(placed.labels.length).toBe(elements.filter((e) => e.kind !== 'background' && e.label).length);
				expect(annotationClashes(placed, elements, view.zoom)).toEqual([]);
				for (const l of placed.labels) expect(l.box.x0 >= frame.x0 && l.box.x1 <= frame.x1 && l.box.y0 >= frame.y0 && l.box.y1 <= frame.y1, `${l.id} on the stage`).toBe(true);
			});
		}
	}
});

describe('placeAnnotations', () => {
	const subject = { id: 's', kind: 'subject', label: 'Quartz cluster', xM: 0, yM: 0, heightM: 0.05, rotationDeg: 0, locked: false, zIndex: 0, widthM: 0.08, depthM: 0.06, living: false } as const;
	const card = { id: 'c', kind: 'flag', label: 'White card', xM: 0, yM: 0.07, heightM: 0.05, rotationDeg: 90, locked: false, zIndex: 1, widthM: 0.1, panelHeightM: 0.2, tiltDeg: 0 } as const;
	it('moves a label that would sit on another element off to a free side', () => {
		// Below the subject is the card, so the subject's label goes elsewhere; the card's label takes its own first choice.
		const placed = placeAnnotations({ elements: [subject, card] as never, dimensions: [], zoom: 800 });
		expect(annotationClashes(placed, [subject, card] as never, 800)).toEqual([]);
		const s = placed.labels.find((l) => l.id === 's')!;
		expect(s.box.y1).toBeLessThanOrEqual(0); // above the subject (its second choice)
		// The leader runs from the element to the label's nearest edge.
		expect(s.anchor).toEqual([0, 0]);
		expect(s.leaderEnd[1] * 800).toBeCloseTo(s.box.y1, 6);
	});
	it('reuses the placement of what is not being edited while only the live part changes', () => {
		const placer = new AnnotationPlacer();
		const first = placer.place({ elements: [subject, card] as never, dimensions: [], zoom: 800, liveIds: new Set(['c']) });
		const second = placer.place({ elements: [subject, { ...card, yM: 0.2 }] as never, dimensions: [], zoom: 800, liveIds: new Set(['c']) });
		expect(second.labels.find((l) => l.id === 's')).toBe(first.labels.find((l) => l.id === 's'));
		expect(second.labels.find((l) => l.id === 'c')).not.toEqual(first.labels.find((l) => l.id === 'c'));
	});
	it('keeps the words of what is not being edited where they were while the live element moves', () => {
		const still = placeAnnotations({ elements: [subject, card] as never, dimensions: [], zoom: 800, liveIds: new Set(['c']) });
		const moved = placeAnnotations({ elements: [subject, { ...card, yM: 0.2 }] as never, dimensions: [], zoom: 800, liveIds: new Set(['c']) });
		expect(moved.labels.find((l) => l.id === 's')).toEqual(still.labels.find((l) => l.id === 's'));
	});
	it('draws a dimension with extension lines past the dimension line and its text on the far side', () => {
		const d = dimensionDrawing({ id: 'k', from: [0.3, 0], to: [0, 0], distance3dM: 0.3, planDistanceM: 0.3, heightDifferenceM: 0, label: '30.0 cm', heightLabel: null }, 1000)!;
		// Measured along −x, offset to the left of travel (+y… here −y on screen): 16 px away.
		expect(Math.abs(d.a[1]) * 1000).toBeCloseTo(16, 6);
		expect(Math.abs(d.ext1[3]) * 1000).toBeGreaterThan(16);
		expect(Math.abs(d.ext1[1]) * 1000).toBeGreaterThan(0); // stops short of the element
		expect(Math.sign(d.textAt[1])).toBe(Math.sign(d.a[1]));
		expect(Math.abs(d.textAt[1])).toBeGreaterThan(Math.abs(d.a[1]));
		expect(d.angleDeg).toBe(0); // reads from the bottom
	});
});
