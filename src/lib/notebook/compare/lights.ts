/** What changed on one light between two revisions: power, output, loss, colour, a card's surface. */
import { formatStops, roundSig, type UnitSystem } from '$lib/light/format';
import { nearestPowerStep } from '$lib/light/flash';
import type { SceneLight } from '$lib/light/schema';
import type { PlanElement } from '$lib/scene/document';
import { shownChange, shownStops } from './shown';
import type { PropertyEntry } from './index';

/** A flash power as the ladder labels it (`1/4`, `1/8 +0.3`), or a plain fraction between steps. */
export function powerLabel(power: number): string {
	const step = nearestPowerStep(power);
	if (Math.abs(step.residualStops) < 0.02) return step.label;
	return `${roundSig(power, 2)} of full`;
}

export const stopsBetween = (before: number, after: number) => Math.log2(after / before);

const percent = (v: number) => `${roundSig(v * 100, 3)} %`;

/** ` (+1 stop)` after a change, or nothing when the change is under a tenth of a stop. */
export function stopsNote(stops: number): string {
	return shownStops(stops) === 0 ? '' : ` (${formatStops(stops)})`;
}

/**
 * A light's properties, compared one by one, as the reader sees them (see shown.ts). Where a light
 * points is not here: a turn, a beam newly aimed or a card's facing set is reported once, with the
 * element's move (placement.ts); a card's size and area with the drawn sizes.
 */
export function lightPropertyChanges(
	a: SceneLight,
	b: SceneLight,
	name: string,
	units: UnitSystem,
	plan: { before?: PlanElement; after?: PlanElement } = {}
): PropertyEntry[] {
	const out: PropertyEntry[] = [];
	const push = (property: string, before: unknown, after: unknown, text: string | null) => {
		if (text !== null) out.push({ id: b.id, kind: b.kind, label: name, property, before, after, text: `${name}: ${text}` });
	};
	const change = <T>(label: string, before: T, after: T, fmt: (v: T) => string, note = '') => {
		const shown = shownChange(before, after, fmt);
		return shown === null ? null : `${label} ${shown}${note}`;
	};
	if (a.kind === 'flash' && b.kind === 'flash') {
		push('power', a.power, b.power, change('power', a.power, b.power, powerLabel, stopsNote(stopsBetween(a.power, b.power))));
		push('guideNumber', a.guideNumber, b.guideNumber, change('guide number', a.guideNumber, b.guideNumber, (g) => `${roundSig(g)} m`, stopsNote(2 * stopsBetween(a.guideNumber, b.guideNumber))));
		if ((a.highSpeedSync ?? false) !== (b.highSpeedSync ?? false)) push('highSpeedSync', a.highSpeedSync ?? false, b.highSpeedSync ?? false, b.highSpeedSync ? 'high-speed sync turned on' : 'high-speed sync turned off');
	}
	if (a.kind === 'continuous' && b.kind === 'continuous') {
		push('luxAt1m', a.luxAt1m, b.luxAt1m, change('output', a.luxAt1m, b.luxAt1m, (v) => `${roundSig(v)} lux at 1 m`, stopsNote(stopsBetween(a.luxAt1m, b.luxAt1m))));
	}
	if (a.kind !== 'reflector' && b.kind !== 'reflector') {
		const ownA = ownLossStops(plan.before);
		const ownB = ownLossStops(plan.after);
		const own = ownA !== null && ownB !== null;
		const la = own ? ownA : (a.lossStops ?? 0);
		const lb = own ? ownB : (b.lossStops ?? 0);
		push('lossStops', la, lb, change('modifier and gel loss', la, lb, (v) => `${roundSig(v, 2)} stops`));
		push('kelvin', a.kelvin ?? null, b.kelvin ?? null, change('colour temperature', a.kelvin || undefined, b.kelvin || undefined, (k) => (k === undefined ? 'not set' : `${roundSig(k, 4)} K`)));
		push('gelMired', a.gelMired ?? 0, b.gelMired ?? 0, change('gel', a.gelMired || undefined, b.gelMired || undefined, (m) => (m === undefined ? 'none' : `${roundSig(m, 3)} mired`)));
		push('beamAngleDeg', a.beamAngleDeg ?? null, b.beamAngleDeg ?? null, change('beam angle', a.beamAngleDeg || undefined, b.beamAngleDeg || undefined, (d) => (d === undefined ? 'not set' : `${Math.round(d)}°`)));
	}
	if (a.kind === 'reflector' && b.kind === 'reflector') {
		push('reflectance', a.reflectance, b.reflectance, change('reflectance', a.reflectance, b.reflectance, percent));
		if (a.surface !== b.surface) push('surface', a.surface, b.surface, `surface ${a.surface} → ${b.surface}`);
		if (a.source !== b.source) push('source', a.source, b.source, `now bounces “${b.source}” instead of “${a.source}”`);
	}
	return out;
}

/**
 * The loss a light carries itself (its modifier and other filters), when the plan entry says: the
 * editor's scene adds every diffuser the light's path crosses, which changes when the subject or a
 * diffuser moves, not the light (the exposure lines say what that does). Null for a document that
 * does not say (then the scene's loss is the light's own).
 */
function ownLossStops(entry: PlanElement | undefined): number | null {
	const e = entry as { modifier?: { lossStops?: unknown } | null; otherLossStops?: unknown } | undefined;
	if (!e || typeof e.otherLossStops !== 'number' || e.modifier === undefined) return null;
	const modifierLoss = e.modifier === null ? 0 : e.modifier.lossStops;
	return typeof modifierLoss === 'number' ? modifierLoss + e.otherLossStops : null;
}

/** A reflector's area as the reader sees it (the face that bounces light). */
export function areaText(areaM2: number, units: UnitSystem): string {
	if (units === 'imperial') return `${roundSig(areaM2 / 0.0254 ** 2, 3)} sq in`;
	return areaM2 < 1 ? `${roundSig(areaM2 * 1e4, 3)} cm²` : `${roundSig(areaM2, 3)} m²`;
}
