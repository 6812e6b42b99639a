/**
 * A workshop step shows one pinned revision with some of its elements hidden: a lesson builds a setup
 * up light by light ("the key alone, now the card, now the flag") from a single revision. What is
 * hidden leaves the drawing and the exposure alike, so the numbers on the screen are those of what the
 * students see. Pure: used by the server (step views, handouts) and the browser (the step editor).
 */
import { computeExposure, type ExposureResult } from '$lib/light/scene';
import { findNonFinite } from '$lib/light/finite';
import { referencedGearIds } from '$lib/scene/gear-refs';
import type { PlanElement, SetupDocument } from '$lib/scene/document';

/** Elements every step shows: without the subject or the camera there is nothing to expose. */
const ALWAYS_SHOWN = new Set(['subject', 'camera']);

export interface StepElement {
	id: string;
	label: string;
	kind: string;
	/** The subject and the camera cannot be hidden. */
	fixed: boolean;
	/** Fitted to another element (a softbox on its flash): hidden with it. */
	attachedTo: string | null;
}

/** Every element of a document a step may show or hide: the plan's entries and any scene light or flag the plan does not draw. */
export function stepElements(document: Pick<SetupDocument, 'scene' | 'plan'>): StepElement[] {
	const entries = document.plan.elements ?? {};
	const out: StepElement[] = Object.entries(entries).map(([id, el]) => ({
		id,
		label: el.label?.trim() || id,
		kind: el.kind ?? 'label',
		fixed: ALWAYS_SHOWN.has(el.kind ?? ''),
		attachedTo: el.attachedTo ?? null
	}));
	const known = new Set(out.map((e) => e.id));
	for (const light of document.scene.lights) {
		if (!known.has(light.id)) out.push({ id: light.id, label: light.id, kind: light.kind, fixed: false, attachedTo: null });
	}
	for (const flag of document.scene.flags ?? []) {
		if (!known.has(flag.id)) out.push({ id: flag.id, label: flag.id, kind: 'flag', fixed: false, attachedTo: null });
	}
	return out;
}

/**
 * The ids actually hidden: those asked for (the subject and camera excepted), what is fitted to a hidden
 * element, and a card or reflector whose only source of light is hidden (it has nothing to return).
 */
export function hiddenClosure(document: Pick<SetupDocument, 'scene' | 'plan'>, hidden: Iterable<string>): Set<string> {
	const elements = stepElements(document);
	const fixed = new Set(elements.filter((e) => e.fixed).map((e) => e.id));
	const out = new Set([...hidden].filter((id) => !fixed.has(id)));
	const ambientIds = elements.filter((e) => e.kind === 'ambient').map((e) => e.id);
	const ambientHidden = ambientIds.length > 0 && ambientIds.every((id) => out.has(id));
	let grew = true;
	while (grew) {
		grew = false;
		for (const e of elements) {
			if (out.has(e.id) || fixed.has(e.id)) continue;
			if (e.attachedTo && out.has(e.attachedTo)) {
				out.add(e.id);
				grew = true;
			}
		}
		for (const light of document.scene.lights) {
			if (light.kind !== 'reflector' || out.has(light.id)) continue;
			if ((light.source === 'ambient' && ambientHidden) || out.has(light.source)) {
				out.add(light.id);
				grew = true;
			}
		}
	}
	return out;
}

/** The document as the step shows it: hidden elements gone from the plan, the scene and the gear copies. */
export function stepDocument(document: SetupDocument, hidden: Iterable<string>): SetupDocument {
	const gone = hiddenClosure(document, hidden);
	const elements = Object.fromEntries(
		Object.entries(document.plan.elements ?? {}).filter(([id]) => !gone.has(id))
	) as Record<string, PlanElement>;
	const ambientEntries = Object.entries(document.plan.elements ?? {}).filter(([, el]) => el.kind === 'ambient');
	const dropAmbient = ambientEntries.length > 0 && ambientEntries.every(([id]) => gone.has(id));
	const { ambient, ...sceneRest } = document.scene;
	const scene = {
		...sceneRest,
		...(ambient && !dropAmbient ? { ambient } : {}),
		lights: document.scene.lights.filter((l) => !gone.has(l.id)),
		...(document.scene.flags ? { flags: document.scene.flags.filter((f) => !gone.has(f.id)) } : {})
	};
	const plan = document.plan.elements ? { ...document.plan, elements } : document.plan;
	const gearIds = new Set(referencedGearIds({ plan }));
	return { ...document, scene, plan, gear: document.gear.filter((g) => gearIds.has(g.id)) };
}

/** The ids of the elements a step shows. */
export function visibleElementIds(document: Pick<SetupDocument, 'scene' | 'plan'>, hidden: Iterable<string>): string[] {
	const gone = hiddenClosure(document, hidden);
	return stepElements(document)
		.map((e) => e.id)
		.filter((id) => !gone.has(id));
}

export type StepExposure = { ok: true; result: ExposureResult } | { ok: false; message: string };

/**
 * The exposure of what a step shows, by the same engine as the setup page (with the flash calibrations
 * the revision carries), on the document with the hidden elements removed.
 */
export function stepExposure(document: SetupDocument, hidden: Iterable<string>): StepExposure {
	const shown = stepDocument(document, hidden);
	try {
		const result = computeExposure(shown.scene);
		const bad = findNonFinite(result);
		if (bad) return { ok: false, message: `This step gives a result that is not a finite number (${bad.join('.')}).` };
		return { ok: true, result };
	} catch (e) {
		return { ok: false, message: e instanceof Error ? e.message : 'The exposure could not be computed.' };
	}
}
