import { describe, expect, it } from 'vitest';
import { presentAction } from './keys';
import { stepIndexAfter, stepCounter } from './navigation';

describe('present view keys (common practice: what keyboards and presentation clickers send)', () => {
	it.each([
		['ArrowRight', 'next'],
		['ArrowDown', 'next'],
		['PageDown', 'next'],
		[' ', 'next'],
		['ArrowLeft', 'previous'],
		['ArrowUp', 'previous'],
		['PageUp', 'previous'],
		['Home', 'first'],
		['End', 'last'],
		['f', 'fullscreen'],
		['F', 'fullscreen'],
		['b', 'blank'],
		['B', 'blank'],
		['.', 'blank']
	] as const)('%j is %s', (key, action) => {
		expect(presentAction({ key })).toBe(action);
	});

	it('Shift+Space goes back', () => {
		expect(presentAction({ key: ' ', shiftKey: true })).toBe('previous');
	});

	it('leaves other keys and every shortcut with Ctrl, ⌘ or Alt alone', () => {
		expect(presentAction({ key: 'x' })).toBeNull();
		expect(presentAction({ key: 'Enter' })).toBeNull();
		expect(presentAction({ key: 'f', ctrlKey: true })).toBeNull();
		expect(presentAction({ key: 'ArrowRight', metaKey: true })).toBeNull();
		expect(presentAction({ key: 'PageDown', altKey: true })).toBeNull();
	});

	it('leaves the arrows and Space to the plan while it has focus, but a clicker still steps', () => {
		expect(presentAction({ key: 'ArrowRight' }, { planFocused: true })).toBeNull();
		expect(presentAction({ key: ' ' }, { planFocused: true })).toBeNull();
		expect(presentAction({ key: 'PageDown' }, { planFocused: true })).toBe('next');
		expect(presentAction({ key: 'b' }, { planFocused: true })).toBe('blank');
	});
});

describe('step navigation', () => {
	it('moves one step and holds at both ends', () => {
		expect(stepIndexAfter('next', 0, 3)).toBe(1);
		expect(stepIndexAfter('next', 2, 3)).toBe(2);
		expect(stepIndexAfter('previous', 1, 3)).toBe(0);
		expect(stepIndexAfter('previous', 0, 3)).toBe(0);
	});

	it('jumps to the first and the last', () => {
		expect(stepIndexAfter('first', 2, 3)).toBe(0);
		expect(stepIndexAfter('last', 0, 3)).toBe(2);
	});

	it('brings an index outside the lesson back inside it, and an empty lesson stays at 0', () => {
		expect(stepIndexAfter('next', 7, 3)).toBe(2);
		expect(stepIndexAfter('previous', -4, 3)).toBe(0);
		expect(stepIndexAfter('next', 0, 0)).toBe(0);
	});

	it('counts for people', () => {
		expect(stepCounter(1, 3)).toBe('Step 2 of 3');
		expect(stepCounter(0, 0)).toBe('No steps');
	});
});
