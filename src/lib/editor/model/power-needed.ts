/**
 * The power one flash needs for a correct exposure of the whole setup, and the nearest step its ladder
 * really has. Read from the engine's answer for the setup as it is, not a second copy of the physics:
 * the subject's exposure is linear in one flash's power (its direct light and every card it lights
 * scale with it; the rest does not), so the flash's share at the set power p, its own X plus that of
 * every card it lights, gives X_total(p) = others + perUnit · p with perUnit = share / p, and the
 * power for X_total = 1 is (1 − others) / perUnit. The editor computes that answer once per change
 * (`editor.exposure`) and hands it in; without it, it is computed here.
 *
 * The ladder: full power down in thirds of a stop to the flash's lowest power (common practice; see
 * `powerLadder` in `$lib/light/flash.ts` for the labels).
 */
import { LADDER_STEPS } from '$lib/light/flash';
import { liveExposure, type LiveExposure } from '../live-exposure';
import { formatPower } from './power-notation';
import { toExposureScene } from './scene';
import type { EditorModel } from './types';

export type PowerNeeded =
	| {
			ok: true;
			/** The exact fraction for a correct exposure (may be above 1 or below the lowest step). */
			required: number;
			/** The nearest ladder step in stops (full power when more is needed, the lowest when less is). */
			step: { fraction: number; label: string };
			/** The whole setup's exposure at that step, in stops (positive = over). */
			residualStops: number;
			/** The flash can give exactly the power needed (within full power and its lowest step). */
			withinRange: boolean;
	  }
	| { ok: false; message: string };

/** The light a card bounces (its id), if `id` is a card on the plan. */
function cardSource(model: EditorModel, id: string): string | undefined {
	const el = model.elements[id];
	return el?.kind === 'reflector' ? el.source : undefined;
}

/** The ladder of a flash whose lowest power is `lowestPower`: k = 0 … kMax, fraction 2^(−k/3). */
export function ladderSteps(lowestPower: number): number {
	return Math.min(LADDER_STEPS, Math.floor(-3 * Math.log2(lowestPower) + 1e-9));
}

/** `exposure`: the engine's answer for `model` as it is (the editor's `exposure`). */
export function powerNeeded(model: EditorModel, id: string, exposure: LiveExposure = liveExposure(toExposureScene(model))): PowerNeeded {
	const el = model.elements[id];
	if (!el || el.kind !== 'flash') return { ok: false, message: 'select a flash' };
	if (!exposure.ok) return { ok: false, message: 'the setup cannot be computed: see the exposure panel' };
	const p = el.power;
	const { lights, total } = exposure.result;
	const share = lights.reduce((sum, r) => (r.id === id || (r.kind === 'reflector' && cardSource(model, r.id) === id) ? sum + r.x : sum), 0);
	const perUnit = share / p;
	const others = total.x - share;
	if (!(perUnit > 1e-15)) return { ok: false, message: `“${el.label}” gives the subject no light (blocked by a flag or turned away), so no power setting helps` };
	if (others >= 1) {
		return { ok: false, message: `the rest of the setup is already ${Math.log2(others).toFixed(1)} stops over without “${el.label}”: lower the other lights or stop down` };
	}
	const required = (1 - others) / perUnit;
	const kMax = ladderSteps(el.lowestPower);
	const k = Math.min(kMax, Math.max(0, Math.round(-3 * Math.log2(required) - 1e-9)));
	const fraction = 2 ** (-k / 3);
	return {
		ok: true,
		required,
		step: { fraction, label: formatPower(fraction) },
		residualStops: Math.log2(others + perUnit * fraction),
		withinRange: required <= 1 + 1e-12 && required >= 2 ** (-kMax / 3) * (1 - 1e-12)
	};
}
