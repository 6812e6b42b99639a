/** A selection box: every element wholly inside it is selected (added to the selection with Shift). */
import { ToolState } from '../tool';
import type { PlanPointer } from '../types';

export class Brushing extends ToolState {
	readonly id = 'brushing';
	#origin: PlanPointer | null = null;
	#initial: readonly string[] = [];
	#before: readonly string[] = [];

	override onEnter(info: unknown) {
		const { pointer, additive } = info as { pointer: PlanPointer; additive: boolean };
		this.#origin = pointer;
		this.#before = this.host.selectedIds;
		this.#initial = additive ? this.host.selectedIds : [];
	}

	override onPointerMove(e: PlanPointer) {
		const o = this.#origin!.planM;
		const bounds = {
			minX: Math.min(o[0], e.planM[0]),
			minY: Math.min(o[1], e.planM[1]),
			maxX: Math.max(o[0], e.planM[0]),
			maxY: Math.max(o[1], e.planM[1])
		};
		this.host.setMarquee(bounds);
		const inside = this.host.elementsInside(bounds).map((el) => el.id);
		this.host.select([...new Set([...this.#initial, ...inside])]);
	}

	override onPointerUp() {
		this.tool.transition('idle');
	}

	override onCancel() {
		this.host.select(this.#before);
		this.tool.transition('idle');
	}

	override onExit() {
		this.host.setMarquee(null);
	}

	override get busy() {
		return true;
	}
}
