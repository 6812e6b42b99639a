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
import type { GearSnapshot, Plan, SetupDocument } from '$lib/scene/document';
import { CURRENT_SCHEMA_VERSION } from '$lib/scene/version';
import { defaultElement, KIND_LABELS } from './defaults';
import { fittedTo, isFitted } from './fitted';
import { modelFromScene, modifierFromScene, type LayoutResult } from './layout';
import { toExposureScene } from './scene';
import { ELEMENT_KINDS, elementSchemaFor, type EditorElement, type ElementKind, type Modifier } from './schema';
import type { EditorModel, KeptPlan } from './types';
import { elementsInOrder } from './types';

export type { Plan, SetupDocument } from '$lib/scene/document';

type Entry = Record<string, unknown>;

const isRecord = (v: unknown): v is Entry => typeof v === 'object' && v !== null && !Array.isArray(v);
const isKind = (k: unknown): k is ElementKind => typeof k === 'string' && (ELEMENT_KINDS as readonly string[]).includes(k);

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
const HAS_POSITION: ReadonlySet<ElementKind> = new Set(['camera', 'diffuser', 'background', 'flag', 'ambient']);
const PANELS: ReadonlySet<ElementKind> = new Set(['reflector', 'diffuser', 'flag']);

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

/** The element's entry in the document's plan: what was read, with the editor's fields written over it. */
function entryFor(el: EditorElement, read: Entry | undefined): Entry {
	const entry: Entry = { ...read, kind: el.kind, label: el.label, rotationDeg: el.rotationDeg, locked: el.locked, zIndex: el.zIndex };
	if (HAS_POSITION.has(el.kind)) entry.position = [el.xM, el.yM, el.heightM];
	switch (el.kind) {
		case 'subject':
			Object.assign(entry, { widthM: el.widthM, depthM: el.depthM });
			break;
		case 'camera':
			Object.assign(entry, { focalLengthMm: el.focalLengthMm, sensorWidthMm: el.sensorWidthMm, sensorHeightMm: el.sensorHeightMm, lens: el.lens });
			setGearId(entry, el.gearId);
			break;
		case 'flash':
			Object.assign(entry, { modifier: el.modifier, otherLossStops: el.otherLossStops, tiltDeg: el.tiltDeg, lowestPower: el.lowestPower, zoomMm: el.zoomMm });
			setGearId(entry, el.gearId);
			break;
		case 'continuous':
			Object.assign(entry, { modifier: el.modifier, otherLossStops: el.otherLossStops, tiltDeg: el.tiltDeg });
			break;
		case 'reflector':
			Object.assign(entry, {
				widthM: el.widthM,
				heightM: el.panelHeightM,
				tiltDeg: el.tiltDeg,
				facingSet: el.facingSet,
				surface: el.surface,
				reflectance: el.reflectance,
				source: el.source
			});
			break;
		case 'diffuser':
			Object.assign(entry, { widthM: el.widthM, heightM: el.panelHeightM, tiltDeg: el.tiltDeg, lossStops: el.lossStops });
			break;
		case 'flag':
			Object.assign(entry, { widthM: el.widthM, heightM: el.panelHeightM, tiltDeg: el.tiltDeg });
			break;
		case 'ambient':
			Object.assign(entry, { widthM: el.widthM, source: el.source });
			break;
		case 'background':
			Object.assign(entry, { widthM: el.widthM, depthM: el.depthM, colour: el.colour });
			break;
	}
	return entry;
}

/** The gear id the element now has (a flash typed by hand no longer names the shelf item it came from). */
function setGearId(entry: Entry, gearId: string | undefined) {
	if (gearId) entry.gearId = gearId;
	else delete entry.gearId;
}

export function planFromModel(model: EditorModel): Plan {
	const elements: Record<string, Entry> = {};
	for (const el of elementsInOrder(model)) elements[el.id] = entryFor(el, model.kept.entries[el.id]);
	// Entries of kinds the editor does not draw go back as they came, unless what they were fitted to is gone.
	for (const [id, entry] of Object.entries(model.kept.entries)) {
		if ((isKind(entry.kind) && !isFitted(entry)) || id in elements) continue;
		if (typeof entry.attachedTo === 'string' && !(entry.attachedTo in model.elements)) continue;
		elements[id] = { ...entry };
	}
	return { ...model.kept.rest, elements } as Plan;
}

/** The document to save. `notes` and `gear` are the page's (the editor does not change them). */
export function documentFromModel(model: EditorModel, notes = '', gear: readonly GearSnapshot[] = []): SetupDocument {
	return { schemaVersion: CURRENT_SCHEMA_VERSION, scene: toExposureScene(model), plan: planFromModel(model), notes, gear: [...gear] };
}
