/**
 * Which tool is active and in which state (session state, never saved): the select, hand and place
 * tools, switching between them, and ending a gesture in progress. The tools change the model only
 * through the host's commands.
 */
import type { ElementKind } from './model/schema';
import { HandTool } from './tools/hand-tool';
import { PlaceTool } from './tools/place-tool';
import { SelectTool } from './tools/select-tool';
import type { Tool } from './tools/tool';
import type { ToolHost, ToolId } from './tools/types';

export class ActiveTool {
	readonly #tools: Record<ToolId, Tool>;
	#id = $state<ToolId>('select');
	#stateId = $state('idle');
	#placeKind = $state<ElementKind | null>(null);
	/** Space held down: the select tool pans instead (the hand, for as long as it is held). */
	spaceHeld = $state(false);

	constructor(host: ToolHost) {
		this.#tools = { select: new SelectTool(host), hand: new HandTool(host), place: new PlaceTool(host) };
	}

	get id(): ToolId {
		return this.#id;
	}
	get tool(): Tool {
		return this.#tools[this.#id];
	}
	/** The active tool's state (`idle`, `dragging`, `rotating`, ...), as of the last `changed()`. */
	get stateId(): string {
		return this.#stateId;
	}
	/** What the place tool puts down next. */
	get placeKind(): ElementKind | null {
		return this.#placeKind;
	}
	/** Is a gesture in progress (so shortcuts wait)? */
	get busy(): boolean {
		return this.tool.state.busy;
	}

	/** After handing the tool an input: its state may have moved on. */
	changed() {
		this.#stateId = this.tool.stateId;
	}

	set(id: ToolId) {
		if (id === this.#id) return;
		this.tool.exit();
		this.#id = id;
		if (id !== 'place') this.#placeKind = null;
		this.changed();
	}

	/** Arms the place tool: the next press on the plan puts a new element there. */
	startPlacing(kind: ElementKind) {
		this.set('place');
		this.#placeKind = kind;
	}

	/** Undoes the gesture in progress, if any, and rests the tool. */
	cancelGesture() {
		const tool = this.tool;
		if (tool.state.busy || tool.stateId !== 'idle') tool.cancel();
		this.changed();
	}

	/** The stage's cursor for this tool and state, over `hover` (an element, locked or not, or the rotation handle). */
	cursor(hover: 'handle' | 'locked' | 'element' | null): string {
		const s = this.#stateId;
		if (s === 'panning' || s === 'dragging') return 'grabbing';
		if (s === 'rotating') return 'crosshair';
		if (this.#id === 'hand' || this.spaceHeld) return 'grab';
		if (this.#id === 'place') return 'copy';
		if (hover === 'handle') return 'crosshair';
		if (hover) return hover === 'locked' ? 'pointer' : 'move';
		return 'default';
	}
}
