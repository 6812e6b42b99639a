/**
 * The setup document (`src/lib/scene/document.ts`: `{ schemaVersion, scene, plan, notes, gear }`) read
 * into the editor model and written back.
 *
 * The plan's entries are keyed by element id. The document's own fields mean:
 *   kind, label, rotationDeg, locked, colour, gearId, attachedTo (a modifier or label fitted to an element);
 *   position [x, y, z]   where the scene has no place for it (camera, diffuser, background, a flag's height);
 *   widthM, depthM        plan sizes; heightM the upright size of a panel (card, diffuser, flag).
 * The editor adds its own fields beside them (the document keeps unknown fields): zIndex, tiltDeg,
 * modifier, otherLossStops, facingSet, focalLengthMm, sensorWidthMm, sensorHeightMm, lens (a camera's
 * lens from the gear shelf), lowestPower and zoomMm (a flash's), source (the ambient's window or sky),
 * and for a card or a diffuser the figures the scene cannot hold for it (surface, reflectance, source,
 * lossStops). The ambient light's EV and kelvin are the scene's; its place and width are the plan's.
 * Everything the editor does not use is written back as it was read: other fields of an entry (a
 * subject's height, a gear id), entries of kinds it does not draw, the plan's print frame.
 */
import type { ExposureScene, SceneLight } from '$lib/light/schema';
import type { GearSnapshot, Plan } from '$lib/scene/document';
import { defaultElement, KIND_LABELS } from './defaults';
import { fittedTo, isFitted } from './fitted';
import { modelFromScene, modifierFromScene, type LayoutResult } from './layout';
import { elementSchemaFor, type EditorElement, type ElementKind, type Modifier } from './schema';
import { HAS_POSITION, isKind, PANELS, type Entry } from './to-document';
import type { KeptPlan } from './types';

export type { Plan, SetupDocument } from '$lib/scene/document';
export { documentFromModel, planFromModel } from './to-document';

const isRecord = (v: unknown): v is Entry => typeof v === 'object' && v !== null && !Array.isArray(v);

/** Fields the editor keeps under its own names, per kind. */
const EDITOR_FIELDS: Record<ElementKind, readonly string[]> = {
	subject: ['zIndex', 'widthM', 'depthM'],
	camera: ['zIndex', 'focalLengthMm', 'sensorWidthMm', 'sensorHeightMm', 'gearId', 'lens'],
	flash: ['zIndex', 'modifier', 'otherLossStops', 'tiltDeg', 'lowestPower', 'zoomMm', 'gearId'],
	continuous: ['zIndex', 'modifier', 'otherLossStops', 'tiltDeg'],
	reflector: ['zIndex', 'widthM', 'tiltDeg', 'facingSet', 'surface', 'reflectance', 'source'],
	diffuser: ['zIndex', 'widthM', 'tiltDeg', 'lossStops'],
	flag: ['zIndex', 'widthM', 'tiltDeg'],
	ambient: ['zIndex', 'widthM', 'source'],
	background: ['zIndex', 'widthM', 'depthM']
};
function expandColour(c: unknown): unknown {
	return typeof c === 'string' && /^#[0-9a-fA-F]{3}$/.test(c) ? `#${[...c.slice(1)].map((h) => h + h).join('')}` : c;
}

/** A plan entry's fields under the editor's names (the rest of the element comes from defaults and the scene). */
function fieldsFromEntry(kind: ElementKind, entry: Entry): Entry {
	const out: Entry = {};
	if (typeof entry.label === 'string') out.label = entry.label;
	if (entry.rotationDeg !== undefined) out.rotationDeg = entry.rotationDeg;
	if (entry.locked !== undefined) out.locked = entry.locked;
	if (HAS_POSITION.has(kind) && Array.isArray(entry.position) && entry.position.length === 3) {
		[out.xM, out.yM, out.heightM] = entry.position;
	}
	if (PANELS.has(kind) && entry.heightM !== undefined) out.panelHeightM = entry.heightM;
	if (kind === 'background' && entry.colour !== undefined) out.colour = expandColour(entry.colour);
	for (const key of EDITOR_FIELDS[kind]) if (entry[key] !== undefined) out[key] = entry[key];
	return out;
}

/**
 * The element for a plan entry: defaults for its kind, then the entry's fields. A field that does not
 * fit is left at its default and named in a note (the rest of the entry is still used).
 */
function elementFromEntry(id: string, kind: ElementKind, entry: Entry, zIndex: number, notes: string[]): EditorElement {
	const base = defaultElement(kind, { id, label: KIND_LABELS[kind], xM: 0, yM: 0, zIndex });
	const fields = fieldsFromEntry(kind, entry);
	const schema = elementSchemaFor(kind);
	for (let attempt = 0; attempt < 20; attempt++) {
		const parsed = schema.safeParse({ ...base, ...fields, id, kind });
		if (parsed.success) return parsed.data as EditorElement;
		const issue = parsed.error.issues[0];
		const key = String(issue.path[0] ?? '');
		notes.push(`plan entry “${id}”: ${issue.path.join('.') || 'entry'} ${issue.message}; the default was used`);
		if (!(key in fields)) break;
		delete fields[key];
	}
	return base;
}

/** A modifier entry fitted to a light (`attachedTo`), as the light's modifier (the scene holds its beam and loss). */
function attachedModifier(plan: Record<string, Entry>, lightId: string, light: SceneLight | undefined): Modifier | null {
	const entry = fittedTo(plan, lightId);
	if (!entry || !light || light.kind === 'reflector') return null;
	return {
		name: typeof entry.label === 'string' && entry.label ? entry.label.slice(0, 80) : 'Modifier',
		beamAngleDeg: light.beamAngleDeg ?? null,
		lossStops: light.lossStops ?? 0,
		sizeM: typeof entry.widthM === 'number' && entry.widthM >= 0.001 && entry.widthM <= 100 ? entry.widthM : 0.075
	};
}

export interface ReadResult extends LayoutResult {}

/** The editor model of a document; a plan of `{}` is laid out from the scene. */
export function modelFromDocument(doc: { scene: ExposureScene; plan?: Plan | Record<string, unknown> }): ReadResult {
	const notes: string[] = [];
	const plan: Entry = isRecord(doc.plan) ? doc.plan : {};
	const { elements: rawEntries, ...rest } = plan;
	const entries: Record<string, Entry> = {};
	if (isRecord(rawEntries)) for (const [id, e] of Object.entries(rawEntries)) if (isRecord(e)) entries[id] = e;

	const lightsById = new Map(doc.scene.lights.map((l) => [l.id, l]));
	const parsed: Record<string, EditorElement> = {};
	Object.entries(entries).forEach(([id, entry], i) => {
		if (!isKind(entry.kind) || isFitted(entry)) return; // kept as it is (a modifier, a label, the table, ...)
		const kind = entry.kind;
		const zIndex = typeof entry.zIndex === 'number' ? entry.zIndex : kind === 'background' ? -1000 + i : i + 1;
		let el = elementFromEntry(id, kind, entry, zIndex, notes);
		if ((el.kind === 'flash' || el.kind === 'continuous') && entry.modifier === undefined) {
			// Written by something other than the editor: a fitted modifier entry names it, else the scene's beam and loss make it.
			const light = lightsById.get(id);
			const fromScene = light && light.kind !== 'reflector' ? modifierFromScene(light, undefined) : null;
			el = { ...el, modifier: attachedModifier(entries, id, light) ?? fromScene };
		}
		parsed[id] = el;
	});
	const laid = modelFromScene(doc.scene, parsed);
	const kept: KeptPlan = { entries, rest };
	return { model: { ...laid.model, kept }, notes: [...notes, ...laid.notes] };
}

/** What the editor reads of a setup document (`src/lib/scene`): the scene, and whatever else it has. */
export interface DocumentIn {
	scene: ExposureScene;
	plan?: Plan | Record<string, unknown>;
	notes?: string;
	gear?: readonly GearSnapshot[];
}

/**
 * A document as the editor opens it (`new Editor({ document })`, `loadDocument`): its model read here,
 * with its notes and gear copies, which go back as given. The setup page's server reads the document it
 * sends (`modelFromDocument` in its load), so the page's first load needs none of this module.
 */
export interface OpenedDocument {
	read: ReadResult;
	notes?: string;
	gear?: readonly GearSnapshot[];
}

export function openDocument(doc: DocumentIn): OpenedDocument {
	return { read: modelFromDocument(doc), notes: doc.notes, gear: doc.gear };
}
