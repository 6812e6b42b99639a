/** The editor's document model: the plan's elements by id (the ambient light among them) plus the camera settings. */
import type { CameraSettings, EditorElement } from './schema';

export type * from './schema';

/**
 * What the editor keeps from a document's plan without editing it: the entries as read (with fields
 * it does not use, such as a gear id), entries of kinds it does not draw (a modifier fitted to a light,
 * a written label, the table), and the plan's other keys (its print frame). Written back on save.
 */
export interface KeptPlan {
	readonly entries: Readonly<Record<string, Readonly<Record<string, unknown>>>>;
	readonly rest: Readonly<Record<string, unknown>>;
}

export const EMPTY_KEPT_PLAN: KeptPlan = { entries: {}, rest: {} };

export interface EditorModel {
	readonly elements: Readonly<Record<string, EditorElement>>;
	readonly camera: CameraSettings;
	readonly kept: KeptPlan;
}

export type Vec2 = readonly [number, number];
export type Vec3 = readonly [number, number, number];

/** Elements in drawing order (lowest zIndex first; ties by id so the order is stable). */
export function elementsInOrder(model: EditorModel): EditorElement[] {
	return Object.values(model.elements).sort((a, b) => a.zIndex - b.zIndex || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
}

export function topZIndex(model: EditorModel): number {
	let top = 0;
	for (const el of Object.values(model.elements)) top = Math.max(top, el.zIndex);
	return top;
}

export function subjectOf(model: EditorModel) {
	for (const el of Object.values(model.elements)) if (el.kind === 'subject') return el;
	return undefined;
}

/** The ambient light (a plan has at most one: the engine takes one ambient). */
export function ambientOf(model: EditorModel) {
	for (const el of Object.values(model.elements)) if (el.kind === 'ambient') return el;
	return undefined;
}

export function cameraOf(model: EditorModel) {
	for (const el of Object.values(model.elements)) if (el.kind === 'camera') return el;
	return undefined;
}

/** The id after `current` in `order` (before it, `backwards`), wrapping round; the first (last) when none is current. */
export function nextInOrder(order: readonly string[], current: string | undefined, backwards = false): string | undefined {
	if (!order.length) return undefined;
	const at = current ? order.indexOf(current) : -1;
	if (at < 0) return backwards ? order.at(-1) : order[0];
	return order[(at + (backwards ? -1 : 1) + order.length) % order.length];
}
