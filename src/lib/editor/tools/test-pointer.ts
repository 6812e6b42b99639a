/** Synthetic pointer input for the tool tests: plan points turned into stage pixels. */
import type { Editor } from '../editor.svelte';
import type { Vec2 } from '../model/types';
import { planToScreen } from '../viewport';
import type { Modifiers, PlanPointerInput } from './types';

export type Mods = Partial<Modifiers> & { pointerId?: number; pointerType?: 'mouse' | 'pen' | 'touch'; button?: number };

export function input(editor: Editor, planM: Vec2, mods: Mods = {}): PlanPointerInput {
	const [screenX, screenY] = planToScreen(editor.viewport, planM);
	return { screenX, screenY, ...mods };
}

export function click(editor: Editor, planM: Vec2, mods: Mods = {}) {
	editor.pointerDown(input(editor, planM, mods));
	editor.pointerUp(input(editor, planM, mods));
}

/** Press at `from`, move in `steps` to `to`, and (unless `release: false`) let go. */
export function drag(editor: Editor, from: Vec2, to: Vec2, mods: Mods & { steps?: number; release?: boolean } = {}) {
	const { steps = 12, release = true, ...rest } = mods;
	// Screen positions are fixed at the start: a drag must not chase a view that pans under it.
	const start = input(editor, from, rest);
	const end = input(editor, to, rest);
	editor.pointerDown(start);
	for (let i = 1; i <= steps; i++) {
		const t = i / steps;
		editor.pointerMove({ ...start, screenX: start.screenX + (end.screenX - start.screenX) * t, screenY: start.screenY + (end.screenY - start.screenY) * t });
	}
	if (release) editor.pointerUp(end);
}
