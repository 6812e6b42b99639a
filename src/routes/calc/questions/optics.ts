import type { OpticsCalcBody } from '$lib/light/schema';
import type { OpticsCalcResult } from '$lib/light/optics';
import { formatDistance, formatFNumber, formatSmallLength, type UnitSystem } from '$lib/light/format';
import { hints, lensFields, type FieldDef } from '../fields';
import { lensBody, n, ratio, workingApertureLine, type Answer, type Question } from './types';

/** Where the circle of confusion comes from: the sensor's diagonal / 1500, its pixels, or a figure typed in. */
export const cocFields: FieldDef[] = [
	{
		name: 'cocBasis',
		label: 'Circle of confusion from',
		kind: 'select',
		initial: () => 'sensor',
		options: [
			{ value: 'sensor', label: 'The sensor: its diagonal ÷ 1500' },
			{ value: 'pixel', label: 'The pixels: two pixel pitches (for stacks viewed at 100 %)' },
			{ value: 'given', label: 'A figure I give' }
		]
	},
	{ name: 'sensorWidthMm', label: 'Sensor width', kind: 'smallLength', initial: () => '36 mm', shownWhen: (v) => v.cocBasis === 'sensor' },
	{ name: 'sensorHeightMm', label: 'Sensor height', kind: 'smallLength', initial: () => '24 mm', shownWhen: (v) => v.cocBasis === 'sensor' },
	{ name: 'pixelPitchUm', label: 'Pixel pitch (µm)', kind: 'number', initial: () => '4.4', shownWhen: (v) => v.cocBasis === 'pixel' },
	{ name: 'cocMm', label: 'Circle of confusion', kind: 'smallLength', initial: () => '0.03 mm', shownWhen: (v) => v.cocBasis === 'given', hint: () => '0.03 mm is usual for full frame; about 0.02 mm for APS-C' }
];

/** The body's circle-of-confusion part for what the form chose. */
export function cocBody(p: Record<string, unknown>) {
	if (p.cocBasis === 'pixel') return { cocBasis: 'pixel' as const, pixelPitchUm: p.pixelPitchUm as number };
	if (p.cocBasis === 'given') return { cocMm: p.cocMm as number };
	return { sensorWidthMm: p.sensorWidthMm as number, sensorHeightMm: p.sensorHeightMm as number };
}

export function cocLine(r: OpticsCalcResult, body: { sensorWidthMm?: number; sensorHeightMm?: number; pixelPitchUm?: number }): string {
	if (r.cocFrom === 'sensor-diagonal') {
		return `Circle of confusion = sensor diagonal ÷ 1500 = √(${n(body.sensorWidthMm!)}² + ${n(body.sensorHeightMm!)}²) mm ÷ 1500 = ${n(r.cocMm * 1000)} µm (the usual convention for a whole picture seen at ordinary size).`;
	}
	if (r.cocFrom === 'pixel-pitch') return `Circle of confusion = 2 × pixel pitch = 2 × ${n(body.pixelPitchUm!)} µm = ${n(r.cocMm * 1000)} µm (sharp to the pixel, for stacks viewed at 100 %).`;
	return `Circle of confusion: ${n(r.cocMm * 1000)} µm.`;
}

export const opticsQuestion: Question<OpticsCalcBody, OpticsCalcResult> = {
	id: 'optics',
	title: 'Working aperture, depth of field and diffraction',
	intro: 'What a magnification costs in light, how deep the sharp zone is, and whether diffraction is already softening the detail.',
	route: '/api/v1/calc/optics',
	fields: [
		{ name: 'aperture', label: 'Aperture (marked)', kind: 'fNumber', initial: () => 'f/16' },
		{ name: 'magnification', label: 'Magnification', kind: 'magnification', initial: () => '1:1', hint: hints.magnification },
		...lensFields,
		...cocFields,
		{ name: 'wavelengthNm', label: 'Wavelength (nm)', kind: 'number', initial: () => '550', hint: () => '550 nm is mid-green, the eye’s peak' },
		{ name: 'focalLengthMm', label: 'Focal length (mm)', kind: 'number', initial: () => '', optional: true, hint: () => 'Optional: for the extension, the working distance and the thin-lens depth of field' }
	],
	toBody: (p) => ({
		aperture: p.aperture as number,
		...lensBody(p),
		...cocBody(p),
		wavelengthNm: p.wavelengthNm as number,
		...(p.focalLengthMm !== undefined ? { focalLengthMm: p.focalLengthMm as number } : {})
	}),
	describe(body, r, units: UnitSystem): Answer {
		const N = body.aperture;
		const m = body.magnification;
		const P = body.pupilMagnification ?? 1;
		const c = r.cocMm;
		const lambda = body.wavelengthNm ?? 550;
		const dof = r.depthOfField;
		const factor = r.workingAperture / N;
		const lost = Number(r.lightLossStops.toFixed(2));
		const working = [
			workingApertureLine(N, m, P, body.magnificationBy, r.workingAperture),
			`Light lost = 2 × log₂(working ÷ marked) = 2 × log₂(${n(factor)}) = ${lost} ${lost === 1 ? 'stop' : 'stops'} (an exposure factor of ${n(r.bellowsFactor)}×).`,
			cocLine(r, body),
			dof.formula === 'thin-lens'
				? `Depth of field (thin lens, focal length ${n(body.focalLengthMm!)} mm): subject at f × (1 + 1/m) = ${formatDistance(dof.subjectDistanceMm! / 1000, units)}, hyperfocal distance f² ÷ (N × c) + f; sharp from ${formatDistance(dof.nearMm! / 1000, units)} to ${dof.farMm === null ? 'infinity' : formatDistance(dof.farMm! / 1000, units)}: ${formatSmallLength(dof.inFrontMm, units)} in front of the plane of focus and ${dof.behindMm === null ? 'everything' : formatSmallLength(dof.behindMm, units)} behind. The close-up formula (${formatSmallLength(r.dofMm, units)}) holds only near 1:1.`
				: `Depth of field (close-up) = 2 × working aperture × c ÷ m² = 2 × ${n(r.workingAperture)} × ${n(c)} mm ÷ ${n(m)}² = ${formatSmallLength(r.dofMm, units)}, about half in front of the plane of focus and half behind (this holds near 1:1; give the focal length for the thin-lens figure far from it).`,
			`Airy disk = 2.44 × wavelength × working aperture = 2.44 × ${n(lambda / 1000)} µm × ${n(r.workingAperture)} = ${n(r.airyDiskUm)} µm across, against a circle of confusion of ${n(c * 1000)} µm.`,
			r.diffractionLimited
				? `The Airy disk is larger than the circle of confusion: ${r.diffractionNote}, so fine detail is already softer here.`
				: `The Airy disk is smaller than the circle of confusion: ${r.diffractionNote}; you are not there yet.`
		];
		const dofShown = dof.totalMm === null ? 'to infinity' : formatSmallLength(dof.totalMm, units);
		const facts = [
			{ label: 'Working aperture', value: formatFNumber(r.workingAperture) },
			{ label: 'Light lost', value: `${lost} ${lost === 1 ? 'stop' : 'stops'}` },
			{ label: `Depth of field (${dof.formula === 'thin-lens' ? 'thin lens' : 'close-up'})`, value: dofShown },
			{ label: 'Airy disk', value: `${n(r.airyDiskUm)} µm` },
			{ label: 'Diffraction softens from', value: `${formatFNumber(r.diffractionLimitAperture)} marked` }
		];
		if (r.extensionMm !== undefined && r.subjectDistanceMm !== undefined && body.focalLengthMm !== undefined) {
			working.push(
				`Extension beyond infinity focus = m × f = ${n(m)} × ${n(body.focalLengthMm)} mm = ${n(r.extensionMm)} mm; the subject is about f × (1 + 1/m) = ${formatDistance(r.subjectDistanceMm / 1000, units)} in front of the lens (thin-lens figure; real lenses differ).`
			);
			facts.push({ label: 'Extension', value: `${n(r.extensionMm)} mm` });
		}
		return {
			headline: `${formatFNumber(N)} at ${ratio(m)} works at ${formatFNumber(r.workingAperture)}: ${dofShown} deep, ${r.diffractionLimited ? 'softened by diffraction' : 'not yet softened by diffraction'}`,
			facts,
			working,
			warnings: [],
			cautions: []
		};
	}
};
