/**
 * The editor model written back as a setup document: each element's plan entry (what was read, with
 * the editor's fields written over it) and the scene (`toExposureScene`). The plan entries' fields are
 * described in document.ts, which reads them; this half needs no schema, so the editor's first load
 * (which saves and compares with it) brings no zod.
 */
import type { GearSnapshot, Plan, SetupDocument } from '$lib/scene/document';
import { CURRENT_SCHEMA_VERSION } from '$lib/scene/version';
import { ELEMENT_KINDS, type ElementKind } from './kinds';
import { isFitted } from './fitted';
import { toExposureScene } from './scene';
import type { EditorElement } from './schema';
import type { EditorModel } from './types';
import { elementsInOrder } from './types';

export type Entry = Record<string, unknown>;

export const isKind = (k: unknown): k is ElementKind => typeof k === 'string' && (ELEMENT_KINDS as readonly string[]).includes(k);

/** Kinds whose place is the plan's `position` (the scene has no place for them, or not their height). */
export const HAS_POSITION: ReadonlySet<ElementKind> = new Set(['camera', 'diffuser', 'background', 'flag', 'ambient']);
/** Panels: their upright size is the entry's `heightM`. */
export const PANELS: ReadonlySet<ElementKind> = new Set(['reflector', 'diffuser', 'flag']);

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
