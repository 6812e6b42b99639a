/**
 * The comparison of two revisions of a setup, in words: elements added, removed and moved (and by how
 * far), what changed on a light, the camera and ambient settings, the notes, and the change in exposure
 * in stops, computed with the light engine from both documents. One file a topic: `elements.ts` (what
 * stands where), `placement.ts` (what moved), `lights.ts`, `settings.ts`, `notes.ts`, `exposure.ts`,
 * and `shown.ts`, the one rule for numbers (compared as printed); this file puts them together. Only
 * what changed is reported, each change once (`honest.test.ts`).
 *
 * Pure: plain documents in, plain sentences and numbers out. The history pages render it; the setup
 * page uses it to show what changed under a stale save.
 */
import { elementName } from './elements';
import { drawingChanges, placedElements, placementChanges, type ComparableDocument } from './placement';
import { exposureChange } from './exposure';
import { lightPropertyChanges } from './lights';
import { notesChange, type LineDiffOp } from './notes';
import { settingChanges } from './settings';
import type { UnitSystem } from '$lib/light/format';

export { elementName, kindWord, planElementPosition } from './elements';
export { placedElements, type ComparableDocument } from './placement';
export { powerLabel } from './lights';
export { diffLines, type LineDiffOp } from './notes';

export interface ElementEntry {
	id: string;
	kind: string;
	label: string;
	text: string;
}

export interface MoveEntry extends ElementEntry {
	/** Straight-line distance the element moved, metres (3-D). */
	distanceM: number;
	/** Height change, metres (positive = raised). */
	heightChangeM: number;
	/** For lights: distance to the subject before and after, metres. */
	subjectDistanceM?: { before: number; after: number };
	rotationChangeDeg?: number;
}

export interface PropertyEntry extends ElementEntry {
	property: string;
	before: unknown;
	after: unknown;
}

export interface SettingEntry {
	setting: string;
	before: unknown;
	after: unknown;
	text: string;
}

export interface LightExposureEntry {
	id: string;
	label: string;
	beforeStops: number | null;
	afterStops: number | null;
	/** null when either side gives no light. */
	deltaStops: number | null;
	text: string;
}

export interface ExposureChange {
	beforeStops: number | null;
	afterStops: number | null;
	deltaStops: number | null;
	text: string;
	lights: LightExposureEntry[];
	keyLight: { before: string | null; after: string | null; text: string | null };
	lightingRatio: { before: number | null; after: number | null; text: string | null };
	/** One of the documents could not be computed (should not happen with validated documents). */
	error?: string;
}

export interface NotesChange {
	changed: boolean;
	linesAdded: number;
	linesRemoved: number;
	text: string | null;
	lines: LineDiffOp[];
}

export interface Comparison {
	added: ElementEntry[];
	removed: ElementEntry[];
	moved: MoveEntry[];
	altered: PropertyEntry[];
	settings: SettingEntry[];
	notes: NotesChange;
	gear: ElementEntry[];
	exposure: ExposureChange;
	/** Nothing at all differs between the two documents. */
	identical: boolean;
	/** The plan drawing differs only in ways named above by none of the lists (colours, layout hints). */
	planOnlyChange: boolean;
}

export interface CompareOptions {
	unitSystem?: UnitSystem;
	/** Moves shorter than this are ignored (rounding in a drag), metres. Default 1 mm. */
	moveThresholdM?: number;
}

/** Compares revision `a` (before) with revision `b` (after). */
export function compareDocuments(a: ComparableDocument, b: ComparableDocument, options: CompareOptions = {}): Comparison {
	const units = options.unitSystem ?? 'metric';
	const ea = placedElements(a);
	const eb = placedElements(b);
	const labelOf = (id: string) => {
		if (id === 'ambient') return 'Ambient light';
		const el = eb.get(id) ?? ea.get(id);
		return el ? elementName(el.kind, el.label) : `“${id}”`;
	};
	const { added, removed, moved } = placementChanges(ea, eb, units, options.moveThresholdM ?? 0.001);

	const altered: PropertyEntry[] = [];
	const lightsA = new Map(a.scene.lights.map((l) => [l.id, l]));
	for (const lb of b.scene.lights) {
		const la = lightsA.get(lb.id);
		if (la && la.kind === lb.kind)
			altered.push(...lightPropertyChanges(la, lb, labelOf(lb.id), units, { before: a.plan?.elements?.[lb.id], after: b.plan?.elements?.[lb.id] }));
	}
	altered.push(...drawingChanges(a, b, ea, eb, units));

	const gear: ElementEntry[] = [];
	const gearA = new Map((a.gear ?? []).map((g) => [g.id, g]));
	const gearB = new Map((b.gear ?? []).map((g) => [g.id, g]));
	for (const [id, g] of gearB) if (!gearA.has(id)) gear.push({ id, kind: g.kind, label: g.name, text: `Gear “${g.name}” (${g.kind}) taken from the gear shelf` });
	for (const [id, g] of gearA) if (!gearB.has(id)) gear.push({ id, kind: g.kind, label: g.name, text: `Gear “${g.name}” (${g.kind}) no longer used` });

	const settings = settingChanges(a.scene, b.scene);
	const notes = notesChange(a.notes ?? '', b.notes ?? '');
	const exposure = exposureChange(a, b, labelOf);
	const planOnlyChange =
		added.length + removed.length + moved.length + altered.length === 0 && JSON.stringify(a.plan ?? {}) !== JSON.stringify(b.plan ?? {});
	const identical =
		added.length + removed.length + moved.length + altered.length + settings.length + gear.length === 0 &&
		!notes.changed &&
		JSON.stringify(a.scene) === JSON.stringify(b.scene) &&
		JSON.stringify(a.plan ?? {}) === JSON.stringify(b.plan ?? {});
	return { added, removed, moved, altered, settings, notes, gear, exposure, identical, planOnlyChange };
}

/** Every change as one sentence each, in reading order (for a short summary). */
export function comparisonSentences(c: Comparison): string[] {
	const out = [
		...c.added.map((e) => e.text),
		...c.removed.map((e) => e.text),
		...c.moved.map((e) => e.text),
		...c.altered.map((e) => e.text),
		...c.settings.map((e) => e.text),
		...c.gear.map((e) => e.text)
	];
	if (c.planOnlyChange) out.push('The plan drawing changed (colours or other drawing details only)');
	if (c.notes.text) out.push(c.notes.text);
	if (!c.identical || c.exposure.deltaStops) out.push(c.exposure.text);
	return out;
}
