import { describe, expect, it } from 'vitest';
import { InspectorSheet, nearestStop, sheetHeights } from './sheet.svelte';

// A phone window 844 px tall (the project's phone size) with a handle and tab bar 76 px tall.
const heights = sheetHeights(844, 76);

describe('the inspector sheet', () => {
	it('rests at its handle and tabs, half the window, or nearly all of it', () => {
		expect(heights).toEqual({ collapsed: 76, half: 422, full: 743 });
		// A window too short for half of it to hold the tabs still shows them.
		expect(sheetHeights(120, 76)).toEqual({ collapsed: 76, half: 76, full: 106 });
		expect(nearestStop(100, heights)).toBe('collapsed');
		expect(nearestStop(500, heights)).toBe('half');
		expect(nearestStop(700, heights)).toBe('full');
	});

	it('opens to half, collapses, toggles and steps between its stops', () => {
		const sheet = new InspectorSheet();
		expect(sheet.stop).toBe('collapsed');
		expect(sheet.expanded).toBe(false);
		sheet.open();
		expect(sheet.stop).toBe('half');
		sheet.step(1);
		expect(sheet.stop).toBe('full');
		sheet.step(1);
		expect(sheet.stop).toBe('full');
		sheet.open(); // opening an open sheet keeps its height
		expect(sheet.stop).toBe('full');
		sheet.toggle();
		expect(sheet.stop).toBe('collapsed');
		sheet.step(-1);
		expect(sheet.stop).toBe('collapsed');
		sheet.toggle();
		expect(sheet.stop).toBe('half');
		sheet.collapse();
		expect(sheet.expanded).toBe(false);
	});

	it('follows a dragged handle and comes to rest at the nearest stop', () => {
		const sheet = new InspectorSheet();
		sheet.press(1, 800, heights.collapsed);
		sheet.move(1, 797, heights); // a tremble is not a drag
		expect(sheet.dragHeightPx).toBeNull();
		sheet.move(2, 400, heights); // another pointer is ignored
		expect(sheet.dragHeightPx).toBeNull();
		sheet.move(1, 500, heights);
		expect(sheet.dragHeightPx).toBe(376);
		expect(sheet.expanded).toBe(true);
		sheet.move(1, -200, heights); // never taller than the full stop
		expect(sheet.dragHeightPx).toBe(heights.full);
		sheet.move(1, 150, heights);
		sheet.release(1, heights);
		expect(sheet.stop).toBe('full');
		expect(sheet.dragHeightPx).toBeNull();
		// The click that ends the drag is taken, so it does not toggle the sheet shut again.
		expect(sheet.takeDragClick()).toBe(true);
		expect(sheet.takeDragClick()).toBe(false);

		sheet.press(1, 100, heights.full);
		sheet.move(1, 800, heights);
		expect(sheet.dragHeightPx).toBe(heights.collapsed);
		sheet.release(1, heights);
		expect(sheet.stop).toBe('collapsed');
	});

	it('treats a press without a drag as a tap', () => {
		const sheet = new InspectorSheet();
		sheet.press(1, 800, heights.collapsed);
		sheet.move(1, 802, heights);
		sheet.release(1, heights);
		expect(sheet.stop).toBe('collapsed');
		expect(sheet.takeDragClick()).toBe(false);
	});
});
