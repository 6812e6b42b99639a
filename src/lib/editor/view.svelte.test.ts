import { describe, expect, it } from 'vitest';
import { quartzModel } from './test-fixtures';
import { EditorView, fitTarget, planFrame } from './view.svelte';

const model = quartzModel();

function view(target = fitTarget(model)) {
	return new EditorView({ unitSystem: () => 'metric', fitTarget: () => target });
}

describe('the view', () => {
	it('fits the plan as soon as the stage has a size', () => {
		const v = view({ minX: -0.5, minY: -0.1, maxX: 0.1, maxY: 0.1 });
		v.zoomToFit(); // no stage yet: nothing to fit into
		expect(v.viewport).toEqual({ zoom: 1000, panX: 400, panY: 300 });
		v.setStageSize(800, 600);
		const [x0, y0] = v.screenToPlan([0, 0]);
		const [x1, y1] = v.screenToPlan([800, 600]);
		expect(x0).toBeLessThanOrEqual(-0.5);
		expect(x1).toBeGreaterThanOrEqual(0.1);
		expect(y0).toBeLessThanOrEqual(-0.1);
		expect(y1).toBeGreaterThanOrEqual(0.1);
	});

	it('after that, a resize keeps the plan point at the centre where it was', () => {
		const v = view();
		v.setStageSize(800, 600);
		v.panBy(30, -20);
		const centre = v.centre;
		v.setStageSize(1000, 500);
		expect(v.centre[0]).toBeCloseTo(centre[0], 12);
		expect(v.centre[1]).toBeCloseTo(centre[1], 12);
	});

	it('zooms in and out by the same step about the stage centre; refit shows the plan again', () => {
		const v = view();
		v.setStageSize(800, 600);
		const fitted = v.viewport;
		const centre = v.centre;
		v.zoomIn();
		expect(v.viewport.zoom).toBeCloseTo(fitted.zoom * 1.25, 9);
		expect(v.centre[0]).toBeCloseTo(centre[0], 12);
		v.zoomOut();
		expect(v.viewport.zoom).toBeCloseTo(fitted.zoom, 9);
		v.panBy(200, 0);
		v.refit();
		expect(v.viewport).toEqual(fitted);
	});

	it('the grid follows the zoom and the unit system', () => {
		let unit: 'metric' | 'imperial' = 'metric';
		const v = new EditorView({ unitSystem: () => unit, fitTarget: () => null });
		const metric = v.gridSteps.minorM;
		unit = 'imperial';
		const w = new EditorView({ unitSystem: () => unit, fitTarget: () => null });
		expect(w.gridSteps.minorM).not.toBe(metric);
	});
});

describe('what fit shows', () => {
	it('the elements, with the document’s frame of the table when it has one', () => {
		const content = fitTarget(model)!;
		expect(content.minX).toBeLessThan(-0.45); // the flash 50 cm to the left
		expect(planFrame(model)).toBeNull();
		const framed = { ...model, kept: { ...model.kept, rest: { ...model.kept.rest, viewport: { center: [0, 0], widthM: 2, depthM: 1 } } } };
		expect(planFrame(framed)).toEqual({ minX: -1, maxX: 1, minY: -0.5, maxY: 0.5 });
		expect(fitTarget(framed)).toEqual({ minX: -1, minY: -0.5, maxX: Math.max(1, content.maxX), maxY: Math.max(0.5, content.maxY) });
	});
});
