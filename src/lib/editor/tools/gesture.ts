/**
 * The shape every gesture that changes the selection shares (dragging, rotating): it takes what each
 * unlocked selected element starts from, sets one history mark (the whole gesture is one undo step),
 * applies a command for every pointer move inside that step, and on Escape or a lost pointer bails back
 * to the mark. A selection of locked elements only sets no mark and changes nothing.
 */
import type { Command } from '../commands';
import type { EditorElement } from '../model/schema';
import { ToolState } from './tool';
import type { PlanPointer } from './types';

export abstract class SelectionGesture<Start> extends ToolState {
	#mark: string | null = null;
	/** What each unlocked selected element started from, by id. */
	protected start: Record<string, Start> = {};

	/** What an element starts from (its position, its rotation...). */
	protected abstract startOf(el: EditorElement): Start;
	/** The rest of the set-up, once `start` is taken. */
	protected abstract begin(pointer: PlanPointer, info: unknown): void;
	/** The command that puts the selection where the pointer now says, or null to leave it. */
	protected abstract commandAt(e: PlanPointer): Command | null;
	/** Clears what the gesture showed on the way (snap guides...). */
	protected end(): void {}

	override onEnter(info: unknown) {
		const { pointer } = info as { pointer: PlanPointer };
		const model = this.host.model;
		this.start = {};
		for (const id of this.host.selectedIds) {
			const el = model.elements[id];
			if (el && !el.locked) this.start[id] = this.startOf(el);
		}
		this.begin(pointer, info);
		this.#mark = Object.keys(this.start).length ? this.host.mark() : null;
	}

	override onPointerMove(e: PlanPointer) {
		if (!this.#mark) return;
		const command = this.commandAt(e);
		if (command) this.host.applyInGesture(command);
	}

	override onPointerUp() {
		this.tool.transition('idle');
	}

	override onCancel() {
		if (this.#mark) this.host.bailToMark(this.#mark);
		this.tool.transition('idle');
	}

	override onExit() {
		this.#mark = null;
		this.end();
	}

	override get busy() {
		return true;
	}
}
