/** What changed on one light between two revisions: power, output, loss, colour, aim, a card's size. */
import { formatDistance, formatStops, roundSig, type UnitSystem } from '$lib/light/format';
import { nearestPowerStep } from '$lib/light/flash';
import type { SceneLight } from '$lib/light/schema';
import { dist, vec3, type Vec3 } from './elements';
import type { PropertyEntry } from './index';

/** A flash power as the ladder labels it (`1/4`, `1/8 +0.3`), or a plain fraction between steps. */
export function powerLabel(power: number): string {
	const step = nearestPowerStep(power);
	if (Math.abs(step.residualStops) < 0.02) return step.label;
	return `${roundSig(power, 2)} of full`;
}

export const stopsBetween = (before: number, after: number) => Math.log2(after / before);

/** `was → now` for an optional value, `not set` (or `none`) where it is missing. */
export function beforeAfter<T>(before: T | undefined, after: T | undefined, fmt: (v: T) => string, missing = 'not set'): string {
	const side = (v: T | undefined) => (v === undefined || v === null ? missing : fmt(v));
	return `${side(before)} → ${side(after)}`;
}

const percent = (v: number) => `${roundSig(v * 100, 3)} %`;

function angleDeg(a: Vec3, b: Vec3): number {
	const la = Math.hypot(...a);
	const lb = Math.hypot(...b);
	if (la === 0 || lb === 0) return 0;
	const c = Math.min(1, Math.max(-1, (a[0] * b[0] + a[1] * b[1] + a[2] * b[2]) / (la * lb)));
	return (Math.acos(c) * 180) / Math.PI;
}

function areaText(areaM2: number, units: UnitSystem): string {
	if (units === 'imperial') return `${roundSig(areaM2 / 0.0254 ** 2, 3)} sq in`;
	return areaM2 < 1 ? `${roundSig(areaM2 * 1e4, 3)} cm²` : `${roundSig(areaM2, 3)} m²`;
}

/** A light's properties, compared one by one. */
export function lightPropertyChanges(a: SceneLight, b: SceneLight, name: string, units: UnitSystem): PropertyEntry[] {
	const out: PropertyEntry[] = [];
	const push = (property: string, before: unknown, after: unknown, text: string) =>
		out.push({ id: b.id, kind: b.kind, label: name, property, before, after, text: `${name}: ${text}` });
	if (a.kind === 'flash' && b.kind === 'flash') {
		if (a.power !== b.power) push('power', a.power, b.power, `power ${powerLabel(a.power)} → ${powerLabel(b.power)} (${formatStops(stopsBetween(a.power, b.power))})`);
		if (a.guideNumber !== b.guideNumber)
			push('guideNumber', a.guideNumber, b.guideNumber, `guide number ${roundSig(a.guideNumber)} → ${roundSig(b.guideNumber)} m (${formatStops(2 * stopsBetween(a.guideNumber, b.guideNumber))})`);
		if ((a.highSpeedSync ?? false) !== (b.highSpeedSync ?? false)) push('highSpeedSync', a.highSpeedSync ?? false, b.highSpeedSync ?? false, b.highSpeedSync ? 'high-speed sync turned on' : 'high-speed sync turned off');
	}
	if (a.kind === 'continuous' && b.kind === 'continuous' && a.luxAt1m !== b.luxAt1m) {
		push('luxAt1m', a.luxAt1m, b.luxAt1m, `output ${roundSig(a.luxAt1m)} → ${roundSig(b.luxAt1m)} lux at 1 m (${formatStops(stopsBetween(a.luxAt1m, b.luxAt1m))})`);
	}
	if (a.kind !== 'reflector' && b.kind !== 'reflector') {
		const la = a.lossStops ?? 0;
		const lb = b.lossStops ?? 0;
		if (la !== lb) push('lossStops', la, lb, `modifier and gel loss ${roundSig(la, 2)} → ${roundSig(lb, 2)} stops`);
		if (a.kelvin !== b.kelvin) push('kelvin', a.kelvin ?? null, b.kelvin ?? null, `colour temperature ${beforeAfter(a.kelvin || undefined, b.kelvin || undefined, (k) => `${k} K`)}`);
		if ((a.gelMired ?? 0) !== (b.gelMired ?? 0)) push('gelMired', a.gelMired ?? 0, b.gelMired ?? 0, `gel ${beforeAfter(a.gelMired || undefined, b.gelMired || undefined, (m) => `${m} mired`, 'none')}`);
		if (a.beamAngleDeg !== b.beamAngleDeg) push('beamAngleDeg', a.beamAngleDeg ?? null, b.beamAngleDeg ?? null, `beam angle ${beforeAfter(a.beamAngleDeg || undefined, b.beamAngleDeg || undefined, (d) => `${d}°`)}`);
		const aimA = vec3(a.aim);
		const aimB = vec3(b.aim);
		if ((aimA === null) !== (aimB === null) || (aimA && aimB && dist(aimA, aimB) >= 0.001)) {
			push('aim', a.aim ?? null, b.aim ?? null, aimB ? (aimA ? `re-aimed (the aim point moved ${formatDistance(dist(aimA, aimB), units)})` : 'now aimed at a point off the subject') : 'now aimed at the subject');
		}
	}
	if (a.kind === 'reflector' && b.kind === 'reflector') {
		if (a.areaM2 !== b.areaM2) push('areaM2', a.areaM2, b.areaM2, `area ${areaText(a.areaM2, units)} → ${areaText(b.areaM2, units)}`);
		if (a.reflectance !== b.reflectance) push('reflectance', a.reflectance, b.reflectance, `reflectance ${percent(a.reflectance)} → ${percent(b.reflectance)}`);
		if (a.surface !== b.surface) push('surface', a.surface, b.surface, `surface ${a.surface} → ${b.surface}`);
		if (a.source !== b.source) push('source', a.source, b.source, `now bounces “${b.source}” instead of “${a.source}”`);
		const na = vec3(a.normal);
		const nb = vec3(b.normal);
		if ((na === null) !== (nb === null) || (na && nb && angleDeg(na, nb) >= 0.5)) {
			push('normal', a.normal ?? null, b.normal ?? null, na && nb ? `turned ${roundSig(angleDeg(na, nb), 2)}°` : nb ? 'now faces a set direction' : 'now faces both its source and the subject');
		}
	}
	return out;
}
