/**
 * What the plan draws of the light itself: each light's beam (a wedge of its beam angle, or a soft
 * disc for a light with no beam) in the colour of its kelvin, and each card's bounce path (source →
 * card → subject) in its source's colour. Plain data, so the stage only draws.
 */
import { DEFAULT_FLASH_KELVIN } from './defaults';
import type { EditorElement, EmitterElement } from './schema';
import type { EditorModel } from './types';
import { elementsInOrder, subjectOf } from './types';
import { drawnKelvin } from '../palette';

export interface Beam {
	id: string;
	xM: number;
	yM: number;
	rotationDeg: number;
	/** null: no beam, drawn as a disc. */
	beamAngleDeg: number | null;
	reachM: number;
	kelvin: number;
}

export interface BouncePath {
	id: string;
	sourceId: string | null;
	/** Plan x, y pairs: source (when a light), card, subject. */
	points: number[];
	kelvin: number;
}

function reach(el: EditorElement, subject: EditorElement | undefined): number {
	if (!subject) return 0.3;
	return Math.max(0.15, 1.15 * Math.hypot(el.xM - subject.xM, el.yM - subject.yM));
}

export function beamOf(el: EmitterElement, subject: EditorElement | undefined): Beam {
	return {
		id: el.id,
		xM: el.xM,
		yM: el.yM,
		rotationDeg: el.rotationDeg,
		beamAngleDeg: el.modifier?.beamAngleDeg ?? null,
		reachM: reach(el, subject),
		kelvin: drawnKelvin(el)
	};
}

export function beams(model: EditorModel): Beam[] {
	const subject = subjectOf(model);
	return elementsInOrder(model)
		.filter((e): e is EmitterElement => e.kind === 'flash' || e.kind === 'continuous')
		.map((e) => beamOf(e, subject));
}

export function bouncePaths(model: EditorModel): BouncePath[] {
	const subject = subjectOf(model);
	if (!subject) return [];
	const out: BouncePath[] = [];
	for (const card of elementsInOrder(model)) {
		if (card.kind !== 'reflector') continue;
		const source = card.source === 'ambient' ? undefined : model.elements[card.source];
		const lit = source && (source.kind === 'flash' || source.kind === 'continuous') ? source : undefined;
		out.push({
			id: card.id,
			sourceId: lit?.id ?? null,
			points: lit ? [lit.xM, lit.yM, card.xM, card.yM, subject.xM, subject.yM] : [card.xM, card.yM, subject.xM, subject.yM],
			kelvin: lit ? drawnKelvin(lit) : DEFAULT_FLASH_KELVIN
		});
	}
	return out;
}

/** Keeps the previous object for every entry that has not changed (so its drawing is left alone). */
export function keepUnchanged<T extends { id: string }>(previous: ReadonlyMap<string, T>, next: readonly T[]): { list: T[]; byId: Map<string, T> } {
	const byId = new Map<string, T>();
	const list = next.map((item) => {
		const old = previous.get(item.id);
		const kept = old && JSON.stringify(old) === JSON.stringify(item) ? old : item;
		byId.set(item.id, kept);
		return kept;
	});
	return { list, byId };
}
