import { describe, expect, it } from 'vitest';
import { quartzEditor as editor } from './test-fixtures';
import { drag, input } from './tools/test-pointer';

const KEY: [number, number] = [-0.52, 0];

describe('the active tool', () => {
	it('the cursor says what a press would do: move, turn, pan, place', () => {
		const e = editor();
		expect(e.cursor).toBe('default');
		e.pointerMove(input(e, KEY));
		expect(e.cursor).toBe('move');
		e.select(['key']);
		e.toggleLockSelected();
		e.pointerMove(input(e, KEY));
		expect(e.cursor).toBe('pointer'); // locked: it can be picked, not moved
		e.toggleLockSelected();
		drag(e, KEY, [-0.4, 0], { release: false });
		expect(e.cursor).toBe('grabbing');
		e.pointerUp(input(e, [-0.4, 0]));
		e.keyDown({ key: ' ' });
		expect(e.cursor).toBe('grab');
		e.keyUp({ key: ' ' });
		e.startPlacing('flag');
		expect(e.cursor).toBe('copy');
		e.setTool('hand');
		expect([e.toolId, e.placeKind, e.cursor]).toEqual(['hand', null, 'grab']);
	});

	it('switching tools mid-gesture undoes the gesture', () => {
		const e = editor();
		e.select(['key']);
		drag(e, KEY, [-0.3, 0.1], { release: false });
		expect(e.toolState).toBe('dragging');
		e.setTool('hand');
		expect(e.model.elements.key.xM).toBe(-0.5);
		expect(e.toolState).toBe('idle');
	});
});
