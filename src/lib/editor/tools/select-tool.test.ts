import { describe, expect, it } from 'vitest';
import { setElementProperties } from '../commands-properties';
import { rotationHandlePosition } from '../handles';
import { quartzEditor as editor } from '../test-fixtures';
import { click, drag, input } from './test-pointer';

const KEY: [number, number] = [-0.52, 0]; // on the flash head, just behind its face
const EMPTY: [number, number] = [-0.25, -0.2];

describe('select tool: picking', () => {
	it('a click selects, a click on the empty plan clears', () => {
		const e = editor();
		click(e, KEY);
		expect(e.selectedIds).toEqual(['key']);
		expect(e.toolState).toBe('idle');
		click(e, EMPTY);
		expect(e.selectedIds).toEqual([]);
	});

	it('Shift-click adds to the selection and takes away again', () => {
		const e = editor();
		click(e, KEY);
		click(e, [0, 0.03], { shiftKey: true }); // the subject
		expect(e.selectedIds).toEqual(['key', 'subject']);
		click(e, KEY, { shiftKey: true });
		expect(e.selectedIds).toEqual(['subject']);
	});

	it('a box dragged on the empty plan selects what lies wholly inside it', () => {
		const e = editor();
		drag(e, [-0.7, -0.1], [-0.3, 0.1]);
		expect(e.selectedIds).toEqual(['key']);
		expect(e.marquee).toBeNull();
		drag(e, [-0.7, -0.1], [0.1, 0.1], { shiftKey: true });
		expect([...e.selectedIds].sort()).toEqual(['key', 'subject']);
	});
});

describe('select tool: dragging', () => {
	it('a whole drag is one undo step', () => {
		const e = editor();
		const steps = e.undoSteps;
		drag(e, KEY, [-0.32, 0.1], { steps: 40 });
		expect(e.model.elements.key.xM).toBeCloseTo(-0.3, 9);
		expect(e.model.elements.key.yM).toBeCloseTo(0.1, 9);
		expect(e.undoSteps).toBe(steps + 1);
		e.undo();
		expect(e.model.elements.key.xM).toBe(-0.5);
		expect(e.model.elements.key.yM).toBe(0);
		e.redo();
		expect(e.model.elements.key.xM).toBeCloseTo(-0.3, 9);
	});

	it('Escape during a drag puts everything back and leaves no step', () => {
		const e = editor();
		drag(e, KEY, [-0.2, 0.2], { release: false });
		expect(e.toolState).toBe('dragging');
		expect(e.model.elements.key.xM).not.toBe(-0.5);
		expect(e.keyDown({ key: 'Escape' })).toBe(true);
		expect(e.toolState).toBe('idle');
		expect(e.model.elements.key.xM).toBe(-0.5);
		expect(e.canUndo).toBe(false);
		expect(e.canRedo).toBe(false);
		// The pointer going up afterwards does nothing more.
		e.pointerUp(input(e, [-0.2, 0.2]));
		expect(e.model.elements.key.xM).toBe(-0.5);
	});

	it('snaps the pressed element to the grid; Alt lets it go free', () => {
		const e = editor();
		expect(e.gridStepM).toBeCloseTo(0.02); // 12 px at 1000 px/m → the 2 cm step
		drag(e, KEY, [KEY[0] + 0.1234, KEY[1] + 0.0456]);
		const key = e.model.elements.key;
		expect(key.xM / 0.02).toBeCloseTo(Math.round(key.xM / 0.02), 9);
		expect(key.yM).toBeCloseTo(0.04, 9);
		e.undo();
		drag(e, KEY, [KEY[0] + 0.1234, KEY[1] + 0.0456], { altKey: true });
		expect(e.model.elements.key.xM).toBeCloseTo(-0.5 + 0.1234, 9);
	});

	it('snaps to another element’s position within a few pixels and shows a guide', () => {
		const e = editor();
		// The camera stands at x = 0; drop the flash 5 px (5 mm) beside that line.
		drag(e, KEY, [KEY[0] + 0.505, KEY[1] - 0.151], { release: false });
		expect(e.model.elements.key.xM).toBe(0);
		expect(e.snapLines).toContainEqual(expect.objectContaining({ axis: 'x', atM: 0 }));
		e.pointerUp(input(e, [0, -0.15]));
		expect(e.snapLines).toEqual([]);
	});

	it('moves a multi-selection together, keeping offsets', () => {
		const e = editor();
		e.addElement('reflector', { xM: 0.4, yM: 0 });
		e.select(['key', 'reflector-1']);
		drag(e, KEY, [KEY[0] + 0.1, KEY[1] + 0.1]);
		expect(e.model.elements.key.xM).toBeCloseTo(-0.4, 9);
		expect(e.model.elements['reflector-1'].xM).toBeCloseTo(0.5, 9);
		expect(e.model.elements['reflector-1'].yM).toBeCloseTo(0.1, 9);
		e.undo();
		expect(e.model.elements['reflector-1'].xM).toBe(0.4);
	});

	it('a drag that starts on a locked element draws a box instead of moving it', () => {
		const e = editor();
		e.select(['key']);
		e.setLockedSelected(true);
		drag(e, KEY, [-0.3, -0.1]);
		expect(e.model.elements.key.xM).toBe(-0.5);
		expect(e.undoSteps).toBe(1); // only the lock
	});
});

describe('select tool: rotating', () => {
	it('the handle turns the element; the turn is one step and Escape undoes it', () => {
		const e = editor();
		click(e, KEY);
		const handle = rotationHandlePosition(e.model.elements.key, e.viewport.zoom);
		// Swing the handle from due +x of the light to due +y of it: +90°.
		drag(e, handle, [-0.5, 0.2], { steps: 20, release: false, altKey: true });
		expect(e.toolState).toBe('rotating');
		expect(e.model.elements.key.rotationDeg).toBeCloseTo(90, 6);
		e.keyDown({ key: 'Escape' });
		expect(e.model.elements.key.rotationDeg).toBeCloseTo(0, 9);
		drag(e, handle, [-0.5, 0.2], { steps: 20, shiftKey: true });
		expect(e.model.elements.key.rotationDeg).toBeCloseTo(90, 9);
		expect(e.undoSteps).toBe(1);
	});

	it('snaps to facing the subject when within 3°', () => {
		const e = editor();
		e.execute(setElementProperties('key', { rotationDeg: 40 }));
		click(e, KEY);
		const handle = rotationHandlePosition(e.model.elements.key, e.viewport.zoom);
		// 2° short of due +x of the light: the subject's direction.
		const r = 0.15;
		drag(e, handle, [-0.5 + r * Math.cos((2 * Math.PI) / 180), r * Math.sin((2 * Math.PI) / 180)]);
		expect(e.model.elements.key.rotationDeg).toBeCloseTo(0, 9);
	});
});

describe('panning and zooming', () => {
	it('the hand tool, Space held and the middle button pan; none of them is an undo step', () => {
		const e = editor();
		e.setTool('hand');
		drag(e, [0, 0], [0.1, 0]);
		expect(e.viewport.panX).toBeCloseTo(500);
		e.setTool('select');
		e.keyDown({ key: ' ' });
		drag(e, [0, 0], [0, 0.05]);
		e.keyUp({ key: ' ' });
		expect(e.viewport.panY).toBeCloseTo(350);
		drag(e, KEY, [-0.4, 0], { button: 1 });
		expect(e.model.elements.key.xM).toBe(-0.5);
		expect(e.canUndo).toBe(false);
	});

	it('the wheel zooms about the pointer', () => {
		const e = editor();
		const before = e.screenToPlan([600, 200]);
		e.wheel({ screenX: 600, screenY: 200, deltaY: -250 });
		expect(e.viewport.zoom).toBeCloseTo(1000 * 2 ** 0.5);
		const after = e.screenToPlan([600, 200]);
		expect(after[0]).toBeCloseTo(before[0], 9);
		expect(after[1]).toBeCloseTo(before[1], 9);
	});

	it('two fingers pinch: the first finger’s drag is undone and the view zooms about the midpoint', () => {
		const e = editor();
		e.pointerDown({ ...input(e, KEY), pointerId: 1, pointerType: 'touch' });
		e.pointerMove({ ...input(e, [-0.4, 0]), pointerId: 1, pointerType: 'touch' });
		expect(e.model.elements.key.xM).not.toBe(-0.5);
		// The first finger is at x = 0 px; the second lands 100 px to its right.
		e.pointerDown({ screenX: 100, screenY: 300, pointerId: 2, pointerType: 'touch' });
		expect(e.model.elements.key.xM).toBe(-0.5);
		const mid = e.screenToPlan([50, 300]);
		// Spread from 100 px apart to 200 px apart about the same midpoint.
		e.pointerMove({ screenX: -50, screenY: 300, pointerId: 1, pointerType: 'touch' });
		e.pointerMove({ screenX: 150, screenY: 300, pointerId: 2, pointerType: 'touch' });
		expect(e.viewport.zoom).toBeCloseTo(2000);
		const midAfter = e.screenToPlan([50, 300]);
		expect(midAfter[0]).toBeCloseTo(mid[0], 9);
		expect(midAfter[1]).toBeCloseTo(mid[1], 9);
		e.pointerUp({ screenX: -50, screenY: 300, pointerId: 1, pointerType: 'touch' });
		e.pointerUp({ screenX: 150, screenY: 300, pointerId: 2, pointerType: 'touch' });
		expect(e.canUndo).toBe(false);
		expect(e.toolState).toBe('idle');
	});
});

describe('place tool', () => {
	it('puts the palette’s element where the plan is pressed, on the grid, and selects it', () => {
		const e = editor();
		e.startPlacing('flag');
		expect(e.toolId).toBe('place');
		click(e, [0.211, -0.129]);
		const flag = e.model.elements['flag-1'];
		expect([flag.xM, flag.yM]).toEqual([expect.closeTo(0.22, 9), expect.closeTo(-0.12, 9)]);
		expect(e.selectedIds).toEqual(['flag-1']);
		expect(e.toolId).toBe('select');
		e.undo();
		expect(e.model.elements['flag-1']).toBeUndefined();
	});

	it('Escape leaves the place tool without placing', () => {
		const e = editor();
		e.startPlacing('diffuser');
		e.keyDown({ key: 'Escape' });
		expect(e.toolId).toBe('select');
		click(e, [0.3, 0.3]);
		expect(Object.keys(e.model.elements)).not.toContain('diffuser-1');
	});
});
