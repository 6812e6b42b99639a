import { describe, expect, it } from 'vitest';
import { Editor } from '../editor.svelte';
import { openDocument } from '../model/document';
import { quartzScene } from '../test-fixtures';
import { keyParts, SHORTCUT_GROUPS, SHORTCUTS, shortcutFor, shortcutSheet } from './shortcuts';

describe('the shortcut help sheet', () => {
	it('lists every shortcut it shows once, grouped in a fixed order', () => {
		const sheet = shortcutSheet();
		const shown = SHORTCUTS.filter((s) => s.onSheet !== false);
		expect(sheet.map((g) => g.group)).toEqual(SHORTCUT_GROUPS.filter((g) => shown.some((s) => s.group === g)));
		expect(sheet.flatMap((g) => g.shortcuts)).toHaveLength(shown.length);
		expect(new Set(sheet.flatMap((g) => g.shortcuts.map((s) => s.action))).size).toBe(shown.length);
	});

	it('names no pointer mode and no drawing order that the screen does not show, in our own words', () => {
		const sheet = shortcutSheet().flatMap((g) => g.shortcuts);
		const text = sheet.map((s) => `${s.keys.join(' ')} ${s.description}`).join('\n');
		expect(text).not.toMatch(/select tool|hand tool|to front|to back/i);
		for (const k of ['V', 'H', '[', ']']) expect(sheet.some((s) => s.keys.includes(k)), k).toBe(false);
		expect(sheet.find((s) => s.action === 'hand-tool')).toEqual({ action: 'hand-tool', keys: ['Space (hold)'], description: 'Slide the view: hold Space and drag the plan' });
		// The keys left off the sheet still do what they did.
		for (const [action, k] of [['select-tool', 'v'], ['hand-tool', 'h'], ['bring-to-front', ']'], ['send-to-back', '[']] as const)
			expect(shortcutFor({ key: k })?.action).toBe(action);
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
		const e = new Editor({ document: openDocument({ scene: quartzScene(), plan: {} }) });
		const steps = e.undoSteps;
		const before = e.model;
		expect(e.keyDown({ key: '?', shiftKey: true })).toBe(true);
		expect(e.model).toBe(before);
		expect(e.undoSteps).toBe(steps);
	});
});
