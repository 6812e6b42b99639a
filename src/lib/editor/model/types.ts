/** The editor's document model: the plan's elements by id plus the camera settings and the ambient. */
import type { AmbientSettings, CameraSettings, EditorElement } from './schema';

export type * from './schema';

export interface EditorModel {
	readonly elements: Readonly<Record<string, EditorElement>>;
	readonly camera: CameraSettings;
	readonly ambient: AmbientSettings | null;
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

export function cameraOf(model: EditorModel) {
	for (const el of Object.values(model.elements)) if (el.kind === 'camera') return el;
	return undefined;
}
