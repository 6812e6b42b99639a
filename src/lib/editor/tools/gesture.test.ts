import { describe, expect, it } from 'vitest';
import { rotationHandlePosition } from '../handles';
import { quartzEditor as editor } from '../test-fixtures';
import { drag } from './test-pointer';

describe('a selection gesture (dragging, rotating)', () => {
	it('over a selection that is all locked sets no mark and changes nothing', () => {
		const e = editor();
		e.select(['key']);
		e.setLockedSelected(true);
		const steps = e.undoSteps;
		const before = e.model;
		// Pressing the handle of a locked element does not start a turn; a drag from it draws a box.
		drag(e, rotationHandlePosition(e.model.elements.key, 1000), [-0.3, 0.3]);
		drag(e, [-0.52, 0], [-0.3, 0.1]);
		expect(e.model.elements.key).toEqual(before.elements.key);
		expect(e.undoSteps).toBe(steps);
	});

	it('moves only the unlocked part of a mixed selection, and Escape puts it back', () => {
		const e = editor();
		e.select(['subject']);
		e.setLockedSelected(true);
		e.select(['key', 'subject']);
		drag(e, [-0.52, 0], [-0.42, 0.1], { release: false });
		expect(e.model.elements.key.xM).toBeCloseTo(-0.4, 9);
		expect(e.model.elements.subject.xM).toBe(0);
		expect(e.keyDown({ key: 'Escape' })).toBe(true);
		expect(e.model.elements.key.xM).toBe(-0.5);
		expect(e.toolState).toBe('idle');
	});
});
