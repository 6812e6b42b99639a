/**
 * Pointer, pinch and wheel routing for the plan: one pointer at a time goes to the active tool; a
 * second finger cancels what the first began and the two pinch the view; hovering notes the element
 * (and the rotation handle) under the pointer for the cursor. Screen pixels are turned into plan
 * metres here, so tools only see `PlanPointer`s.
 */
import type { ActiveTool } from './active-tool.svelte';
import type { Editor } from './editor.svelte';
import type { Vec2 } from './model/types';
import { PinchGesture } from './tools/pinch';
import type { PlanPointer, PlanPointerInput, PlanWheelInput } from './tools/types';
import { screenToPlan } from './viewport';

/** What the routing needs of the editor. */
export type PointerHost = Pick<Editor, 'viewport' | 'stageSize' | 'setViewport' | 'panBy' | 'zoomBy' | 'elementAt' | 'onRotationHandle'>;

export class PointerInput {
	readonly #host: PointerHost;
	readonly #active: ActiveTool;
	#pointers = new Map<number, Vec2>();
	#primaryPointer: number | null = null;
	#pinch: PinchGesture | null = null;
	#hoverId = $state<string | null>(null);
	#hoverHandle = $state(false);

	constructor(host: PointerHost, active: ActiveTool) {
		this.#host = host;
		this.#active = active;
	}

	/** The element under an idle pointer. */
	get hoverId(): string | null {
		return this.#hoverId;
	}
	/** Is an idle pointer over the rotation handle? */
	get hoverHandle(): boolean {
		return this.#hoverHandle;
	}

	#pointer(input: PlanPointerInput): PlanPointer {
		const screen: Vec2 = [input.screenX, input.screenY];
		return {
			screen,
			planM: screenToPlan(this.#host.viewport, screen),
			pointerId: input.pointerId ?? 1,
			pointerType: input.pointerType ?? 'mouse',
			button: input.button ?? 0,
			shiftKey: input.shiftKey ?? false,
			altKey: input.altKey ?? false,
			ctrlKey: input.ctrlKey ?? false,
			metaKey: input.metaKey ?? false
		};
	}

	down(input: PlanPointerInput) {
		const e = this.#pointer(input);
		this.#pointers.set(e.pointerId, e.screen);
		if (this.#pointers.size === 2) {
			// A second finger: whatever the first one began is undone, and the two pinch the view.
			this.#active.tool.cancel();
			this.#active.changed();
			const [a, b] = [...this.#pointers.values()];
			this.#pinch = new PinchGesture(this.#host.viewport, a, b);
			this.#primaryPointer = null;
			return;
		}
		if (this.#pointers.size > 2 || this.#pinch) return;
		this.#primaryPointer = e.pointerId;
		this.#active.tool.pointerDown(e);
		this.#active.changed();
	}

	move(input: PlanPointerInput) {
		const e = this.#pointer(input);
		if (this.#pointers.has(e.pointerId)) this.#pointers.set(e.pointerId, e.screen);
		if (this.#pinch) {
			if (this.#pointers.size >= 2) {
				const [a, b] = [...this.#pointers.values()];
				this.#host.setViewport(this.#pinch.viewportFor(a, b));
			}
			return;
		}
		if (this.#primaryPointer !== null && e.pointerId !== this.#primaryPointer) return;
		if (this.#primaryPointer === null && this.#pointers.size) return;
		if (this.#active.tool.stateId === 'idle') {
			this.#hoverId = this.#host.elementAt(e.planM)?.id ?? null;
			this.#hoverHandle = this.#host.onRotationHandle(e.planM);
		}
		this.#active.tool.pointerMove(e);
		this.#active.changed();
	}

	up(input: PlanPointerInput) {
		const e = this.#pointer(input);
		this.#pointers.delete(e.pointerId);
		if (this.#pinch) {
			if (this.#pointers.size < 2) this.#pinch = null;
			return;
		}
		if (e.pointerId !== this.#primaryPointer) return;
		this.#primaryPointer = null;
		this.#active.tool.pointerUp(e);
		this.#active.changed();
	}

	/** The browser took the pointer away (a system gesture, the window lost focus): undo the gesture. */
	cancel(input: PlanPointerInput) {
		this.#pointers.delete(input.pointerId ?? 1);
		if (this.#pinch && this.#pointers.size < 2) this.#pinch = null;
		this.#primaryPointer = null;
		this.#active.cancelGesture();
	}

	leave() {
		this.#hoverId = null;
		this.#hoverHandle = false;
	}

	wheel(input: PlanWheelInput) {
		const unit = input.deltaMode === 1 ? 16 : input.deltaMode === 2 ? (this.#host.stageSize?.heightPx ?? 600) : 1;
		const dx = (input.deltaX ?? 0) * unit;
		const dy = input.deltaY * unit;
		if (input.shiftKey && !input.ctrlKey && !input.metaKey) {
			// Shift + wheel pans; a wheel that scrolls sideways already sends deltaX.
			this.#host.panBy(-(dx || dy), 0);
			return;
		}
		// A pinch on a touchpad arrives as a wheel with Ctrl and small deltas: zoom faster per pixel.
		const factor = 2 ** (-dy / (input.ctrlKey ? 100 : 500));
		this.#host.zoomBy(factor, [input.screenX, input.screenY]);
	}

	/** Forgets every pointer (the editor is going away). */
	clear() {
		this.#pointers.clear();
		this.#pinch = null;
		this.#primaryPointer = null;
	}
}
