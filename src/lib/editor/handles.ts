/** Where the rotation handle of a selected element sits: a fixed screen distance beyond its front. */
import { footprint, toPlan } from './model/geometry';
import type { EditorElement } from './model/schema';
import type { Vec2 } from './model/types';

export const ROTATION_HANDLE_OFFSET_PX = 26;
export const ROTATION_HANDLE_RADIUS_PX = 6;
/** A finger needs a bigger target than the drawn handle. */
export const ROTATION_HANDLE_HIT_PX = 12;
/** Pick margin around elements, on screen. */
export const HIT_MARGIN_PX = 6;

export function rotationHandlePosition(el: EditorElement, zoomPxPerM: number): Vec2 {
	return toPlan(el, [footprint(el).uMaxM + ROTATION_HANDLE_OFFSET_PX / zoomPxPerM, 0]);
}

/** The point on the element's front where the handle's stem starts. */
export function rotationHandleBase(el: EditorElement): Vec2 {
	return toPlan(el, [footprint(el).uMaxM, 0]);
}

/** Is the plan point on an element's rotation handle, at this zoom (px per metre)? */
export function onRotationHandleOf(el: EditorElement, planM: Vec2, zoom: number): boolean {
	const h = rotationHandlePosition(el, zoom);
	return Math.hypot(planM[0] - h[0], planM[1] - h[1]) <= ROTATION_HANDLE_HIT_PX / zoom;
}
