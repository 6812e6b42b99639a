/**
 * Every change to the model is a command: a pure function from the model to a reversible diff (or a
 * refusal that says why, naming the field). The editor records the diff in the history; nothing else
 * writes the model. Here: placing, moving, turning, aiming, copies, locks and order. The commands that
 * set what a user types (properties, camera settings, the ambient, a whole element) are in
 * commands-properties.ts, with the element schemas that check them; those from the gear shelf and the
 * engine in commands-gear.ts.
 *
 * Locked elements are not moved, turned, aimed or deleted (their other properties can still be set).
 * A plan has one subject (the scene needs it), at most one camera and at most one ambient light (the
 * engine takes one ambient).
 */
import { defaultElement, newElementId, newElementLabel } from './model/defaults';
import { emptyDiff, type ModelDiff } from './model/diff';
import { aimAngles, direction2, normaliseDeg, position3 } from './model/geometry';
import type { EditorElement, ElementKind } from './model/schema';
import type { EditorModel, Vec2, Vec3 } from './model/types';
import { ambientOf, cameraOf, subjectOf, topZIndex } from './model/types';

export interface CommandError {
	message: string;
	/** The field at fault, e.g. `['guideNumber']` or `['camera', 'aperture']`. */
	path?: (string | number)[];
}

export type CommandResult = { ok: true; diff: ModelDiff; createdIds: string[] } | { ok: false; error: CommandError };
export type Command = (model: EditorModel) => CommandResult;

export const ok = (diff: ModelDiff, createdIds: string[] = []): CommandResult => ({ ok: true, diff, createdIds });
export const refuse = (message: string, path?: (string | number)[]): CommandResult => ({ ok: false, error: { message, path } });

/** Elements by id, leaving out missing ids; refuses when none is left. */
function pick(model: EditorModel, ids: readonly string[], { unlockedOnly }: { unlockedOnly: boolean }) {
	const found = ids.map((id) => model.elements[id]).filter((e): e is EditorElement => e !== undefined);
	if (!found.length) return { error: refuse(ids.length ? 'no such element on the plan' : 'nothing selected') };
	const usable = unlockedOnly ? found.filter((e) => !e.locked) : found;
	if (!usable.length) return { error: refuse(found.length === 1 ? `“${found[0].label}” is locked` : 'the selected elements are locked') };
	return { elements: usable };
}

function updateAll(elements: readonly EditorElement[], change: (el: EditorElement) => EditorElement): ModelDiff {
	const diff = emptyDiff();
	for (const el of elements) {
		const next = change(el);
		if (next !== el) diff.updated[el.id] = [el, next];
	}
	return diff;
}

// ---------- adding and removing ----------

export interface AddOptions {
	xM: number;
	yM: number;
	heightM?: number;
}

/** The nearest flash or continuous light to a point, for a new card's source. */
function nearestEmitter(model: EditorModel, point: Vec2): EditorElement | undefined {
	let best: EditorElement | undefined;
	let bestD = Infinity;
	for (const el of Object.values(model.elements)) {
		if (el.kind !== 'flash' && el.kind !== 'continuous') continue;
		const d = Math.hypot(el.xM - point[0], el.yM - point[1]);
		if (d < bestD) [best, bestD] = [el, d];
	}
	return best;
}

/** Why a plan cannot take another element of this kind (null: it can). */
export function oneOfAKind(model: EditorModel, kind: ElementKind): string | null {
	if (kind === 'subject' && subjectOf(model)) return 'the plan already has a subject';
	if (kind === 'camera' && cameraOf(model)) return 'the plan already has a camera';
	if (kind === 'ambient' && ambientOf(model)) return 'the plan already has an ambient light (a setup has one: edit it, or delete it first)';
	return null;
}

export function addElement(kind: ElementKind, at: AddOptions): Command {
	return (model) => {
		const taken = oneOfAKind(model, kind);
		if (taken) return refuse(taken);
		const id = newElementId(model, kind);
		let el: EditorElement = defaultElement(kind, {
			id,
			label: newElementLabel(model, kind),
			xM: at.xM,
			yM: at.yM,
			heightM: at.heightM,
			zIndex: kind === 'background' ? Math.min(0, ...Object.values(model.elements).map((e) => e.zIndex)) - 1 : topZIndex(model) + 1
		});
		if (el.kind === 'reflector') {
			const source = nearestEmitter(model, [at.xM, at.yM]);
			el = { ...el, source: source ? source.id : 'ambient' };
		}
		el = aimed(model, el);
		const diff = emptyDiff();
		diff.added[id] = el;
		return ok(diff, [id]);
	};
}

export function removeElements(ids: readonly string[]): Command {
	return (model) => {
		const picked = pick(model, ids, { unlockedOnly: true });
		if (picked.error) return picked.error;
		const removable = picked.elements.filter((e) => e.kind !== 'subject');
		if (!removable.length) return refuse('the subject cannot be deleted: every setup has one (move it instead)');
		const diff = emptyDiff();
		for (const el of removable) diff.removed[el.id] = el;
		return ok(diff);
	};
}

// ---------- moving and turning ----------

export function moveElementsBy(ids: readonly string[], dxM: number, dyM: number): Command {
	return (model) => {
		const picked = pick(model, ids, { unlockedOnly: true });
		if (picked.error) return picked.error;
		return ok(updateAll(picked.elements, (el) => (dxM === 0 && dyM === 0 ? el : { ...el, xM: el.xM + dxM, yM: el.yM + dyM })));
	};
}

/** Absolute plan positions (a drag sets them from where the gesture began). */
export function moveElementsTo(positions: Readonly<Record<string, { xM: number; yM: number }>>): Command {
	return (model) => {
		const picked = pick(model, Object.keys(positions), { unlockedOnly: true });
		if (picked.error) return picked.error;
		return ok(
			updateAll(picked.elements, (el) => {
				const p = positions[el.id];
				return p.xM === el.xM && p.yM === el.yM ? el : { ...el, xM: p.xM, yM: p.yM };
			})
		);
	};
}

/** Sets rotations and positions from a snapshot (a rotate gesture turns the selection about a centre). */
export function rotateElementsAbout(
	initial: Readonly<Record<string, { xM: number; yM: number; rotationDeg: number }>>,
	centre: Vec2,
	deltaDeg: number
): Command {
	return (model) => {
		const picked = pick(model, Object.keys(initial), { unlockedOnly: true });
		if (picked.error) return picked.error;
		const [c, s] = direction2(deltaDeg);
		return ok(
			updateAll(picked.elements, (el) => {
				const start = initial[el.id];
				const dx = start.xM - centre[0];
				const dy = start.yM - centre[1];
				return facingTurned({
					...el,
					xM: centre[0] + dx * c - dy * s,
					yM: centre[1] + dx * s + dy * c,
					rotationDeg: normaliseDeg(start.rotationDeg + deltaDeg)
				});
			})
		);
	};
}

export function rotateElementsBy(ids: readonly string[], deltaDeg: number): Command {
	return (model) => {
		const picked = pick(model, ids, { unlockedOnly: true });
		if (picked.error) return picked.error;
		return ok(updateAll(picked.elements, (el) => facingTurned({ ...el, rotationDeg: normaliseDeg(el.rotationDeg + deltaDeg) })));
	};
}

/** A card turned by hand now faces where it is turned. */
export function facingTurned(el: EditorElement): EditorElement {
	return el.kind === 'reflector' && !el.facingSet ? { ...el, facingSet: true } : el;
}

/** Turned toward the subject: lights and the camera point at it, cards bounce their source onto it. */
function aimed(model: EditorModel, el: EditorElement): EditorElement {
	const subject = subjectOf(model);
	if (!subject || el.kind === 'subject' || el.kind === 'background') return el;
	const from = position3(el);
	const to = position3(subject);
	if (from[0] === to[0] && from[1] === to[1] && from[2] === to[2]) return el;
	if (el.kind === 'flash' || el.kind === 'continuous') return { ...el, ...aimAngles(from, to) };
	if (el.kind === 'reflector') {
		const source = el.source === 'ambient' ? undefined : model.elements[el.source];
		const unit = (v: Vec3): Vec3 => {
			const l = Math.hypot(v[0], v[1], v[2]) || 1;
			return [v[0] / l, v[1] / l, v[2] / l];
		};
		const toSubject = unit([to[0] - from[0], to[1] - from[1], to[2] - from[2]]);
		// Facing the half-way direction sends the source's light on to the subject (mirror law).
		const toSource = source ? unit([source.xM - from[0], source.yM - from[1], source.heightM - from[2]]) : toSubject;
		const n: Vec3 = [toSubject[0] + toSource[0], toSubject[1] + toSource[1], toSubject[2] + toSource[2]];
		const normal = Math.hypot(...n) < 1e-9 ? toSubject : n;
		return { ...el, ...aimAngles([0, 0, 0], normal), facingSet: true };
	}
	// The camera, flags and diffusers turn in plan only.
	return { ...el, rotationDeg: aimAngles(from, to).rotationDeg };
}

export function aimAtSubject(ids: readonly string[]): Command {
	return (model) => {
		if (!subjectOf(model)) return refuse('the plan has no subject to aim at');
		const picked = pick(model, ids, { unlockedOnly: true });
		if (picked.error) return picked.error;
		const aimable = picked.elements.filter((e) => e.kind !== 'subject' && e.kind !== 'background');
		if (!aimable.length) return refuse('only lights, cards, flags, diffusers and the camera can be aimed');
		return ok(updateAll(aimable, (el) => aimed(model, el)));
	};
}

// ---------- copies, locks, order ----------

export function duplicateElements(ids: readonly string[], offsetM: Vec2 = [0.05, 0.05]): Command {
	return (model) => {
		const picked = pick(model, ids, { unlockedOnly: false });
		if (picked.error) return picked.error;
		const copyable = picked.elements.filter((e) => e.kind !== 'subject' && e.kind !== 'camera' && e.kind !== 'ambient');
		if (!copyable.length) return refuse('the subject, the camera and the ambient light cannot be duplicated: a plan has one of each');
		const diff = emptyDiff();
		const taken = new Set<string>();
		const newIds = new Map<string, string>();
		let z = topZIndex(model);
		const ordered = [...copyable].sort((a, b) => a.zIndex - b.zIndex);
		const labels = new Set(Object.values(model.elements).map((e) => e.label));
		for (const el of ordered) {
			const id = newElementId(model, el.kind, taken);
			taken.add(id);
			newIds.set(el.id, id);
		}
		for (const el of ordered) {
			let label = `${el.label} copy`;
			for (let n = 2; labels.has(label); n++) label = `${el.label} copy ${n}`;
			labels.add(label);
			let copy: EditorElement = { ...el, id: newIds.get(el.id)!, label, xM: el.xM + offsetM[0], yM: el.yM + offsetM[1], locked: false, zIndex: ++z };
			// A card copied with its light bounces the copy of that light.
			if (copy.kind === 'reflector' && newIds.has(copy.source)) copy = { ...copy, source: newIds.get(copy.source)! };
			diff.added[copy.id] = copy;
		}
		return ok(diff, ordered.map((e) => newIds.get(e.id)!));
	};
}

export function setLocked(ids: readonly string[], locked: boolean): Command {
	return (model) => {
		const picked = pick(model, ids, { unlockedOnly: false });
		if (picked.error) return picked.error;
		return ok(updateAll(picked.elements, (el) => (el.locked === locked ? el : { ...el, locked })));
	};
}

export function bringToFront(ids: readonly string[]): Command {
	return (model) => {
		const picked = pick(model, ids, { unlockedOnly: false });
		if (picked.error) return picked.error;
		let z = topZIndex(model);
		const ordered = [...picked.elements].sort((a, b) => a.zIndex - b.zIndex);
		return ok(updateAll(ordered, (el) => ({ ...el, zIndex: ++z })));
	};
}

export function sendToBack(ids: readonly string[]): Command {
	return (model) => {
		const picked = pick(model, ids, { unlockedOnly: false });
		if (picked.error) return picked.error;
		let z = Math.min(...Object.values(model.elements).map((e) => e.zIndex));
		const ordered = [...picked.elements].sort((a, b) => b.zIndex - a.zIndex);
		return ok(updateAll(ordered, (el) => ({ ...el, zIndex: --z })));
	};
}

