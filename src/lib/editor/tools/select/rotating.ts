/**
 * Turning the selection with the rotation handle (one undo step, Escape restores: `SelectionGesture`):
 * about the element's own position for one element, about the centre of the selection for several.
 * Shift snaps to 15°; otherwise one element snaps to facing the subject when within 3°.
 */
import { rotateElementsAbout } from '../../commands';
import { aimAngles, normaliseDeg, position3 } from '../../model/geometry';
import type { EditorElement } from '../../model/schema';
import { subjectOf, type Vec2 } from '../../model/types';
import { SelectionGesture } from '../gesture';
import { snapRotation } from '../snap';
import type { PlanPointer } from '../types';

export const ROTATION_STEP_DEG = 15;

const angleDeg = (from: Vec2, to: Vec2) => (Math.atan2(to[1] - from[1], to[0] - from[0]) * 180) / Math.PI;

type Placement = { xM: number; yM: number; rotationDeg: number };

export class Rotating extends SelectionGesture<Placement> {
	readonly id = 'rotating';
	#centre: Vec2 = [0, 0];
	#startAngle = 0;
	#towardDeg: number | null = null;
	#single: string | null = null;

	protected startOf(el: EditorElement): Placement {
		return { xM: el.xM, yM: el.yM, rotationDeg: el.rotationDeg };
	}

	protected begin(pointer: PlanPointer) {
		const model = this.host.model;
		const ids = Object.keys(this.start);
		this.#single = ids.length === 1 ? ids[0] : null;
		const xs = ids.map((id) => this.start[id].xM);
		const ys = ids.map((id) => this.start[id].yM);
		this.#centre = ids.length ? [(Math.min(...xs) + Math.max(...xs)) / 2, (Math.min(...ys) + Math.max(...ys)) / 2] : [0, 0];
		this.#startAngle = angleDeg(this.#centre, pointer.planM);
		const subject = subjectOf(model);
		const el = this.#single ? model.elements[this.#single] : undefined;
		this.#towardDeg = el && subject && el.id !== subject.id ? aimAngles(position3(el), position3(subject)).rotationDeg : null;
	}

	protected commandAt(e: PlanPointer) {
		let delta = normaliseDeg(angleDeg(this.#centre, e.planM) - this.#startAngle);
		if (this.#single) {
			const startRot = this.start[this.#single].rotationDeg;
			const snapped = snapRotation(startRot + delta, {
				stepDeg: e.shiftKey ? ROTATION_STEP_DEG : null,
				towardDeg: e.altKey ? null : this.#towardDeg
			});
			delta = snapped.rotationDeg - startRot;
		} else if (e.shiftKey) {
			delta = Math.round(delta / ROTATION_STEP_DEG) * ROTATION_STEP_DEG;
		}
		return rotateElementsAbout(this.start, this.#centre, delta);
	}
}
