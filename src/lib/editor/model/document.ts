/**
 * The setup document as the editor reads and writes it: `{ schemaVersion, scene, plan, notes }`
 * (API.md). `scene` is the exposure scene; `plan` holds the drawing: `{ elements: { [id]: element } }`
 * with every element as the editor keeps it.
 *
 * STAND-IN: the notebook's `src/lib/scene/` will own the document schema and its migrations. Until it
 * lands, this file defines the smallest compatible shape; when it does, only this file changes.
 */
import { z } from 'zod';
import { exposureSceneSchema, type ExposureScene } from '$lib/light/schema';
import { modelFromScene, type LayoutResult } from './layout';
import { toExposureScene } from './scene';
import { editorElementSchema, type EditorElement } from './schema';
import type { EditorModel } from './types';
import { elementsInOrder } from './types';


export const planSchema = z.looseObject({
	elements: z.record(z.string(), z.unknown()).optional()
});
export type Plan = z.infer<typeof planSchema>;

export const setupDocumentSchema = z.object({
	schemaVersion: z.literal(1),
	scene: exposureSceneSchema,
	plan: planSchema,
	notes: z.string().max(100_000)
});
export type SetupDocument = z.infer<typeof setupDocumentSchema>;

/** Plan entries that parse as elements, keyed by id; the rest named in `notes`. */
export function planElements(plan: Plan): { elements: Record<string, EditorElement>; notes: string[] } {
	const elements: Record<string, EditorElement> = {};
	const notes: string[] = [];
	for (const [id, raw] of Object.entries(plan.elements ?? {})) {
		const parsed = editorElementSchema.safeParse(typeof raw === 'object' && raw !== null ? { ...raw, id } : raw);
		if (parsed.success) elements[id] = parsed.data;
		else {
			const issue = parsed.error.issues[0];
			notes.push(`plan entry “${id}”: ${issue.path.join('.') || 'entry'} ${issue.message}; it was laid out again`);
		}
	}
	return { elements, notes };
}

/** The editor model of a document; a plan that is `{}` is laid out from the scene. */
export function modelFromDocument(doc: { scene: ExposureScene; plan: Plan }): LayoutResult {
	const { elements, notes } = planElements(doc.plan);
	const result = modelFromScene(doc.scene, elements);
	return { model: result.model, notes: [...notes, ...result.notes] };
}

export function planFromModel(model: EditorModel): Plan {
	const elements: Record<string, unknown> = {};
	for (const el of elementsInOrder(model)) {
		const { id: _id, ...rest } = el;
		elements[el.id] = rest;
	}
	return { elements };
}

export function documentFromModel(model: EditorModel, notes = ''): SetupDocument {
	return { schemaVersion: 1, scene: toExposureScene(model), plan: planFromModel(model), notes };
}
