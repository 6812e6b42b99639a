/**
 * A step's plan as the present view shows it, and a kept what-if as the document to save.
 *
 * A step pins one revision and names the elements it shows: the rest are taken out of the model, so
 * the plan does not draw them and the exposure (the engine, through the editor's own scene) leaves them
 * out. The subject and the camera always stay: without them there is nothing to light or to see it
 * from. Every step of one setup is framed the same (the whole revision's extent becomes the plan's
 * frame when it has none of its own), so adding a light does not jump the view.
 */
import { documentFromModel, modelFromDocument, type SetupDocument } from '$lib/editor/model/document';
import { boundsOfElements } from '$lib/editor/model/geometry';
import type { EditorElement, EditorModel } from '$lib/editor/model/types';
import type { ExposureScene } from '$lib/light/schema';
import type { GearSnapshot } from '$lib/scene/document';

/** What the present view needs of a revision's document. */
export interface StepDocument {
	scene: ExposureScene;
	plan?: Record<string, unknown>;
	notes?: string;
	gear?: readonly GearSnapshot[];
}

const ALWAYS_SHOWN: ReadonlySet<EditorElement['kind']> = new Set(['subject', 'camera']);

function shownIn(visibleIds: readonly string[] | null) {
	const visible = visibleIds ? new Set(visibleIds) : null;
	return (el: EditorElement) => !visible || visible.has(el.id) || ALWAYS_SHOWN.has(el.kind);
}

/** The plan's frame: its own, or the extent of every element of the revision (the background left out when there is more). */
function frameOf(model: EditorModel, plan: Record<string, unknown> | undefined): unknown {
	if (plan && plan.viewport) return plan.viewport;
	const elements = Object.values(model.elements);
	const b = boundsOfElements(elements.filter((e) => e.kind !== 'background')) ?? boundsOfElements(elements);
	if (!b) return undefined;
	return { center: [(b.minX + b.maxX) / 2, (b.minY + b.maxY) / 2], widthM: Math.max(b.maxX - b.minX, 0.05), depthM: Math.max(b.maxY - b.minY, 0.05) };
}

/** The document of the step: only its visible elements (null: all), framed as the whole revision. */
export function visibleDocument(doc: StepDocument, visibleIds: readonly string[] | null): SetupDocument {
	const { model } = modelFromDocument(doc);
	const shown = shownIn(visibleIds);
	const elements = Object.fromEntries(Object.entries(model.elements).filter(([, el]) => shown(el)));
	const viewport = frameOf(model, doc.plan);
	const kept = { ...model.kept, rest: viewport ? { ...model.kept.rest, viewport } : model.kept.rest };
	return documentFromModel({ ...model, elements, kept }, doc.notes ?? '', doc.gear ?? []);
}

/**
 * The revision to keep after a what-if: the pinned revision's document with the step's elements as the
 * present view left them (moved, changed, or deleted) and its camera settings; the hidden elements,
 * notes and gear copies as they were.
 */
export function keptDocument(doc: StepDocument, visibleIds: readonly string[] | null, trial: EditorModel): SetupDocument {
	const { model } = modelFromDocument(doc);
	const shown = shownIn(visibleIds);
	const elements: Record<string, EditorElement> = {};
	for (const [id, el] of Object.entries(model.elements)) if (!shown(el)) elements[id] = el;
	for (const [id, el] of Object.entries(trial.elements)) elements[id] = el;
	return documentFromModel({ ...model, elements, camera: trial.camera }, doc.notes ?? '', doc.gear ?? []);
}
