import type { FlashCalcBody } from '$lib/light/schema';
import type { FlashCalcResult } from '$lib/light/flash';
import { formatDistance, formatFNumber, formatStopsOff, type UnitSystem } from '$lib/light/format';
import { METRES_PER_FOOT } from '$lib/light/constants';
import { hints, lensFields } from '../fields';
import { lensBody, n, workingApertureLine, type Answer, type Question } from './types';

/** The lowest power steps small flashes commonly stop at (the gear shelf holds each flash's own). */
const lowestPowerOptions = [1, 2, 3, 4, 5, 6, 7, 8].map((k) => ({ value: String(k), label: `1/${2 ** k}` }));

const stopsWord = (stops: number) => {
	const r = Number(stops.toFixed(2));
	return `${r} ${r === 1 ? 'stop' : 'stops'}`;
};
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
		...lensFields,
		{ name: 'calibrationOffsetStops', label: 'Calibration (stops, + = brighter than its GN)', kind: 'number', initial: () => '0', hint: () => 'Measured against a meter or a test shot; the gear shelf keeps it' },
		{ name: 'lowestPower', label: 'Lowest power step', kind: 'select', initial: () => '8', options: lowestPowerOptions },
		{ name: 'widestAperture', label: 'Lens: widest aperture', kind: 'fNumber', initial: () => 'f/2.8' },
		{ name: 'narrowestAperture', label: 'Lens: narrowest aperture', kind: 'fNumber', initial: () => 'f/32' },
		{ name: 'subjectDepthMm', label: 'Subject depth', kind: 'smallLength', initial: () => '', optional: true, hint: () => 'Optional: front to back along the flash’s line, for the falloff across it' },
		{ name: 'living', label: 'The subject is a person or an animal', kind: 'checkbox', initial: () => '' }
	],
	toBody: (p) => ({
		guideNumber: p.guideNumber as number,
		distance: p.distance as number,
		aperture: p.aperture as number,
		...lensBody(p),
		iso: p.iso as number,
		lossStops: p.lossStops as number,
		calibrationOffsetStops: p.calibrationOffsetStops as number,
		lowestPower: 2 ** -Number(p.lowestPower),
		widestAperture: p.widestAperture as number,
		narrowestAperture: p.narrowestAperture as number,
		...(p.subjectDepthMm !== undefined ? { subjectDepthMm: p.subjectDepthMm as number } : {}),
		living: p.living as boolean
	}),
	describe(body, r, units): Answer {
		const m = body.magnification ?? 0;
		const P = body.pupilMagnification ?? 1;
		const iso = body.iso ?? 100;
		const loss = body.lossStops ?? 0;
		const calibration = body.calibrationOffsetStops ?? 0;
		const N = body.aperture as number;
		const wa = r.workingAperture as number;
		const fullGn = r.effectiveGuideNumber; // power 1 (the form never sets power)
		const neededGn = body.distance * wa;
		const required = r.requiredPower as number;
		const step = r.nearestPowerStep!;
		const unit = gnUnit(units);
		const lowest = r.lowestPowerStep.label;
		const working = [
			workingApertureLine(N, m, P, body.magnificationBy, wa),
			calibration === 0
				? `Guide number at ISO ${n(iso)} with ${n(loss)} stops of loss = GN × √(ISO / 100) × 2^(−loss / 2) = ${n(gnIn(body.guideNumber, units))} × √(${n(iso)} / 100) × 2^(−${n(loss)} / 2) = ${n(gnIn(fullGn, units))} (${unit}) at full power.`
				: `Guide number at ISO ${n(iso)} with ${n(loss)} stops of loss and the flash’s calibration of ${n(calibration)} stops = GN × √(ISO / 100) × 2^((calibration − loss) / 2) = ${n(gnIn(body.guideNumber, units))} × √(${n(iso)} / 100) × 2^((${n(calibration)} − ${n(loss)}) / 2) = ${n(gnIn(fullGn, units))} (${unit}) at full power.`,
			`Guide number needed = distance × working aperture = ${distIn(body.distance, units)} × ${n(wa)} = ${n(gnIn(neededGn, units))} (${unit}).`,
			`Power needed = (needed ÷ full-power guide number)² = (${n(gnIn(neededGn, units))} ÷ ${n(gnIn(fullGn, units))})² = ${n(required)} of full power.`
		];
		let headline: string;
		if (r.withinRange) {
			headline = `Set the flash to ${step.label} power`;
			const left = formatStopsOff(step.residualStops, 2);
			working.push(
				`Nearest step on a flash with third stops from 1/1 to ${lowest}: ${step.label} (${n(step.fraction)} of full power), ${left === 'on the mark' ? 'which is on the mark' : `which leaves the exposure ${left}`}.`
			);
		} else if (required > 1) {
			const reach = fullGn / wa;
			headline = `Full power is not enough: ${formatStopsOff(step.residualStops, 1, 'short')}`;
			working.push(
				`More than full power is needed: at 1/1 the exposure is ${formatStopsOff(step.residualStops)}. Bring the flash to ${formatDistance(reach, units)}, raise the ISO or open the aperture.`
			);
		} else {
			headline = `Even ${lowest} is too strong: ${formatStopsOff(step.residualStops)}`;
			working.push(
				`Less than this flash’s lowest step is needed: at ${lowest} the exposure is ${formatStopsOff(step.residualStops)}. Move the flash back, add diffusion or an ND gel, or stop down.`
			);
		}
		if (r.depthFalloffStops !== undefined && body.subjectDepthMm !== undefined) {
			const half = body.subjectDepthMm / 2000;
			working.push(
				`Across the subject’s ${n(body.subjectDepthMm)} mm of depth the light falls off by the inverse-square law: front at ${formatDistance(body.distance - half, units)}, back at ${formatDistance(body.distance + half, units)}, 2 × log₂(${n(body.distance + half)} ÷ ${n(body.distance - half)}) = ${stopsWord(r.depthFalloffStops)} more on the front than on the back. Move the flash back to even it out.`
			);
		}
		const warnings: string[] = [];
		if (r.markedApertureOutsideLens) {
			const limit = r.markedApertureOutsideLens === 'wider' ? body.widestAperture : body.narrowestAperture;
			warnings.push(
				`At full power the flash wants ${formatFNumber(r.markedApertureForCorrect)} marked, ${r.markedApertureOutsideLens} than this lens goes (${formatFNumber(limit as number)}): ${r.markedApertureOutsideLens === 'narrower' ? 'turn the power down instead' : 'bring the flash closer or raise the ISO'}.`
			);
		}
		return {
			headline,
			facts: [
				{ label: 'Exact power', value: `${n(required)} of full` },
				{ label: 'Working aperture', value: formatFNumber(wa) },
				{ label: 'Light lost to magnification', value: stopsWord(2 * Math.log2(wa / N)) },
				{ label: 'Marked aperture at full power', value: `${formatFNumber(r.markedApertureForCorrect)}${r.markedApertureOutsideLens ? ' (beyond the lens)' : ''}` }
			],
			working,
			warnings,
			cautions: r.cautions
		};
	}
};
