/**
 * Turning the selection with the rotation handle: about the element's own position for one element,
 * about the centre of the selection for several. One undo step; Escape restores. Shift snaps to 15°;
 * otherwise one element snaps to facing the subject when within 3°.
 */
import { rotateElementsAbout } from '../../commands';
import { aimAngles, normaliseDeg, position3 } from '../../model/geometry';
import { subjectOf, type Vec2 } from '../../model/types';
import { snapRotation } from '../snap';
import { ToolState } from '../tool';
import type { PlanPointer } from '../types';

export const ROTATION_STEP_DEG = 15;

const angleDeg = (from: Vec2, to: Vec2) => (Math.atan2(to[1] - from[1], to[0] - from[0]) * 180) / Math.PI;

export class Rotating extends ToolState {
	readonly id = 'rotating';
	#mark: string | null = null;
	#centre: Vec2 = [0, 0];
	#startAngle = 0;
	#start: Record<string, { xM: number; yM: number; rotationDeg: number }> = {};
	#towardDeg: number | null = null;
	#single: string | null = null;

	override onEnter(info: unknown) {
		const { pointer } = info as { pointer: PlanPointer };
		const model = this.host.model;
		this.#start = {};
		for (const id of this.host.selectedIds) {
			const el = model.elements[id];
			if (el && !el.locked) this.#start[id] = { xM: el.xM, yM: el.yM, rotationDeg: el.rotationDeg };
		}
		const ids = Object.keys(this.#start);
		this.#single = ids.length === 1 ? ids[0] : null;
		const xs = ids.map((id) => this.#start[id].xM);
		const ys = ids.map((id) => this.#start[id].yM);
		this.#centre = ids.length ? [(Math.min(...xs) + Math.max(...xs)) / 2, (Math.min(...ys) + Math.max(...ys)) / 2] : [0, 0];
		this.#startAngle = angleDeg(this.#centre, pointer.planM);
		const subject = subjectOf(model);
		const el = this.#single ? model.elements[this.#single] : undefined;
		this.#towardDeg = el && subject && el.id !== subject.id ? aimAngles(position3(el), position3(subject)).rotationDeg : null;
		this.#mark = ids.length ? this.host.mark() : null;
	}

	override onPointerMove(e: PlanPointer) {
		if (!this.#mark) return;
		let delta = normaliseDeg(angleDeg(this.#centre, e.planM) - this.#startAngle);
		if (this.#single) {
			const startRot = this.#start[this.#single].rotationDeg;
			const snapped = snapRotation(startRot + delta, {
				stepDeg: e.shiftKey ? ROTATION_STEP_DEG : null,
				towardDeg: e.altKey ? null : this.#towardDeg
			});
			delta = snapped.rotationDeg - startRot;
		} else if (e.shiftKey) {
			delta = Math.round(delta / ROTATION_STEP_DEG) * ROTATION_STEP_DEG;
		}
		this.host.applyInGesture(rotateElementsAbout(this.#start, this.#centre, delta));
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
	}

	override get busy() {
		return true;
	}
}
