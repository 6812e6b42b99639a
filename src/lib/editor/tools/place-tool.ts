/**
 * Placing a new element from the palette: a press on the plan puts it there (snapped to the grid) as
 * one undo step, selects it and returns to the select tool. Escape returns without placing.
 */
import { addElement } from '../commands';
import { snapToGrid } from '../grid';
import { Tool, ToolState } from './tool';
import type { PlanKeyInput, PlanPointer } from './types';

class PlaceIdle extends ToolState {
	readonly id = 'idle';
	override onPointerDown(e: PlanPointer) {
		const host = this.host;
		const kind = host.placeKind;
		if (e.button !== 0 || !kind) return;
		const step = host.snapToGrid && !e.altKey ? host.gridStepM : null;
		const at = step ? { xM: snapToGrid(e.planM[0], step), yM: snapToGrid(e.planM[1], step) } : { xM: e.planM[0], yM: e.planM[1] };
		const result = host.execute(addElement(kind, at));
		if (result.ok) host.select(result.createdIds);
		host.setTool('select');
	}
	override onKeyDown(e: PlanKeyInput) {
		if (e.key !== 'Escape') return false;
		this.host.setTool('select');
		return true;
	}
}

export class PlaceTool extends Tool {
	readonly id = 'place' as const;
	protected readonly states: Record<string, ToolState> = { idle: new PlaceIdle(this) };
}
