/** The select tool: pick, Shift-pick, box-select, drag with snapping, turn by the handle, pan. */
import { Panning } from './panning';
import { Brushing } from './select/brushing';
import { Dragging } from './select/dragging';
import { SelectIdle } from './select/idle';
import { PointingCanvas, PointingElement } from './select/pointing';
import { Rotating } from './select/rotating';
import { Tool, type ToolState } from './tool';

export class SelectTool extends Tool {
	readonly id = 'select' as const;
	protected readonly states: Record<string, ToolState> = {
		idle: new SelectIdle(this),
		'pointing-element': new PointingElement(this),
		'pointing-canvas': new PointingCanvas(this),
		dragging: new Dragging(this),
		rotating: new Rotating(this),
		brushing: new Brushing(this),
		panning: new Panning(this)
	};
}
