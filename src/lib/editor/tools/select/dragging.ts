/**
 * Moving the selection. One mark when the drag starts, so the whole drag is one undo step; Escape
 * returns every element to where it was. The pressed element snaps (to the others' positions, else to
 * the grid; Alt held turns snapping off) and the rest of the selection keeps its offsets.
 */
import { moveElementsTo } from '../../commands';
import type { Vec2 } from '../../model/types';
import { snapPoint } from '../snap';
import { ToolState } from '../tool';
import type { PlanPointer } from '../types';

/** Snapping distance on screen, in pixels. */
export const SNAP_TOLERANCE_PX = 8;

export class Dragging extends ToolState {
	readonly id = 'dragging';
	#mark: string | null = null;
	#origin: Vec2 = [0, 0];
	#anchorId = '';
	#start: Record<string, { xM: number; yM: number }> = {};
	#targets: Vec2[] = [];

	override onEnter(info: unknown) {
		const { pointer, anchorId } = info as { pointer: PlanPointer; anchorId: string };
		const model = this.host.model;
		this.#origin = pointer.planM;
		this.#anchorId = anchorId;
		this.#start = {};
		for (const id of this.host.selectedIds) {
			const el = model.elements[id];
			if (el && !el.locked) this.#start[id] = { xM: el.xM, yM: el.yM };
		}
		this.#targets = Object.values(model.elements)
			.filter((el) => !(el.id in this.#start) && el.kind !== 'background')
			.map((el) => [el.xM, el.yM] as Vec2);
		this.#mark = Object.keys(this.#start).length ? this.host.mark() : null;
	}

	override onPointerMove(e: PlanPointer) {
		const anchor = this.#start[this.#anchorId];
		if (!this.#mark || !anchor) return;
		const raw: Vec2 = [anchor.xM + e.planM[0] - this.#origin[0], anchor.yM + e.planM[1] - this.#origin[1]];
		const snapping = !e.altKey;
		const snapped = snapping
			? snapPoint(raw, {
					gridStepM: this.host.snapToGrid ? this.host.gridStepM : null,
					targets: this.host.snapToElements ? this.#targets : [],
					toleranceM: SNAP_TOLERANCE_PX / this.host.viewport.zoom
				})
			: { point: raw, lines: [] };
		const dx = snapped.point[0] - anchor.xM;
		const dy = snapped.point[1] - anchor.yM;
		const positions: Record<string, { xM: number; yM: number }> = {};
		for (const [id, p] of Object.entries(this.#start)) positions[id] = { xM: p.xM + dx, yM: p.yM + dy };
		this.host.applyInGesture(moveElementsTo(positions));
		this.host.setSnapLines(snapped.lines);
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
		this.host.setSnapLines([]);
	}

	override get busy() {
		return true;
	}
}
