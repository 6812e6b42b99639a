/** Dragging the view (hand tool, middle button, or Space held): no model change, nothing to undo. */
import { ToolState } from './tool';
import type { PlanPointer } from './types';

export class Panning extends ToolState {
	readonly id = 'panning';
	#last: PlanPointer | null = null;

	override onEnter(info: unknown) {
		this.#last = (info as { pointer: PlanPointer }).pointer;
	}
	override onPointerMove(e: PlanPointer) {
		if (!this.#last) return;
		this.host.panBy(e.screen[0] - this.#last.screen[0], e.screen[1] - this.#last.screen[1]);
		this.#last = e;
	}
	override onPointerUp() {
		this.tool.transition('idle');
	}
	override onCancel() {
		this.tool.transition('idle');
	}
	override onExit() {
		this.#last = null;
	}
	override get busy() {
		return true;
	}
}
