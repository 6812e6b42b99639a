/**
 * Keyboard shortcuts: one table for the behaviour and for the help sheet. `mod` is Ctrl, or ⌘ on a Mac.
 */
import type { PlanKeyInput } from './types';

export type ShortcutAction =
	| 'undo'
	| 'redo'
	| 'delete'
	| 'duplicate'
	| 'select-all'
	| 'select-next'
	| 'select-previous'
	| 'clear-selection'
	| 'nudge-left'
	| 'nudge-right'
	| 'nudge-up'
	| 'nudge-down'
	| 'rotate-clockwise'
	| 'rotate-anticlockwise'
	| 'aim-at-subject'
	| 'toggle-lock'
	| 'bring-to-front'
	| 'send-to-back'
	| 'zoom-in'
	| 'zoom-out'
	| 'zoom-to-fit'
	| 'select-tool'
	| 'hand-tool'
	| 'toggle-falloff'
	| 'toggle-grid-snap'
	| 'show-shortcuts';

export const SHORTCUT_GROUPS = ['Edit', 'Select', 'Move', 'View', 'Tools', 'Help'] as const;
export type ShortcutGroup = (typeof SHORTCUT_GROUPS)[number];

export interface Shortcut {
	action: ShortcutAction;
	/** As shown on the help sheet. */
	keys: string[];
	description: string;
	group: ShortcutGroup;
	matches(e: PlanKeyInput): boolean;
}

const mod = (e: PlanKeyInput) => Boolean(e.ctrlKey || e.metaKey);
const plain = (e: PlanKeyInput) => !mod(e) && !e.altKey;
const key = (e: PlanKeyInput, ...keys: string[]) => keys.includes(e.key.length === 1 ? e.key.toLowerCase() : e.key);

export const SHORTCUTS: readonly Shortcut[] = [
	{ action: 'undo', keys: ['mod+Z'], description: 'Undo the last change', group: 'Edit', matches: (e) => mod(e) && !e.shiftKey && key(e, 'z') },
	{ action: 'redo', keys: ['mod+Shift+Z', 'mod+Y'], description: 'Redo', group: 'Edit', matches: (e) => mod(e) && ((e.shiftKey && key(e, 'z')) || key(e, 'y')) },
	{ action: 'delete', keys: ['Delete', 'Backspace'], description: 'Delete the selection', group: 'Edit', matches: (e) => plain(e) && key(e, 'Delete', 'Backspace') },
	{ action: 'duplicate', keys: ['mod+D'], description: 'Duplicate the selection', group: 'Edit', matches: (e) => mod(e) && key(e, 'd') },
	{ action: 'toggle-lock', keys: ['L'], description: 'Lock or unlock the selection', group: 'Edit', matches: (e) => plain(e) && key(e, 'l') },
	{ action: 'bring-to-front', keys: [']'], description: 'Draw the selection on top', group: 'Edit', matches: (e) => plain(e) && key(e, ']') },
	{ action: 'send-to-back', keys: ['['], description: 'Draw the selection underneath', group: 'Edit', matches: (e) => plain(e) && key(e, '[') },
	{ action: 'select-all', keys: ['mod+A'], description: 'Select every element', group: 'Select', matches: (e) => mod(e) && key(e, 'a') },
	// Not Tab: Tab must keep moving the keyboard focus out of the plan.
	{ action: 'select-next', keys: ['N'], description: 'Select the next element', group: 'Select', matches: (e) => plain(e) && !e.shiftKey && key(e, 'n') },
	{ action: 'select-previous', keys: ['Shift+N'], description: 'Select the previous element', group: 'Select', matches: (e) => plain(e) && Boolean(e.shiftKey) && key(e, 'n') },
	{ action: 'clear-selection', keys: ['Escape'], description: 'Cancel a drag, or clear the selection', group: 'Select', matches: (e) => key(e, 'Escape') },
	{ action: 'nudge-left', keys: ['←'], description: 'Move left one grid step (Shift: ten)', group: 'Move', matches: (e) => plain(e) && key(e, 'ArrowLeft') },
	{ action: 'nudge-right', keys: ['→'], description: 'Move right one grid step (Shift: ten)', group: 'Move', matches: (e) => plain(e) && key(e, 'ArrowRight') },
	{ action: 'nudge-up', keys: ['↑'], description: 'Move up the plan one grid step (Shift: ten)', group: 'Move', matches: (e) => plain(e) && key(e, 'ArrowUp') },
	{ action: 'nudge-down', keys: ['↓'], description: 'Move down the plan one grid step (Shift: ten)', group: 'Move', matches: (e) => plain(e) && key(e, 'ArrowDown') },
	{ action: 'rotate-clockwise', keys: ['R'], description: 'Turn 15° clockwise', group: 'Move', matches: (e) => plain(e) && !e.shiftKey && key(e, 'r') },
	{ action: 'rotate-anticlockwise', keys: ['Shift+R'], description: 'Turn 15° anticlockwise', group: 'Move', matches: (e) => plain(e) && Boolean(e.shiftKey) && key(e, 'r') },
	{ action: 'aim-at-subject', keys: ['A'], description: 'Aim lights, cards and the camera at the subject', group: 'Move', matches: (e) => plain(e) && key(e, 'a') },
	{ action: 'zoom-in', keys: ['+'], description: 'Zoom in', group: 'View', matches: (e) => !mod(e) && key(e, '+', '=') },
	{ action: 'zoom-out', keys: ['−'], description: 'Zoom out', group: 'View', matches: (e) => !mod(e) && key(e, '-', '_') },
	{ action: 'zoom-to-fit', keys: ['0'], description: 'Show the whole plan', group: 'View', matches: (e) => plain(e) && key(e, '0') },
	{ action: 'toggle-falloff', keys: ['F'], description: 'Show or hide the falloff map', group: 'View', matches: (e) => plain(e) && key(e, 'f') },
	{ action: 'toggle-grid-snap', keys: ['G'], description: 'Snap to the grid on or off (Alt while dragging: no snapping)', group: 'View', matches: (e) => plain(e) && key(e, 'g') },
	{ action: 'select-tool', keys: ['V'], description: 'Select tool', group: 'Tools', matches: (e) => plain(e) && key(e, 'v') },
	{ action: 'hand-tool', keys: ['H', 'Space (hold)'], description: 'Hand tool: drag to pan', group: 'Tools', matches: (e) => plain(e) && key(e, 'h') },
	// The sheet itself opens it (ShortcutSheet.svelte listens for "?"); the editor only claims the key.
	{ action: 'show-shortcuts', keys: ['?'], description: 'Show this list of shortcuts', group: 'Help', matches: (e) => plain(e) && e.key === '?' }
];

export function shortcutFor(e: PlanKeyInput): Shortcut | undefined {
	return SHORTCUTS.find((s) => s.matches(e));
}

/** The table for the help sheet: groups in a fixed order, each with its shortcuts in table order. */
export function shortcutSheet(table: readonly Shortcut[] = SHORTCUTS): { group: ShortcutGroup; shortcuts: Shortcut[] }[] {
	return SHORTCUT_GROUPS.map((group) => ({ group, shortcuts: table.filter((s) => s.group === group) })).filter((g) => g.shortcuts.length);
}

/** A key as a person reads it: `mod` becomes Ctrl, or ⌘ on a Mac; the parts of a chord are split. */
export function keyParts(keys: string, mac: boolean): string[] {
	// A "+" between two parts joins them; a "+" on its own (the zoom-in key) is the key itself.
	return keys.split(/(?<=.)\+(?=.)/).map((part) => (part === 'mod' ? (mac ? '⌘' : 'Ctrl') : part));
}
