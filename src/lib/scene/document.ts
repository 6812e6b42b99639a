/**
 * The setup document: what one revision of a setup stores, as plain JSON.
 *
 *   { schemaVersion, scene, plan, notes, gear }
 *
 * - `scene` is exactly the body of `POST /api/v1/exposure` (the light engine's `exposureSceneSchema`):
 *   positions [x, y, z] in metres, so heights live here and distances are true 3-D distances.
 * - `plan` is what only the drawing needs (labels, rotation, sizes, colours), keyed by element id. It may
 *   be `{}`: the editor lays out whatever the plan lacks.
 * - `notes` is Markdown (rendered sanitised by the pages).
 * - `gear` holds copies of the gear-shelf items the plan refers to (`plan.elements[id].gearId`), taken
 *   when the gear was attached, so a later change on the gear shelf never rewrites a saved revision.
 *
 * Selection, zoom and the active tool are session state and never saved here.
 * Older `schemaVersion`s are migrated on read (see migrations.ts).
 */
import { z } from 'zod';
import { exposureSceneSchema, range as finite, vec2Schema, vec3Schema } from '$lib/light/schema';
import { gearKindSchema, gearSpecSchemas } from './gear';
import { findJsonProblem, MAX_DOCUMENT_DEPTH, MAX_DOCUMENT_ENTRIES } from '$lib/json-limits';
import { CURRENT_SCHEMA_VERSION } from './version';

export { elementUsingGear, referencedGearIds } from './gear-refs';

export { CURRENT_SCHEMA_VERSION };

export const MAX_NOTES_CHARS = 20_000;
export const MAX_PLAN_ELEMENTS = 500;
export const MAX_GEAR_SNAPSHOTS = 100;
export const MAX_LABEL_CHARS = 200;

/** Kinds of drawn element. The scene's lights and flags have their own ids; plan-only elements (a
 * background sweep, the table edge, a written label) exist only here. */
export const PLAN_ELEMENT_KINDS = [
	'subject',
	'camera',
	'flash',
	'continuous',
	'reflector',
	'flag',
	'ambient',
	'modifier',
	'diffuser',
	'background',
	'table',
	'label'
] as const;

const sizeM = finite(0, 100, 'm');

export const elementIdSchema = z
	.string()
	.min(1, 'must not be empty')
	.max(100, 'must be at most 100 characters');

export const colourSchema = z
	.string({ error: 'must be a colour such as "#f2c14e"' })
	.regex(/^#(?:[0-9a-fA-F]{3}|[0-9a-fA-F]{6})$/, 'must be a hex colour such as "#f2c14e"');

/**
 * One drawn element. Known fields are checked; further fields the editor may add later are kept
 * (a loose object), so an older server does not strip what a newer editor wrote.
 */
export const planElementSchema = z.looseObject({
	kind: z.enum(PLAN_ELEMENT_KINDS, { error: `must be one of ${PLAN_ELEMENT_KINDS.join(', ')}` }).optional(),
	label: z.string({ error: 'must be text' }).max(MAX_LABEL_CHARS, `must be at most ${MAX_LABEL_CHARS} characters`).optional(),
	rotationDeg: finite(-360, 360, '°').optional(),
	widthM: sizeM.optional(),
	depthM: sizeM.optional(),
	heightM: sizeM.optional(),
	/** Plan-only elements (background, table, label) have no scene position of their own. */
	position: vec3Schema.optional(),
	colour: colourSchema.optional(),
	locked: z.boolean({ error: 'must be true or false' }).optional(),
	gearId: z.uuid({ error: 'must be the id of an item on the gear shelf' }).optional(),
	/** A modifier or diffuser is drawn on the light it is fitted to. */
	attachedTo: elementIdSchema.optional()
});

/** The part of the table the plan frames by default (also the print frame); not a session's zoom. */
export const planViewportSchema = z.looseObject({
	center: vec2Schema.optional(),
	widthM: finite(0.01, 1000, 'm').optional(),
	depthM: finite(0.01, 1000, 'm').optional()
});

export const planSchema = z.looseObject({
	elements: z
		.record(elementIdSchema, planElementSchema)
		.refine((r) => Object.keys(r).length <= MAX_PLAN_ELEMENTS, `at most ${MAX_PLAN_ELEMENTS} elements`)
		.optional(),
	viewport: planViewportSchema.optional()
});

/** A copy of a gear-shelf item as it was when the setup took it. */
export const gearSnapshotSchema = z
	.object({
		id: z.uuid({ error: 'must be a gear id' }),
		kind: gearKindSchema,
		name: z.string().min(1, 'must not be empty').max(200, 'must be at most 200 characters'),
		spec: z.record(z.string(), z.unknown()),
		copiedAt: z.iso.datetime({ error: 'must be an ISO date-time', offset: true })
	})
	.superRefine((snap, ctx) => {
		const parsed = gearSpecSchemas[snap.kind].safeParse(snap.spec);
		if (!parsed.success) {
			for (const issue of parsed.error.issues) {
				ctx.addIssue({ code: 'custom', path: ['spec', ...issue.path.map(String)], message: issue.message });
			}
		}
	});

export const setupDocumentSchema = z
	.object({
		schemaVersion: z.literal(CURRENT_SCHEMA_VERSION, { error: `must be ${CURRENT_SCHEMA_VERSION}` }),
		scene: exposureSceneSchema,
		plan: planSchema.default({}),
		notes: z
			.string({ error: 'must be text (Markdown)' })
			.max(MAX_NOTES_CHARS, `must be at most ${MAX_NOTES_CHARS} characters`)
			.default(''),
		gear: z
			.array(gearSnapshotSchema)
			.max(MAX_GEAR_SNAPSHOTS, `at most ${MAX_GEAR_SNAPSHOTS} gear items`)
			.default([])
	})
	.superRefine((doc, ctx) => {
		// The loose objects keep fields this server does not know; those may not nest or grow without bound.
		const problem = findJsonProblem(doc, { maxDepth: MAX_DOCUMENT_DEPTH, maxEntries: MAX_DOCUMENT_ENTRIES });
		if (problem) ctx.addIssue({ code: 'custom', path: problem.path, message: problem.message });
		const seen = new Set<string>();
		doc.gear.forEach((g, i) => {
			if (seen.has(g.id)) ctx.addIssue({ code: 'custom', path: ['gear', i, 'id'], message: `gear ${g.id} is copied twice` });
			seen.add(g.id);
		});
	});

export type SetupDocument = z.output<typeof setupDocumentSchema>;
export type SetupDocumentInput = z.input<typeof setupDocumentSchema>;
export type PlanElement = z.output<typeof planElementSchema>;
export type Plan = z.output<typeof planSchema>;
export type GearSnapshot = z.output<typeof gearSnapshotSchema>;

/**
 * The document with each scene flash drawn from a flash's gear copy (`plan.elements[id].gearId`)
 * carrying that copy's calibration as the engine's `calibrationOffsetStops`. The server runs it on every
 * save, after the copies took the calibration in force on the shelf, so a revision predicts with the
 * calibration of its day; a flash typed by hand keeps its own offset.
 */
export function withGearCalibrations(doc: SetupDocument): SetupDocument {
	const offsets = new Map(doc.gear.filter((g) => g.kind === 'flash').map((g) => [g.id, Number(g.spec.calibrationOffsetStops ?? 0)]));
	const lights = doc.scene.lights.map((light) => {
		const gearId = doc.plan.elements?.[light.id]?.gearId;
		if (light.kind !== 'flash' || !gearId || !offsets.has(gearId)) return light;
		const { calibrationOffsetStops: _was, ...rest } = light;
		const offset = offsets.get(gearId)!;
		return offset !== 0 ? { ...rest, calibrationOffsetStops: offset } : rest;
	});
	return { ...doc, scene: { ...doc.scene, lights } };
}
