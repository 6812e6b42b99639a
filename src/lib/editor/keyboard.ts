/**
 * Keys pressed with the plan focused: Space for the hand, the active tool's own keys, then the
 * shortcut table (`tools/shortcuts.ts`), each shortcut run as the editor command it names. Escape
 * first undoes a gesture in progress, then leaves a tool, then clears the selection.
 */
import type { ActiveTool } from './active-tool.svelte';
import type { Editor } from './editor.svelte';
import { shortcutFor, type ShortcutAction } from './tools/shortcuts';
import type { PlanKeyInput } from './tools/types';

/** Shift + arrow nudges this many grid steps. */
export const NUDGE_LARGE = 10;
export const ROTATE_STEP_DEG = 15;
/** An arrow with nothing selected pans the view by this much. */
const PAN_STEP_PX = 40;

/** Returns true when the key was used (the caller prevents the default). */
export function keyDown(editor: Editor, active: ActiveTool, input: PlanKeyInput): boolean {
	if (input.key === ' ') {
		active.spaceHeld = true;
		return true;
	}
	if (active.tool.keyDown(input)) {
		active.changed();
		return true;
	}
	const shortcut = shortcutFor(input);
	if (!shortcut) return false;
	if (shortcut.action === 'clear-selection') {
		if (active.busy) {
			active.cancelGesture();
			return true;
		}
		if (editor.toolId !== 'select') {
			editor.setTool('select');
			return true;
		}
		if (!editor.selectedIds.length) return false;
		editor.clearSelection();
		return true;
	}
	if (active.busy) return true;
	runShortcut(editor, shortcut.action, input);
	return true;
}

export function runShortcut(editor: Editor, action: ShortcutAction, e: PlanKeyInput) {
	const step = editor.gridStepM * (e.shiftKey ? NUDGE_LARGE : 1);
	const nudge = (dx: number, dy: number) => {
		if (editor.selectedIds.length) editor.nudgeSelected(dx * step, dy * step, e.repeat);
		else editor.panBy(-dx * PAN_STEP_PX, -dy * PAN_STEP_PX);
	};
	switch (action) {
		case 'undo': return editor.undo();
		case 'redo': return editor.redo();
		case 'delete': return void editor.deleteSelected();
		case 'duplicate': return void editor.duplicateSelected();
		case 'select-all': return editor.selectAll();
		case 'select-next': return editor.selectNext(false);
		case 'select-previous': return editor.selectNext(true);
		case 'clear-selection': return editor.clearSelection();
		case 'nudge-left': return nudge(-1, 0);
		case 'nudge-right': return nudge(1, 0);
		case 'nudge-up': return nudge(0, -1);
		case 'nudge-down': return nudge(0, 1);
		case 'rotate-clockwise': return void editor.rotateSelectedBy(ROTATE_STEP_DEG);
		case 'rotate-anticlockwise': return void editor.rotateSelectedBy(-ROTATE_STEP_DEG);
		case 'aim-at-subject': return void editor.aimSelectedAtSubject();
		case 'toggle-lock': return void editor.toggleLockSelected();
		case 'bring-to-front': return void editor.bringSelectedToFront();
		case 'send-to-back': return void editor.sendSelectedToBack();
		case 'zoom-in': return editor.zoomIn();
		case 'zoom-out': return editor.zoomOut();
		case 'zoom-to-fit': return editor.zoomToFit();
		case 'select-tool': return editor.setTool('select');
		case 'hand-tool': return editor.setTool('hand');
		case 'toggle-falloff': editor.falloffVisible = !editor.falloffVisible; return;
		case 'toggle-grid-snap': editor.snapToGrid = !editor.snapToGrid; return;
	}
}
