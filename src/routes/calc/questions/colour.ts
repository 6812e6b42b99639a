import { GELS, GEL_NAMES, type ColourCalcResult, type GelName } from '$lib/light/colour';
import type { ColourCalcBody } from '$lib/light/schema';
import { type UnitSystem } from '$lib/light/format';
import { gelOnLightCaution } from '$lib/light/cautions';
import { n, type Answer, type Question } from './types';

const signed = (v: number) => `${v > 0 ? '+' : v < 0 ? '−' : ''}${n(Math.abs(v))}`;

export const shiftQuestion: Question<ColourCalcBody, ColourCalcResult> = {
	id: 'shift',
	title: 'Mired shift between two lights',
	intro: 'How far apart two light sources are in colour, and which gel brings one to the other.',
	route: '/api/v1/calc/colour',
	fields: [
		{ name: 'fromKelvin', label: 'From (K)', kind: 'kelvin', initial: () => '5500 K', hint: () => 'The light you will gel, e.g. a flash' },
		{ name: 'toKelvin', label: 'To (K)', kind: 'kelvin', initial: () => '3200 K', hint: () => 'The light to match, e.g. a halogen lamp' }
	],
	toBody: (p) => ({ fromKelvin: p.fromKelvin as number, toKelvin: p.toKelvin as number }),
	describe(body, r, _units: UnitSystem): Answer {
		const from = body.fromKelvin as number;
		const to = body.toKelvin as number;
		const shift = r.miredShift as number;
		const gel = r.suggestedGel!;
		const single = r.nearestGel!;
		const working = [
			`Mired = 1 000 000 ÷ kelvin: ${n(from)} K is ${n(1e6 / from)} mired, ${n(to)} K is ${n(1e6 / to)} mired.`,
			`Shift = mired of the target − mired of the source = ${n(1e6 / to)} − ${n(1e6 / from)} = ${signed(shift)} mired (${shift > 0 ? 'warmer: an orange gel' : shift < 0 ? 'cooler: a blue gel' : 'no gel'}).`
		];
		if (!gel.gels.length) {
			working.push('The shift is smaller than the weakest common gel: leave it to the white balance.');
		} else {
			working.push(
				`Gel: ${gel.label}, nominally ${signed(gel.mired)} mired (from memory; the gel’s data sheet wins), leaving ${signed(gel.residualMired)} mired to the white balance.`,
				gel.gels.length > 1
					? `Stacked gels add their mired and their losses. One gel alone: ${single.label} (${signed(single.mired)} mired) leaves ${signed(single.residualMired)} mired; the trade’s everyday daylight-to-tungsten choice is a full CTO, with the rest left to the white balance.`
					: `One gel is enough: it lands within ${n(Math.abs(gel.residualMired))} mired.`,
				`Light lost through the gel: about ${n(gel.lossStops, 2)} ${gel.lossStops === 1 ? 'stop' : 'stops'} (from memory; the data sheet gives its transmission). Raise the flash power or open up to match.`
			);
		}
		return {
			headline: `${signed(shift)} mired: ${gel.gels.length ? gel.label : 'no gel needed'}`,
			facts: [
				{ label: 'Shift', value: `${signed(shift)} mired` },
				{ label: 'Gel', value: gel.label },
				{ label: 'Light lost', value: `about ${n(gel.lossStops, 2)} ${gel.lossStops === 1 ? 'stop' : 'stops'}` }
			],
			working,
			warnings: [],
			cautions: gel.gels.length ? [gelOnLightCaution()] : []
		};
	}
};

const gelOptions = [
	...GEL_NAMES.map((g) => ({ value: g, label: `${GELS[g].label} (${signed(GELS[g].mired)} mired)` })),
	{ value: 'custom', label: 'Another gel, in mired' }
];

export const gelQuestion: Question<ColourCalcBody, ColourCalcResult> = {
	id: 'gel',
	title: 'A gel on a light',
	intro: 'What colour a light becomes through a gel, and the white balance that makes it neutral.',
	route: '/api/v1/calc/colour',
	fields: [
		{ name: 'kelvin', label: 'Light (K)', kind: 'kelvin', initial: () => '5500 K' },
		{ name: 'gel', label: 'Gel', kind: 'select', initial: () => 'full-cto', options: gelOptions },
		{ name: 'gelMired', label: 'Gel (mired)', kind: 'number', initial: () => '+60', shownWhen: (v) => v.gel === 'custom' }
	],
	toBody: (p) =>
		p.gel === 'custom'
			? { kelvin: p.kelvin as number, gelMired: p.gelMired as number }
			: { kelvin: p.kelvin as number, gel: p.gel as GelName },
	describe(body, r, _units: UnitSystem): Answer {
		const k = body.kelvin as number;
		const g = r.gelMired as number;
		const out = r.resultKelvin as number;
		const label = body.gel ? GELS[body.gel].label : 'The gel';
		return {
			headline: `${n(k)} K through ${body.gel ? GELS[body.gel].label : `${signed(g)} mired`} becomes about ${Math.round(out / 10) * 10} K`,
			facts: [
				{ label: 'Result', value: `${Math.round(out)} K` },
				{ label: 'White balance to neutralise it', value: `about ${Math.round(out / 50) * 50} K` },
				...(r.gelLossStops !== undefined ? [{ label: 'Light lost through the gel', value: `about ${n(r.gelLossStops)} ${r.gelLossStops === 1 ? 'stop' : 'stops'}` }] : [])
			],
			working: [
				`${n(k)} K is 1 000 000 ÷ ${n(k)} = ${n(1e6 / k)} mired.`,
				`${label} adds ${signed(g)} mired${body.gel ? ' (nominal, from memory; the gel’s data sheet wins)' : ''}: ${n(1e6 / k)} ${g >= 0 ? '+' : '−'} ${n(Math.abs(g))} = ${n(1e6 / k + g)} mired.`,
				`Back to kelvin: 1 000 000 ÷ ${n(1e6 / k + g)} = ${n(out, 4)} K.`,
				...(r.gelLossStops !== undefined ? [`${label} costs about ${n(r.gelLossStops)} ${r.gelLossStops === 1 ? 'stop' : 'stops'} of light (from memory; the data sheet gives its transmission).`] : [])
			],
			warnings: [],
			cautions: r.cautions
		};
	}
};
