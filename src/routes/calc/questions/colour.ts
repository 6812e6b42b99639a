import { GELS, GEL_NAMES, type ColourCalcResult, type GelName } from '$lib/light/colour';
import type { ColourCalcBody } from '$lib/light/schema';
import { type UnitSystem } from '$lib/light/format';
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
		const gel = r.nearestGel!;
		const working = [
			`Mired = 1 000 000 ÷ kelvin: ${n(from)} K is ${n(1e6 / from)} mired, ${n(to)} K is ${n(1e6 / to)} mired.`,
			`Shift = mired of the target − mired of the source = ${n(1e6 / to)} − ${n(1e6 / from)} = ${signed(shift)} mired (${shift > 0 ? 'warmer: an orange gel' : shift < 0 ? 'cooler: a blue gel' : 'no gel'}).`,
			gel.name === 'none'
				? 'The shift is smaller than the weakest common gel: leave it to the white balance.'
				: `Nearest common gel: ${gel.label}, nominally ${signed(gel.mired)} mired (from memory; the gel’s data sheet wins), leaving ${signed(gel.residualMired)} mired.`
		];
		return {
			headline: `${signed(shift)} mired: ${gel.name === 'none' ? 'no gel needed' : gel.label} is nearest`,
			facts: [
				{ label: 'Shift', value: `${signed(shift)} mired` },
				{ label: 'Nearest gel', value: gel.label }
			],
			working,
			warnings: [],
			cautions: []
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
				{ label: 'White balance to neutralise it', value: `about ${Math.round(out / 50) * 50} K` }
			],
			working: [
				`${n(k)} K is 1 000 000 ÷ ${n(k)} = ${n(1e6 / k)} mired.`,
				`${label} adds ${signed(g)} mired${body.gel ? ' (nominal, from memory; the gel’s data sheet wins)' : ''}: ${n(1e6 / k)} ${g >= 0 ? '+' : '−'} ${n(Math.abs(g))} = ${n(1e6 / k + g)} mired.`,
				`Back to kelvin: 1 000 000 ÷ ${n(1e6 / k + g)} = ${n(out, 4)} K.`
			],
			warnings: [],
			cautions: []
		};
	}
};
