/**
 * Keyboard shortcuts: one table for the behaviour and for the help sheet. `mod` is Ctrl, or ⌘ on a Mac.
 * The sheet names each key in the words of the control it stands for on screen (Undo, Duplicate, Lock,
 * Aim at the subject, the falloff map), and lists only keys whose action a person can see: the keys
 * that switch between pointer modes (V, H) and change the drawing order ([, ]) still work but are left
 * off the sheet (`onSheet: false`) while no control on screen shows those modes or that order.
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

export const SHORTCUT_GROUPS = ['Changes', 'Picking elements', 'Placing and turning', 'The view', 'This list'] as const;
export type ShortcutGroup = (typeof SHORTCUT_GROUPS)[number];

export interface Shortcut {
	action: ShortcutAction;
	/** As shown on the help sheet. */
	keys: string[];
	description: string;
	group: ShortcutGroup;
	/** False: the key works, but nothing on screen shows what it does, so the sheet leaves it out. */
	onSheet?: false;
	matches(e: PlanKeyInput): boolean;
}

const mod = (e: PlanKeyInput) => Boolean(e.ctrlKey || e.metaKey);
const plain = (e: PlanKeyInput) => !mod(e) && !e.altKey;
const key = (e: PlanKeyInput, ...keys: string[]) => keys.includes(e.key.length === 1 ? e.key.toLowerCase() : e.key);

export const SHORTCUTS: readonly Shortcut[] = [
	{ action: 'undo', keys: ['mod+Z'], description: 'Undo: take back the last change', group: 'Changes', matches: (e) => mod(e) && !e.shiftKey && key(e, 'z') },
	{ action: 'redo', keys: ['mod+Shift+Z', 'mod+Y'], description: 'Redo: put it back', group: 'Changes', matches: (e) => mod(e) && ((e.shiftKey && key(e, 'z')) || key(e, 'y')) },
	{ action: 'delete', keys: ['Delete', 'Backspace'], description: 'Delete the picked elements', group: 'Changes', matches: (e) => plain(e) && key(e, 'Delete', 'Backspace') },
	{ action: 'duplicate', keys: ['mod+D'], description: 'Duplicate the picked elements', group: 'Changes', matches: (e) => mod(e) && key(e, 'd') },
	{ action: 'toggle-lock', keys: ['L'], description: 'Lock or unlock the picked elements in place', group: 'Changes', matches: (e) => plain(e) && key(e, 'l') },
	{ action: 'bring-to-front', keys: [']'], description: 'Draw over the others', group: 'Changes', onSheet: false, matches: (e) => plain(e) && key(e, ']') },
	{ action: 'send-to-back', keys: ['['], description: 'Draw under the others', group: 'Changes', onSheet: false, matches: (e) => plain(e) && key(e, '[') },
	{ action: 'select-all', keys: ['mod+A'], description: 'Pick every element', group: 'Picking elements', matches: (e) => mod(e) && key(e, 'a') },
	// Not Tab: Tab must keep moving the keyboard focus out of the plan.
	{ action: 'select-next', keys: ['N'], description: 'Pick the next element in the list', group: 'Picking elements', matches: (e) => plain(e) && !e.shiftKey && key(e, 'n') },
	{ action: 'select-previous', keys: ['Shift+N'], description: 'Pick the one before', group: 'Picking elements', matches: (e) => plain(e) && Boolean(e.shiftKey) && key(e, 'n') },
	{ action: 'clear-selection', keys: ['Escape'], description: 'Stop a drag where it began, or let go of what is picked', group: 'Picking elements', matches: (e) => key(e, 'Escape') },
	{ action: 'nudge-left', keys: ['←'], description: 'Slide left one step (with Shift: ten)', group: 'Placing and turning', matches: (e) => plain(e) && key(e, 'ArrowLeft') },
	{ action: 'nudge-right', keys: ['→'], description: 'Slide right one step (with Shift: ten)', group: 'Placing and turning', matches: (e) => plain(e) && key(e, 'ArrowRight') },
	{ action: 'nudge-up', keys: ['↑'], description: 'Slide away from the camera side one step (with Shift: ten)', group: 'Placing and turning', matches: (e) => plain(e) && key(e, 'ArrowUp') },
	{ action: 'nudge-down', keys: ['↓'], description: 'Slide towards the camera side one step (with Shift: ten)', group: 'Placing and turning', matches: (e) => plain(e) && key(e, 'ArrowDown') },
	{ action: 'rotate-clockwise', keys: ['R'], description: 'Turn 15° clockwise', group: 'Placing and turning', matches: (e) => plain(e) && !e.shiftKey && key(e, 'r') },
	{ action: 'rotate-anticlockwise', keys: ['Shift+R'], description: 'Turn 15° anticlockwise', group: 'Placing and turning', matches: (e) => plain(e) && Boolean(e.shiftKey) && key(e, 'r') },
	{ action: 'aim-at-subject', keys: ['A'], description: 'Aim at the subject (lights, cards and the camera)', group: 'Placing and turning', matches: (e) => plain(e) && key(e, 'a') },
	{ action: 'zoom-in', keys: ['+'], description: 'Look closer', group: 'The view', matches: (e) => !mod(e) && key(e, '+', '=') },
	{ action: 'zoom-out', keys: ['−'], description: 'Look further out', group: 'The view', matches: (e) => !mod(e) && key(e, '-', '_') },
	{ action: 'zoom-to-fit', keys: ['0'], description: 'Fit the whole table in view', group: 'The view', matches: (e) => plain(e) && key(e, '0') },
	{ action: 'toggle-falloff', keys: ['F'], description: 'Falloff map on or off', group: 'The view', matches: (e) => plain(e) && key(e, 'f') },
	{ action: 'toggle-grid-snap', keys: ['G'], description: 'Snapping to even steps on or off (hold Alt while dragging to place freely)', group: 'The view', matches: (e) => plain(e) && key(e, 'g') },
	{ action: 'select-tool', keys: ['V'], description: 'Pointer picks and drags elements', group: 'The view', onSheet: false, matches: (e) => plain(e) && key(e, 'v') },
	{ action: 'hand-tool', keys: ['H', 'Space (hold)'], description: 'Slide the view: hold Space and drag the plan', group: 'The view', matches: (e) => plain(e) && key(e, 'h') },
	// The sheet itself opens it (ShortcutSheet.svelte listens for "?"); the editor only claims the key.
	{ action: 'show-shortcuts', keys: ['?'], description: 'Open this list', group: 'This list', matches: (e) => plain(e) && e.key === '?' }
];

export function shortcutFor(e: PlanKeyInput): Shortcut | undefined {
	return SHORTCUTS.find((s) => s.matches(e));
}

/** The help sheet: groups in a fixed order, each with its shortcuts in table order, as the sheet shows them. */
export function shortcutSheet(table: readonly Shortcut[] = SHORTCUTS): { group: ShortcutGroup; shortcuts: SheetEntry[] }[] {
	return SHORTCUT_GROUPS.map((group) => ({ group, shortcuts: table.filter((s) => s.group === group && s.onSheet !== false).map(sheetEntry) })).filter(
		(g) => g.shortcuts.length
	);
}

export interface SheetEntry {
	action: ShortcutAction;
	keys: string[];
	description: string;
}

/** The slide-the-view entry shows only Space: H switches to a mode nothing on screen shows. */
function sheetEntry(s: Shortcut): SheetEntry {
	return { action: s.action, keys: s.action === 'hand-tool' ? ['Space (hold)'] : s.keys, description: s.description };
}

/** A key as a person reads it: `mod` becomes Ctrl, or ⌘ on a Mac; the parts of a chord are split. */
export function keyParts(keys: string, mac: boolean): string[] {
	// A "+" between two parts joins them; a "+" on its own (the zoom-in key) is the key itself.
	return keys.split(/(?<=.)\+(?=.)/).map((part) => (part === 'mod' ? (mac ? '⌘' : 'Ctrl') : part));
}
