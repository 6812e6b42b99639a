/**
 * What-if for one light: "what if I gave it a stop more power, or moved it twice as far?" The trial is
 * worked out here, on a copy of the model, with the same engine the server uses (`computeExposure`), so
 * nothing changes in the plan, the history or the saved setup until the user keeps it; keeping it is
 * then one ordinary command (`setElementProperties`), one undo step.
 *
 * Distance is changed along the line from the subject to the light, in 3-D (plan and height together),
 * so the light keeps its direction from the subject and only its true distance changes. By the
 * inverse-square law the light at the subject scales as 1/d², i.e. −2·log2(factor) stops.
 */
import { computeExposure, type ExposureResult } from '$lib/light/scene';
import { LOWEST_POWER, nearestPowerStep } from '$lib/light/flash';
import { length3 } from '$lib/light/geometry';
import type { ContinuousElement, FlashElement } from './model/schema';
import { toExposureScene } from './model/scene';
import { subjectOf, type EditorModel } from './model/types';

export type WhatIfLight = FlashElement | ContinuousElement;

/** The trial: power in thirds of a stop (−9 … +9 is ±3 stops), distance in sixths of a doubling. */
export interface WhatIfChange {
	/** Power change in thirds of a stop: +3 is one stop more. */
	powerThirds: number;
	/** Distance change in sixths of a doubling: factor = 2^(steps/6); +6 is twice as far, −6 half as far. */
	distanceSixths: number;
}

export const NO_CHANGE: WhatIfChange = { powerThirds: 0, distanceSixths: 0 };
export const POWER_THIRDS_RANGE = 9;
export const DISTANCE_SIXTHS_RANGE = 6;
/** The brightest a continuous light may be set to (the element schema's limit). */
const MAX_LUX_AT_1M = 10_000_000;

export function isWhatIfLight(el: { kind: string } | null | undefined): el is WhatIfLight {
	return !!el && (el.kind === 'flash' || el.kind === 'continuous');
}

export function distanceFactor(distanceSixths: number): number {
	return 2 ** (distanceSixths / 6);
}

/**
 * Change in stops at the subject when a point source's distance is multiplied by `factor`:
 * E ∝ 1/d² (inverse-square law), so ΔEV = log2(1/factor²) = −2·log2(factor).
 */
export function inverseSquareStops(factor: number): number {
	if (!(factor > 0) || !Number.isFinite(factor)) throw new RangeError('distance factor must be a positive number');
	return -2 * Math.log2(factor);
}

/** "+1.0 stop", "−2.0 stops", "0.0 stops": one decimal always, the sign as a true minus. */
export function formatStopChange(stops: number): string {
	const r = Math.round(stops * 10) / 10;
	const abs = Math.abs(r).toFixed(1);
	const sign = r > 0 ? '+' : r < 0 ? '−' : '';
	return `${sign}${abs} ${abs === '1.0' ? 'stop' : 'stops'}`;
}

/** The distance factor in words: "twice as far", "half as far", "1.41× as far". */
export function describeDistanceFactor(factor: number): string {
	const near = (a: number, b: number) => Math.abs(a - b) < 1e-9;
	if (near(factor, 1)) return 'same distance';
	if (near(factor, 2)) return 'twice as far';
	if (near(factor, 0.5)) return 'half as far';
	return `${Number(factor.toFixed(2))}× as far`;
}

export interface WhatIfPatch {
	/** Properties for `setElementProperties`: only those that change. */
	patch: Partial<Pick<FlashElement, 'power' | 'xM' | 'yM' | 'heightM'> & Pick<ContinuousElement, 'luxAt1m'>>;
	/** The power change actually possible (a flash stops at full power and at its lowest step). */
	powerStops: number;
	/** Why the power change is less than asked, if it is. */
	powerLimit: string | null;
	distanceFactor: number;
	/** The new true 3-D distance to the subject (null without a subject). */
	distanceM: number | null;
	oldDistanceM: number | null;
}

/** The properties that carry out `change` on `light`, measured from the model's subject. */
export function whatIfPatch(model: EditorModel, light: WhatIfLight, change: WhatIfChange): WhatIfPatch {
	const patch: WhatIfPatch['patch'] = {};
	let powerStops = change.powerThirds / 3;
	let powerLimit: string | null = null;
	if (change.powerThirds !== 0) {
		if (light.kind === 'flash') {
			const wanted = light.power * 2 ** powerStops;
			const power = Math.min(1, Math.max(LOWEST_POWER, wanted));
			if (power !== wanted) powerLimit = power === 1 ? 'the flash is at full power' : `the flash is at its lowest step (${nearestPowerStep(LOWEST_POWER).label})`;
			powerStops = Math.log2(power / light.power);
			if (power !== light.power) patch.power = power;
		} else {
			const wanted = light.luxAt1m * 2 ** powerStops;
			const lux = Math.min(MAX_LUX_AT_1M, wanted);
			if (lux !== wanted) powerLimit = 'the light is at its brightest';
			powerStops = Math.log2(lux / light.luxAt1m);
			if (lux !== light.luxAt1m) patch.luxAt1m = lux;
		}
	}
	const factor = distanceFactor(change.distanceSixths);
	const subject = subjectOf(model);
	let distanceM: number | null = null;
	let oldDistanceM: number | null = null;
	if (subject) {
		const v: [number, number, number] = [light.xM - subject.xM, light.yM - subject.yM, light.heightM - subject.heightM];
		oldDistanceM = length3(v);
		distanceM = oldDistanceM * factor;
		if (change.distanceSixths !== 0) {
			patch.xM = subject.xM + v[0] * factor;
			patch.yM = subject.yM + v[1] * factor;
			patch.heightM = subject.heightM + v[2] * factor;
		}
	}
	return { patch, powerStops, powerLimit, distanceFactor: factor, distanceM, oldDistanceM };
}

export interface WhatIfPreview extends WhatIfPatch {
	/** The light's own contribution at the subject, in stops (log2 X), before and with the trial. */
	contributionStops: { before: number | null; after: number | null };
	/** The whole exposure's offset from correct, in stops, before and with the trial. */
	totalStops: { before: number | null; after: number | null };
	/** Inverse-square plus power: what the change alone should do to this light. */
	expectedChangeStops: number;
	/** In words: "twice as far: −2.0 stops". */
	distanceWords: string;
	powerWords: string;
	/** A sentence for the change in total exposure. */
	summary: string;
	/** Safety cautions the trial would raise that the plan does not raise now (a flash nearer a living
	 * subject, a hot lamp nearer a card): shown before the user keeps it. */
	newCautions: string[];
}

const cautionKey = (c: { code: string; elementIds: readonly string[] }) => `${c.code}:${[...c.elementIds].sort().join(',')}`;

function contribution(result: ExposureResult, id: string): number | null {
	return result.lights.find((l) => l.id === id)?.stops ?? null;
}

/**
 * The trial's effect, worked out with the exposure engine on a copy of the model: the light's own
 * contribution and the total before and after. `before` may be passed in to save one computation.
 */
export function previewWhatIf(model: EditorModel, lightId: string, change: WhatIfChange, before?: ExposureResult): WhatIfPreview | null {
	const light = model.elements[lightId];
	if (!isWhatIfLight(light)) return null;
	const p = whatIfPatch(model, light, change);
	const trial: EditorModel = { ...model, elements: { ...model.elements, [lightId]: { ...light, ...p.patch } as WhatIfLight } };
	const was = before ?? computeExposure(toExposureScene(model));
	const now = Object.keys(p.patch).length ? computeExposure(toExposureScene(trial)) : was;
	const distanceStops = inverseSquareStops(p.distanceFactor);
	const expectedChangeStops = distanceStops + p.powerStops;
	const totalBefore = was.total.exposureOffsetStops;
	const totalAfter = now.total.exposureOffsetStops;
	const totalChange = totalBefore !== null && totalAfter !== null ? totalAfter - totalBefore : null;
	return {
		...p,
		contributionStops: { before: contribution(was, lightId), after: contribution(now, lightId) },
		totalStops: { before: totalBefore, after: totalAfter },
		expectedChangeStops,
		distanceWords: `${describeDistanceFactor(p.distanceFactor)}: ${formatStopChange(distanceStops)}`,
		newCautions: now.cautionDetails.filter((c) => !was.cautionDetails.some((b) => cautionKey(b) === cautionKey(c))).map((c) => c.message),
		powerWords: p.powerStops === 0 && !p.powerLimit ? 'same power: 0.0 stops' : `power ${formatStopChange(p.powerStops)}${p.powerLimit ? ` (${p.powerLimit})` : ''}`,
		summary:
			totalChange === null
				? 'No exposure to compare (nothing lights the subject).'
				: `Whole exposure ${formatStopChange(totalChange)}, now ${formatStopChange(totalAfter!)} from correct.`
	};
}
