/**
 * Reversible diffs of the model, in the manner of a record store: elements added, updated (before and
 * after) and removed, plus the camera settings as a before/after pair. A diff can be
 * reversed and squashed with the next one, so a whole gesture becomes one diff.
 */
import type { CameraSettings, EditorElement } from './schema';
import type { EditorModel } from './types';

export interface ModelDiff {
	added: Record<string, EditorElement>;
	updated: Record<string, [before: EditorElement, after: EditorElement]>;
	removed: Record<string, EditorElement>;
	camera?: [before: CameraSettings, after: CameraSettings];
}

export function emptyDiff(): ModelDiff {
	return { added: {}, updated: {}, removed: {} };
}

export function isEmptyDiff(diff: ModelDiff): boolean {
	for (const _ in diff.added) return false;
	for (const _ in diff.updated) return false;
	for (const _ in diff.removed) return false;
	return diff.camera === undefined;
}

export function reverseDiff(diff: ModelDiff): ModelDiff {
	const updated: ModelDiff['updated'] = {};
	for (const [id, [before, after]] of Object.entries(diff.updated)) updated[id] = [after, before];
	const reversed: ModelDiff = { added: { ...diff.removed }, updated, removed: { ...diff.added } };
	if (diff.camera) reversed.camera = [diff.camera[1], diff.camera[0]];
	return reversed;
}

/** `target` followed by `next`, as one diff. Mutates and returns `target`. */
export function squashInto(target: ModelDiff, next: ModelDiff): ModelDiff {
	for (const [id, el] of Object.entries(next.added)) {
		const removed = target.removed[id];
		if (removed) {
			delete target.removed[id];
			target.updated[id] = [removed, el];
		} else {
			target.added[id] = el;
		}
	}
	for (const [id, [before, after]] of Object.entries(next.updated)) {
		if (target.added[id]) target.added[id] = after;
		else if (target.updated[id]) target.updated[id] = [target.updated[id][0], after];
		else target.updated[id] = [before, after];
	}
	for (const [id, el] of Object.entries(next.removed)) {
		if (target.added[id]) delete target.added[id];
		else if (target.updated[id]) {
			target.removed[id] = target.updated[id][0];
			delete target.updated[id];
		} else target.removed[id] = el;
	}
	if (next.camera) target.camera = [target.camera?.[0] ?? next.camera[0], next.camera[1]];
	// An update that ends where it began is no change.
	for (const [id, [before, after]] of Object.entries(target.updated)) if (before === after) delete target.updated[id];
	if (target.camera && target.camera[0] === target.camera[1]) delete target.camera;
	return target;
}

export function squashDiffs(diffs: readonly ModelDiff[]): ModelDiff {
	const result = emptyDiff();
	for (const d of diffs) squashInto(result, d);
	return result;
}

/** A new model with the diff applied; unchanged parts are shared. */
export function applyDiff(model: EditorModel, diff: ModelDiff): EditorModel {
	if (isEmptyDiff(diff)) return model;
	const elements = { ...model.elements };
	for (const id of Object.keys(diff.removed)) delete elements[id];
	for (const [id, el] of Object.entries(diff.added)) elements[id] = el;
	for (const [id, [, after]] of Object.entries(diff.updated)) elements[id] = after;
	return {
		...model,
		elements,
		camera: diff.camera ? diff.camera[1] : model.camera
	};
}
