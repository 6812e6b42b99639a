/**
 * Gear-shelf modifiers as the editor fits them to a light: a shelf item's measured loss and beam angle,
 * its name, the width of its front for the drawing, and its id, so the server copies the item into the
 * revision's gear when the plan is saved (`referencedGearIds` in `$lib/scene/document`).
 */
import type { GearSpec } from '$lib/scene/gear';
import { modifierSchema, type Modifier } from './schema';

/** A gear item as `GET /api/v1/gear` lists it (only what the editor reads). */
export interface ShelfItem {
	id: string;
	kind: string;
	name: string;
	spec: Record<string, unknown>;
	retiredAt?: string | null;
}

/** Width of a modifier's front for the drawing when the shelf gives none (round figures of our own). */
const FRONT_WIDTH_M: Record<string, number> = {
	softbox: 0.3,
	umbrella: 0.8,
	dome: 0.08,
	'diffusion panel': 0.6,
	snoot: 0.04,
	grid: 0.075,
	other: 0.1
};

/** Modifiers whose front glows evenly, and its shape: close up they are extended sources (the rest are points). */
const EMITTER_SHAPE: Record<string, Modifier['emitterShape']> = {
	softbox: 'rectangle',
	'diffusion panel': 'rectangle',
	umbrella: 'disc',
	dome: 'disc'
};

const MAX_NAME = 80;

/** The modifier a shelf item makes, or null when it is not a modifier or its figures do not pass. */
export function modifierFromShelf(item: ShelfItem): Modifier | null {
	if (item.kind !== 'modifier' || item.retiredAt) return null;
	const spec = item.spec;
	const shape = typeof spec.shape === 'string' ? spec.shape : 'other';
	const width = typeof spec.widthM === 'number' ? spec.widthM : (FRONT_WIDTH_M[shape] ?? FRONT_WIDTH_M.other);
	const name = item.name.length > MAX_NAME ? `${item.name.slice(0, MAX_NAME - 1)}…` : item.name;
	const emitterShape = EMITTER_SHAPE[shape];
	const height = emitterShape === 'rectangle' && typeof spec.heightM === 'number' && spec.heightM !== width ? { heightM: spec.heightM } : {};
	const parsed = modifierSchema.safeParse({ name, beamAngleDeg: spec.beamAngleDeg, lossStops: spec.lossStops, sizeM: width, ...(emitterShape ? { emitterShape } : {}), ...height, gearId: item.id });
	return parsed.success ? parsed.data : null;
}

/** The shelf's modifiers, in the shelf's order, leaving out what is retired or does not pass. */
export function shelfModifiers(items: readonly ShelfItem[]): Modifier[] {
	return items.map(modifierFromShelf).filter((m): m is Modifier => m !== null);
}

/**
 * Shelf items of one kind in use. Their specs were checked by the gear schemas when they were saved
 * and come from the server as stored (`$lib/scene/gear`), so they are not parsed again here: the
 * element's own schema still checks every figure a command takes from them.
 */
function shelfOf<K extends 'flash' | 'camera' | 'lens'>(items: readonly ShelfItem[], kind: K): ShelfGear<K>[] {
	return items.filter((i) => i.kind === kind && !i.retiredAt).map((i) => ({ id: i.id, name: i.name, spec: i.spec as GearSpec<K> }));
}

export interface ShelfGear<K extends 'flash' | 'camera' | 'lens'> {
	id: string;
	name: string;
	spec: GearSpec<K>;
}

/** The flashes, camera bodies and lenses of a shelf, for the inspector's "from the gear shelf" choices. */
export function shelfGear(items: readonly ShelfItem[]) {
	return { flashes: shelfOf(items, 'flash'), cameras: shelfOf(items, 'camera'), lenses: shelfOf(items, 'lens') };
}
export type ShelfGearLists = ReturnType<typeof shelfGear>;
