/**
 * Gear-shelf modifiers as the editor fits them to a light: a shelf item's measured loss and beam angle,
 * its name, the width of its front for the drawing, and its id, so the server copies the item into the
 * revision's gear when the plan is saved (`referencedGearIds` in `$lib/scene/document`).
 */
import { LOWEST_POWER } from '$lib/light/flash';
import { gearSpecSchemas, type GearSpec } from '$lib/scene/gear';
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

const MAX_NAME = 80;

/** The modifier a shelf item makes, or null when it is not a modifier or its figures do not pass. */
export function modifierFromShelf(item: ShelfItem): Modifier | null {
	if (item.kind !== 'modifier' || item.retiredAt) return null;
	const spec = item.spec;
	const shape = typeof spec.shape === 'string' ? spec.shape : 'other';
	const width = typeof spec.widthM === 'number' ? spec.widthM : (FRONT_WIDTH_M[shape] ?? FRONT_WIDTH_M.other);
	const name = item.name.length > MAX_NAME ? `${item.name.slice(0, MAX_NAME - 1)}…` : item.name;
	const parsed = modifierSchema.safeParse({ name, beamAngleDeg: spec.beamAngleDeg, lossStops: spec.lossStops, sizeM: width, gearId: item.id });
	return parsed.success ? parsed.data : null;
}

/** The shelf's modifiers, in the shelf's order, leaving out what is retired or does not pass. */
export function shelfModifiers(items: readonly ShelfItem[]): Modifier[] {
	return items.map(modifierFromShelf).filter((m): m is Modifier => m !== null);
}

/** Shelf items of one kind whose spec passes its schema (read only: the shelf's schemas are in `$lib/scene/gear`). */
function shelfOf<K extends 'flash' | 'camera' | 'lens'>(items: readonly ShelfItem[], kind: K): ShelfGear<K>[] {
	const out: ShelfGear<K>[] = [];
	for (const item of items) {
		if (item.kind !== kind || item.retiredAt) continue;
		const spec = gearSpecSchemas[kind].safeParse(item.spec);
		if (spec.success) out.push({ id: item.id, name: item.name, spec: spec.data as GearSpec<K> });
	}
	return out;
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

/**
 * A flash element's figures from a shelf flash. The guide number is the rated one corrected by the
 * flash's measured calibration: exposure goes with GN², so c stops more light is GN × 2^(c/2) (the
 * guide number definition, see `$lib/light/flash.ts`). Its ladder ends at its lowest power.
 */
export function flashFiguresFromShelf(flash: ShelfGear<'flash'>) {
	const s = flash.spec;
	return {
		gearId: flash.id,
		guideNumber: Math.round(s.guideNumberM * 2 ** (s.calibrationOffsetStops / 2) * 100) / 100,
		lowestPower: Math.max(LOWEST_POWER, s.lowestPower),
		zoomMm: s.zoomMm ?? null,
		mainsPowered: s.mainsPowered,
		...(s.kelvin !== undefined ? { kelvin: s.kelvin } : {})
	};
}
