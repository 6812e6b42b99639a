import type { FlashCalcBody } from '$lib/light/schema';
import type { FlashCalcResult } from '$lib/light/flash';
import { formatDistance, formatFNumber, formatStops, type UnitSystem } from '$lib/light/format';
import { METRES_PER_FOOT } from '$lib/light/constants';
import { hints } from '../fields';
import { n, ratio, type Answer, type Question } from './types';

const gnIn = (gnM: number, units: UnitSystem) => (units === 'imperial' ? gnM / METRES_PER_FOOT : gnM);
const gnUnit = (units: UnitSystem) => (units === 'imperial' ? 'ft' : 'm');
const distIn = (m: number, units: UnitSystem) => (units === 'imperial' ? `${n(m / METRES_PER_FOOT)} ft` : `${n(m)} m`);

export const flashQuestion: Question<FlashCalcBody, FlashCalcResult> = {
	id: 'flash',
	title: 'Flash power for an aperture',
	intro: 'What power gives a correct exposure at the aperture you want, from this distance, at this magnification?',
	route: '/api/v1/calc/flash',
	fields: [
		{ name: 'guideNumber', label: 'Guide number', kind: 'guideNumber', initial: (u) => (u === 'imperial' ? '105 ft' : '32 m'), hint: hints.guideNumber },
		{ name: 'distance', label: 'Flash to subject', kind: 'distance', initial: (u) => (u === 'imperial' ? '12 in' : '30 cm'), hint: hints.distance },
		{ name: 'aperture', label: 'Aperture (marked)', kind: 'fNumber', initial: () => 'f/16' },
		{ name: 'magnification', label: 'Magnification', kind: 'magnification', initial: () => '1:2', hint: hints.magnification },
		{ name: 'iso', label: 'ISO', kind: 'number', initial: () => '100' },
		{ name: 'lossStops', label: 'Losses (stops)', kind: 'number', initial: () => '0', hint: () => 'Diffuser, softbox, gel and filters together' },
		{ name: 'pupilMagnification', label: 'Pupil magnification', kind: 'number', initial: () => '1', hint: () => '1 for a symmetric lens; see the lens data' },
		{ name: 'living', label: 'The subject is a person or an animal', kind: 'checkbox', initial: () => '' }
	],
	toBody: (p) => ({
		guideNumber: p.guideNumber as number,
		distance: p.distance as number,
		aperture: p.aperture as number,
		magnification: p.magnification as number,
		iso: p.iso as number,
		lossStops: p.lossStops as number,
		pupilMagnification: p.pupilMagnification as number,
		living: p.living as boolean
	}),
	describe(body, r, units): Answer {
		const m = body.magnification ?? 0;
		const P = body.pupilMagnification ?? 1;
		const iso = body.iso ?? 100;
		const loss = body.lossStops ?? 0;
		const N = body.aperture as number;
		const wa = r.workingAperture as number;
		const fullGn = r.effectiveGuideNumber; // power 1 (the form never sets power)
		const neededGn = body.distance * wa;
		const required = r.requiredPower as number;
		const step = r.nearestPowerStep!;
		const unit = gnUnit(units);
		const working = [
			`Working aperture = marked aperture × (1 + m / P) = ${n(N)} × (1 + ${n(m)} / ${n(P)}) = ${formatFNumber(wa)}. At ${ratio(m)} the lens passes light as if it were set to ${formatFNumber(wa)}.`,
			`Guide number at ISO ${n(iso)} with ${n(loss)} stops of loss = GN × √(ISO / 100) × 2^(−loss / 2) = ${n(gnIn(body.guideNumber, units))} × √(${n(iso)} / 100) × 2^(−${n(loss)} / 2) = ${n(gnIn(fullGn, units))} (${unit}) at full power.`,
			`Guide number needed = distance × working aperture = ${distIn(body.distance, units)} × ${n(wa)} = ${n(gnIn(neededGn, units))} (${unit}).`,
			`Power needed = (needed ÷ full-power guide number)² = (${n(gnIn(neededGn, units))} ÷ ${n(gnIn(fullGn, units))})² = ${n(required)} of full power.`
		];
		let headline: string;
		if (r.withinRange) {
			headline = `Set the flash to ${step.label} power`;
			working.push(
				`Nearest step on a flash with third stops from 1/1 to 1/256: ${step.label} (${n(step.fraction)} of full power), which leaves the exposure ${formatStops(step.residualStops, 2)} ${step.residualStops >= 0 ? 'over' : 'under'}.`
			);
		} else if (required > 1) {
			const reach = fullGn / wa;
			headline = `Full power is not enough: ${formatStops(step.residualStops)} short`;
			working.push(
				`More than full power is needed: at 1/1 the exposure is ${formatStops(step.residualStops)}. Bring the flash to ${formatDistance(reach, units)}, raise the ISO or open the aperture.`
			);
		} else {
			headline = `Even 1/256 is too strong: ${formatStops(step.residualStops)} over`;
			working.push(
				`Less than the lowest step is needed: at 1/256 the exposure is ${formatStops(step.residualStops)}. Move the flash back, add diffusion or an ND gel, or stop down.`
			);
		}
		return {
			headline,
			facts: [
				{ label: 'Exact power', value: `${n(required)} of full` },
				{ label: 'Working aperture', value: formatFNumber(wa) },
				{ label: 'Light lost to magnification', value: `${n(2 * Math.log2(1 + m / P), 2)} stops` },
				{ label: 'Marked aperture at full power', value: formatFNumber(r.markedApertureForCorrect) }
			],
			working,
			warnings: [],
			cautions: r.cautions
		};
	}
};
