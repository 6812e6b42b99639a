/** The hand tool: any drag pans the view. */
import { Panning } from './panning';
import { Tool, ToolState } from './tool';
import type { PlanPointer } from './types';

class HandIdle extends ToolState {
	readonly id = 'idle';
	override onPointerDown(e: PlanPointer) {
		this.tool.transition('panning', { pointer: e });
	}
}

export class HandTool extends Tool {
	readonly id = 'hand' as const;
	protected readonly states: Record<string, ToolState> = { idle: new HandIdle(this), panning: new Panning(this) };
}
