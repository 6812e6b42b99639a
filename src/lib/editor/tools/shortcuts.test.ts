import { describe, expect, it } from 'vitest';
import { Editor } from '../editor.svelte';
import { quartzScene } from '../test-fixtures';
import { keyParts, SHORTCUT_GROUPS, SHORTCUTS, shortcutFor, shortcutSheet } from './shortcuts';

describe('the shortcut help sheet', () => {
	it('lists every shortcut once, grouped in a fixed order', () => {
		const sheet = shortcutSheet();
		expect(sheet.map((g) => g.group)).toEqual(SHORTCUT_GROUPS.filter((g) => SHORTCUTS.some((s) => s.group === g)));
		expect(sheet.flatMap((g) => g.shortcuts)).toHaveLength(SHORTCUTS.length);
		expect(new Set(sheet.flatMap((g) => g.shortcuts.map((s) => s.action))).size).toBe(SHORTCUTS.length);
	});

	it('reads mod as Ctrl, or ⌘ on a Mac', () => {
		expect(keyParts('mod+Shift+Z', false)).toEqual(['Ctrl', 'Shift', 'Z']);
		expect(keyParts('mod+Z', true)).toEqual(['⌘', 'Z']);
		expect(keyParts('Delete', true)).toEqual(['Delete']);
		expect(keyParts('+', false)).toEqual(['+']);
	});

	it('"?" is the help sheet’s key and no other shortcut’s; the editor claims it without changing the plan', () => {
		expect(SHORTCUTS.filter((s) => s.matches({ key: '?', shiftKey: true })).map((s) => s.action)).toEqual(['show-shortcuts']);
		expect(shortcutFor({ key: '?', shiftKey: true, ctrlKey: true })).toBeUndefined();
		const e = new Editor({ document: { scene: quartzScene(), plan: {} } });
		const steps = e.undoSteps;
		const before = e.model;
		expect(e.keyDown({ key: '?', shiftKey: true })).toBe(true);
		expect(e.model).toBe(before);
		expect(e.undoSteps).toBe(steps);
	});
});
