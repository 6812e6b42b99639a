/**
 * Tools as small state machines: a tool owns a few states (idle, pointing, dragging, ...) and hands
 * each input to the current one; a state changes the model only through commands on the host.
 */
import type { PlanKeyInput, PlanPointer, ToolHost, ToolId } from './types';

export abstract class ToolState {
	abstract readonly id: string;
	constructor(protected readonly tool: Tool) {}
	protected get host(): ToolHost {
		return this.tool.host;
	}
	onEnter(_info: unknown): void {}
	onExit(): void {}
	onPointerDown(_e: PlanPointer): void {}
	onPointerMove(_e: PlanPointer): void {}
	onPointerUp(_e: PlanPointer): void {}
	/** Returns true when the key was used. */
	onKeyDown(_e: PlanKeyInput): boolean {
		return false;
	}
	/** Escape, a lost pointer or a second finger: undo the gesture in progress. */
	onCancel(): void {}
	/** Is a gesture in progress (so the editor's shortcuts should wait)? */
	get busy(): boolean {
		return false;
	}
}

export abstract class Tool {
	abstract readonly id: ToolId;
	protected abstract readonly states: Record<string, ToolState>;
	#current: ToolState | null = null;

	constructor(readonly host: ToolHost) {}

	get state(): ToolState {
		this.#current ??= this.states.idle;
		return this.#current;
	}

	get stateId(): string {
		return this.state.id;
	}

	transition(stateId: string, info?: unknown): void {
		const next = this.states[stateId];
		if (!next) throw new Error(`tool ${this.id} has no state ${stateId}`);
		this.state.onExit();
		this.#current = next;
		next.onEnter(info);
	}

	pointerDown(e: PlanPointer) {
		this.state.onPointerDown(e);
	}
	pointerMove(e: PlanPointer) {
		this.state.onPointerMove(e);
	}
	pointerUp(e: PlanPointer) {
		this.state.onPointerUp(e);
	}
	keyDown(e: PlanKeyInput): boolean {
		return this.state.onKeyDown(e);
	}
	cancel() {
		this.state.onCancel();
	}
	/** Leaving the tool: cancel any gesture and rest. */
	exit() {
		if (this.state.busy) this.state.onCancel();
		if (this.stateId !== 'idle') this.transition('idle');
	}
}

/** Screen distance a press must travel before it becomes a drag (a finger needs more). */
export function dragThresholdPx(pointerType: PlanPointer['pointerType']): number {
	return pointerType === 'touch' ? 8 : 4;
}

export function movedBeyond(a: PlanPointer, b: PlanPointer): boolean {
	return Math.hypot(a.screen[0] - b.screen[0], a.screen[1] - b.screen[1]) > dragThresholdPx(b.pointerType);
}
