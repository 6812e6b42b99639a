/**
 * Moving the selection (one undo step, Escape returns every element: `SelectionGesture`). The pressed
 * element snaps (to the others' positions, else to the grid; Alt held turns snapping off) and the rest
 * of the selection keeps its offsets.
 */
import { moveElementsTo } from '../../commands';
import type { EditorElement } from '../../model/schema';
import type { Vec2 } from '../../model/types';
import { SelectionGesture } from '../gesture';
import { snapPoint } from '../snap';
import type { PlanPointer } from '../types';

/** Snapping distance on screen, in pixels. */
export const SNAP_TOLERANCE_PX = 8;

type Position = { xM: number; yM: number };

export class Dragging extends SelectionGesture<Position> {
	readonly id = 'dragging';
	#origin: Vec2 = [0, 0];
	#anchorId = '';
	#targets: Vec2[] = [];

	protected startOf(el: EditorElement): Position {
		return { xM: el.xM, yM: el.yM };
	}

	protected begin(pointer: PlanPointer, info: unknown) {
		this.#origin = pointer.planM;
		this.#anchorId = (info as { anchorId: string }).anchorId;
		this.#targets = Object.values(this.host.model.elements)
			.filter((el) => !(el.id in this.start) && el.kind !== 'background')
			.map((el) => [el.xM, el.yM] as Vec2);
	}

	protected commandAt(e: PlanPointer) {
		const anchor = this.start[this.#anchorId];
		if (!anchor) return null;
		const raw: Vec2 = [anchor.xM + e.planM[0] - this.#origin[0], anchor.yM + e.planM[1] - this.#origin[1]];
		const snapped = e.altKey
			? { point: raw, lines: [] }
			: snapPoint(raw, {
					gridStepM: this.host.snapToGrid ? this.host.gridStepM : null,
					targets: this.host.snapToElements ? this.#targets : [],
					toleranceM: SNAP_TOLERANCE_PX / this.host.viewport.zoom
				});
		this.host.setSnapLines(snapped.lines);
		const dx = snapped.point[0] - anchor.xM;
		const dy = snapped.point[1] - anchor.yM;
		const positions: Record<string, Position> = {};
		for (const [id, p] of Object.entries(this.start)) positions[id] = { xM: p.xM + dx, yM: p.yM + dy };
		return moveElementsTo(positions);
	}

	protected override end() {
		this.host.setSnapLines([]);
	}
}
