import { SKY_PRESETS, SKY_PRESET_NAMES, type AmbientCalcResult } from '$lib/light/ambient';
import type { AmbientCalcBody } from '$lib/light/schema';
import { formatFNumber, formatShutter, formatStopsOff, type UnitSystem } from '$lib/light/format';
import { hints, lensFields } from '../fields';
import { lensBody, n, workingApertureLine, type Answer, type Question } from './types';

const readingOptions = [
	...SKY_PRESET_NAMES.map((p) => ({ value: p, label: `${SKY_PRESETS[p].label} (EV ${SKY_PRESETS[p].ev100})` })),
	{ value: 'ev', label: 'A meter reading in EV at ISO 100' },
	{ value: 'lux', label: 'An incident reading in lux' }
];

const stopWord = (stops: number) => `${n(stops)} ${Math.abs(stops) === 1 ? 'stop' : 'stops'}`;
/** A marked speed's error in words: more or less ambient than the exact figure. */
const marked = (stops: number) => {
	const off = formatStopsOff(stops, 2, 'less ambient', 'more ambient');
	return off === 'on the mark' ? 'on the exact figure' : `${off} than the exact figure`;
};

export const balanceQuestion: Question<AmbientCalcBody, AmbientCalcResult> = {
	id: 'balance',
	title: 'Ambient and flash balance',
	intro: 'Which shutter speed puts the daylight or room light a chosen number of stops under the flash.',
	route: '/api/v1/calc/ambient',
	fields: [
		{ name: 'reading', label: 'Ambient light', kind: 'select', initial: () => 'overcast', options: readingOptions },
		{ name: 'ev100', label: 'EV at ISO 100', kind: 'number', initial: () => '12', shownWhen: (v) => v.reading === 'ev' },
		{ name: 'illuminanceLux', label: 'Illuminance (lux)', kind: 'number', initial: () => '2000', shownWhen: (v) => v.reading === 'lux' },
		{ name: 'aperture', label: 'Aperture (marked)', kind: 'fNumber', initial: () => 'f/16' },
		{ name: 'magnification', label: 'Magnification', kind: 'magnification', initial: () => '1:2', hint: hints.magnification },
		...lensFields,
		{ name: 'iso', label: 'ISO', kind: 'number', initial: () => '200' },
		{ name: 'balanceUnderStops', label: 'Ambient under the flash (stops)', kind: 'number', initial: () => '1', hint: () => '1 to 2 keeps a natural background; 0 matches them' },
		{ name: 'syncSpeed', label: 'Flash sync speed', kind: 'shutter', initial: () => '1/200' }
	],
	toBody(p) {
		const reading = p.reading as string;
		const source =
			reading === 'ev'
				? { ev100: p.ev100 as number }
				: reading === 'lux'
					? { illuminanceLux: p.illuminanceLux as number }
					: { skyPreset: reading as AmbientCalcBody['skyPreset'] };
		return {
			...source,
			aperture: p.aperture as number,
			...lensBody(p),
			iso: p.iso as number,
			balanceUnderStops: p.balanceUnderStops as number,
			syncSpeed: p.syncSpeed as number
		};
	},
	describe(body, r, _units: UnitSystem): Answer {
		const N = body.aperture;
		const m = body.magnification ?? 0;
		const P = body.pupilMagnification ?? 1;
		const iso = body.iso ?? 100;
		const under = body.balanceUnderStops ?? 0;
		const working: string[] = [];
		if (body.skyPreset) {
			working.push(`${SKY_PRESETS[body.skyPreset].label}: about EV ${r.ev100} at ISO 100 by the “sunny 16” rule (common practice; meter it when it matters).`);
		} else if (body.illuminanceLux !== undefined) {
			working.push(`EV at ISO 100 = log₂(lux × 100 ÷ C) = log₂(${n(body.illuminanceLux)} × 100 ÷ 250) = ${n(r.ev100)} (C = 250, the flat-receptor meter constant).`);
		} else {
			working.push(`The meter reads EV ${n(r.ev100)} at ISO 100.`);
		}
		working.push(
			workingApertureLine(N, m, P, body.magnificationBy, r.workingAperture),
			`Shutter for a correct ambient exposure = N_w² ÷ (2^EV × ISO / 100) = ${n(r.workingAperture)}² ÷ (2^${n(r.ev100)} × ${n(iso)} / 100) = ${formatShutter(r.shutterForCorrect)}.`,
			`For the ambient ${stopWord(under)} under the flash, shorten it by 2^${n(under)}: ${formatShutter(r.shutterForCorrect)} ÷ ${n(2 ** under)} = ${formatShutter(r.shutterForBalance!)}. The flash exposure does not change with the shutter, only the ambient does.`,
			`Nearest marked speed: ${r.markedShutterForBalance!.label}, ${marked(r.markedShutterForBalance!.residualStops)}.`,
			`Flash and ambient add: with the flash at correct and the ambient ${stopWord(under)} under it, the two together are ${formatStopsOff(r.balanceSumOffsetStops!, 2)} (log₂(1 + 2^−${n(under)})). For a correct sum, set the flash compensation to ${n(r.flashCompensationStops!, 2)} EV and the shutter to ${formatShutter(r.shutterForCompensatedBalance!)}, which keeps the ambient ${stopWord(under)} under the flash.`
		);
		const warnings: string[] = [];
		if (r.balanceFasterThanSync) {
			warnings.push(
				`${formatShutter(r.shutterForBalance!)} is faster than the sync speed ${formatShutter(body.syncSpeed ?? 1 / 200)}: use high-speed sync (it costs flash power), stop down, lower the ISO or add an ND filter.`
			);
		}
		return {
			headline: `Set ${r.markedShutterForBalance!.label}: the ambient sits ${stopWord(under)} under the flash`,
			facts: [
				{ label: 'Ambient EV (ISO 100)', value: n(r.ev100) },
				{ label: 'Shutter for correct ambient', value: formatShutter(r.shutterForCorrect) },
				{ label: 'Shutter for the balance', value: `${formatShutter(r.shutterForBalance!)} (marked ${r.markedShutterForBalance!.label})` },
				{ label: 'Working aperture', value: formatFNumber(r.workingAperture) },
				{ label: 'Flash compensation for a correct sum', value: `${n(r.flashCompensationStops!, 2)} EV` }
			],
			working,
			warnings,
			cautions: []
		};
	}
};
