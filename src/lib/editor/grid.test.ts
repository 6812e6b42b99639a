import { describe, expect, it } from 'vitest';
import { gridLines, gridSteps, scaleBar } from './grid';
import { fitBounds, planToScreen, screenToPlan, zoomAt } from './viewport';

describe('grid', () => {
	it('picks the finest metric step at least 12 px apart, with a major line every power of ten', () => {
		expect(gridSteps('metric', 1000)).toEqual({ minorM: 0.02, majorM: 0.1 });
		expect(gridSteps('metric', 1200)).toEqual({ minorM: 0.01, majorM: 0.1 });
		expect(gridSteps('metric', 100)).toEqual({ minorM: 0.2, majorM: 1 });
		expect(gridSteps('metric', 20000)).toEqual({ minorM: 0.001, majorM: 0.01 });
	});

	it('uses inches and feet in imperial', () => {
		// 1 in = 0.0254 m exactly.
		const s = gridSteps('imperial', 1000);
		expect(s.minorM).toBeCloseTo(0.0127, 12); // ½ in = 12.7 px
		expect(gridSteps('imperial', 200).minorM).toBeCloseTo(3 * 0.0254, 12);
	});

	it('lists the lines in view, majors among them', () => {
		const lines = gridLines({ zoom: 1000, panX: 400, panY: 300 }, 800, 600, { minorM: 0.02, majorM: 0.1 });
		expect(lines.xs[0]).toBeCloseTo(-0.4);
		expect(lines.xs.at(-1)).toBeCloseTo(0.4);
		expect(lines.majorXs).toEqual([-0.4, -0.3, -0.2, -0.1, 0, 0.1, 0.2, 0.3, 0.4]);
	});

	it('the scale bar is a round length no longer than asked', () => {
		expect(scaleBar('metric', 1000)).toEqual({ lengthM: 0.1, lengthPx: 100, label: '10 cm' });
		expect(scaleBar('imperial', 1000).label).toBe('3 in');
		expect(scaleBar('imperial', 100).label).toBe('3 ft'); // 91 px
	});
});

describe('viewport', () => {
	it('plan and screen coordinates invert each other', () => {
		const v = { zoom: 750, panX: 123, panY: -40 };
		const p = screenToPlan(v, planToScreen(v, [0.3, -0.7]));
		expect(p[0]).toBeCloseTo(0.3, 12);
		expect(p[1]).toBeCloseTo(-0.7, 12);
	});

	it('zooming keeps the point under the pointer and stays within limits', () => {
		const v = zoomAt({ zoom: 1000, panX: 0, panY: 0 }, [200, 100], 1e9);
		expect(v.zoom).toBe(40_000);
		expect(screenToPlan(v, [200, 100])[0]).toBeCloseTo(0.2, 12);
	});

	it('fits bounds into the stage, centred', () => {
		const v = fitBounds({ minX: -0.5, minY: -0.1, maxX: 0.5, maxY: 0.1 }, 1096, 600, 48);
		expect(v.zoom).toBeCloseTo(1000);
		expect(planToScreen(v, [0, 0])).toEqual([548, 300]);
	});
});
