/**
 * The commands that set what a user types: an element's properties, the camera settings, the scene's
 * ambient and a whole element put on the plan. Each is checked with the element schemas
 * (model/schema.ts, zod) and refused naming the field. Kept apart from commands.ts because only the
 * inspector's fields, the camera fields and the selected element's choices run them, and these load
 * once the page is live: the editor's first load carries no zod.
 */
import type { z } from 'zod';
import { ok, facingTurned, oneOfAKind, refuse, type Command, type CommandResult } from './commands';
import { defaultElement, KIND_LABELS, newElementId } from './model/defaults';
import { emptyDiff } from './model/diff';
import { normaliseDeg } from './model/geometry';
import { AMBIENT_ID } from './model/layout';
import { ambientSettingsSchema, cameraSettingsSchema, elementSchemaFor, type AmbientSettings, type CameraSettings, type EditorElement } from './model/schema';
import { ambientOf, subjectOf, topZIndex } from './model/types';

function zodError(error: z.ZodError, prefix: (string | number)[] = []): CommandResult {
	const issue = error.issues[0];
	const path = [...prefix, ...issue.path.map((p) => (typeof p === 'symbol' ? String(p) : p))];
	return refuse(`${path.join('.')} ${issue.message}`, path);
}

export function checkElement(el: EditorElement): { ok: true; element: EditorElement } | { ok: false; result: CommandResult } {
	const parsed = elementSchemaFor(el.kind).safeParse(el);
	if (!parsed.success) return { ok: false, result: zodError(parsed.error) };
	return { ok: true, element: parsed.data as EditorElement };
}

const GEOMETRY_KEYS = ['xM', 'yM', 'heightM', 'rotationDeg', 'tiltDeg'] as const;

/** Sets properties of one element, checked against its kind's schema; the id and kind never change. */
export function setElementProperties(id: string, patch: Readonly<Record<string, unknown>>): Command {
	return (model) => {
		const el = model.elements[id];
		if (!el) return refuse('no such element on the plan');
		if ('id' in patch && patch.id !== id) return refuse('id cannot be changed', ['id']);
		if ('kind' in patch && patch.kind !== el.kind) return refuse('kind cannot be changed', ['kind']);
		const shape = elementSchemaFor(el.kind).shape;
		for (const key of Object.keys(patch)) if (!(key in shape)) return refuse(`${key} is not a property of a ${el.kind}`, [key]);
		if (el.locked && !(patch.locked === false)) {
			const key = GEOMETRY_KEYS.find((k) => k in patch && patch[k] !== (el as Record<string, unknown>)[k]);
			if (key) return refuse(`“${el.label}” is locked: unlock it to change ${key}`, [key]);
		}
		const turned = typeof patch.rotationDeg === 'number' && Number.isFinite(patch.rotationDeg) ? { rotationDeg: normaliseDeg(patch.rotationDeg) } : {};
		const checked = checkElement({ ...el, ...patch, ...turned, id, kind: el.kind } as EditorElement);
		if (!checked.ok) return checked.result;
		let next = checked.element;
		if (next.kind === 'reflector' && next.source !== 'ambient') {
			const source = model.elements[next.source];
			if (!source || (source.kind !== 'flash' && source.kind !== 'continuous')) {
				return refuse(`source must be a flash, a continuous light or "ambient", not “${next.source}”`, ['source']);
			}
		}
		if (next.kind === 'reflector' && ('rotationDeg' in patch || 'tiltDeg' in patch)) next = facingTurned(next);
		const diff = emptyDiff();
		diff.updated[id] = [el, next];
		return ok(diff);
	};
}

export function setCameraSettings(patch: Partial<CameraSettings>): Command {
	return (model) => {
		const parsed = cameraSettingsSchema.safeParse({ ...model.camera, ...patch });
		if (!parsed.success) return zodError(parsed.error, ['camera']);
		const next = parsed.data;
		if (next.minAperture !== undefined && next.maxAperture !== undefined && next.minAperture > next.maxAperture) {
			return refuse('camera.maxAperture must not be below minAperture', ['camera', 'maxAperture']);
		}
		const diff = emptyDiff();
		diff.camera = [model.camera, next];
		return ok(diff);
	};
}

/**
 * The scene's ambient (EV at ISO 100, kelvin), kept on the ambient element: sets it on the one the plan
 * has, or puts open sky behind the subject; null removes it.
 */
export function setAmbient(ambient: AmbientSettings | null): Command {
	return (model) => {
		const current = ambientOf(model);
		const diff = emptyDiff();
		if (ambient === null) {
			if (current) diff.removed[current.id] = current;
			return ok(diff);
		}
		const parsed = ambientSettingsSchema.safeParse(ambient);
		if (!parsed.success) return zodError(parsed.error, ['ambient']);
		const figures = { ev100: parsed.data.ev100, kelvin: parsed.data.kelvin ?? null };
		if (current) {
			diff.updated[current.id] = [current, { ...current, ...figures }];
			return ok(diff);
		}
		const subject = subjectOf(model);
		const id = AMBIENT_ID in model.elements ? newElementId(model, 'ambient') : AMBIENT_ID;
		const at = { xM: subject?.xM ?? 0, yM: (subject?.yM ?? 0) - 0.4, heightM: (subject?.heightM ?? 0) + 0.3, rotationDeg: 90 };
		const el = defaultElement('ambient', { id, label: KIND_LABELS.ambient, ...at, zIndex: topZIndex(model) + 1 });
		diff.added[id] = { ...el, source: 'sky', ...figures };
		return ok(diff, [id]);
	};
}

/** Puts a whole element on the plan (pasting, the element list's "add as"). A taken id gets a new one. */
export function insertElement(element: EditorElement): Command {
	return (model) => {
		const taken = oneOfAKind(model, element.kind);
		if (taken) return refuse(taken);
		const id = element.id in model.elements ? newElementId(model, element.kind) : element.id;
		const checked = checkElement({ ...element, id });
		if (!checked.ok) return checked.result;
		const diff = emptyDiff();
		diff.added[id] = checked.element;
		return ok(diff, [id]);
	};
}
