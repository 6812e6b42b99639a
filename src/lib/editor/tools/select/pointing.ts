/**
 * A press that has not moved yet. On an element: a move makes it a drag (of the whole selection if
 * the element is selected), a release selects it. On a locked element or the empty plan: a move
 * starts a selection box, a release selects it or clears the selection. Shift adds and removes.
 */
import type { EditorElement } from '../../model/schema';
import { movedBeyond, ToolState } from '../tool';
import type { PlanPointer } from '../types';

export class PointingElement extends ToolState {
	readonly id = 'pointing-element';
	#down: PlanPointer | null = null;
	#element: EditorElement | null = null;
	#wasSelected = false;

	override onEnter(info: unknown) {
		const { pointer, element } = info as { pointer: PlanPointer; element: EditorElement };
		this.#down = pointer;
		this.#element = element;
		const selected = this.host.selectedIds;
		this.#wasSelected = selected.includes(element.id);
		// Select on press so a drag moves what was pressed.
		if (!this.#wasSelected) this.host.select(pointer.shiftKey ? [...selected, element.id] : [element.id]);
	}

	override onPointerMove(e: PlanPointer) {
		if (!this.#down || !this.#element || !movedBeyond(this.#down, e)) return;
		if (this.#element.locked || this.#element.kind === 'background') {
			return this.tool.transition('brushing', { pointer: this.#down, additive: this.#down.shiftKey });
		}
		this.tool.transition('dragging', { pointer: this.#down, anchorId: this.#element.id });
		this.tool.state.onPointerMove(e);
	}

	override onPointerUp() {
		const el = this.#element!;
		const selected = this.host.selectedIds;
		if (this.#down?.shiftKey) {
			if (this.#wasSelected) this.host.select(selected.filter((id) => id !== el.id));
		} else {
			this.host.select([el.id]);
		}
		this.tool.transition('idle');
	}

	override onCancel() {
		this.tool.transition('idle');
	}
}

export class PointingCanvas extends ToolState {
	readonly id = 'pointing-canvas';
	#down: PlanPointer | null = null;

	override onEnter(info: unknown) {
		this.#down = (info as { pointer: PlanPointer }).pointer;
	}

	override onPointerMove(e: PlanPointer) {
		if (!this.#down || !movedBeyond(this.#down, e)) return;
		this.tool.transition('brushing', { pointer: this.#down, additive: this.#down.shiftKey });
		this.tool.state.onPointerMove(e);
	}

	override onPointerUp() {
		if (!this.#down?.shiftKey) this.host.select([]);
		this.tool.transition('idle');
	}

	override onCancel() {
		this.tool.transition('idle');
	}
}
