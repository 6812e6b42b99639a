import { ToolState } from '../tool';
import type { PlanPointer } from '../types';

export class SelectIdle extends ToolState {
	readonly id = 'idle';

	override onPointerDown(e: PlanPointer) {
		const host = this.host;
		if (e.button === 1 || (e.button === 0 && host.spaceHeld)) return this.tool.transition('panning', { pointer: e });
		if (e.button !== 0) return;
		if (host.onRotationHandle(e.planM)) return this.tool.transition('rotating', { pointer: e });
		const hit = host.elementAt(e.planM);
		if (hit) return this.tool.transition('pointing-element', { pointer: e, element: hit });
		this.tool.transition('pointing-canvas', { pointer: e });
	}
}
