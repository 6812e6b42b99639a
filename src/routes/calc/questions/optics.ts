import type { OpticsCalcBody } from '$lib/light/schema';
import type { OpticsCalcResult } from '$lib/light/optics';
import { formatDistance, formatFNumber, formatSmallLength, type UnitSystem } from '$lib/light/format';
import { hints } from '../fields';
import { n, ratio, type Answer, type Question } from './types';

export const opticsQuestion: Question<OpticsCalcBody, OpticsCalcResult> = {
	id: 'optics',
	title: 'Working aperture, depth of field and diffraction',
	intro: 'What a magnification costs in light, how deep the sharp zone is, and whether diffraction is already softening the detail.',
	route: '/api/v1/calc/optics',
	fields: [
		{ name: 'aperture', label: 'Aperture (marked)', kind: 'fNumber', initial: () => 'f/16' },
		{ name: 'magnification', label: 'Magnification', kind: 'magnification', initial: () => '1:1', hint: hints.magnification },
		{ name: 'cocMm', label: 'Circle of confusion', kind: 'smallLength', initial: () => '0.03 mm', hint: () => '0.03 mm is usual for full frame; about 0.02 mm for APS-C' },
		{ name: 'pupilMagnification', label: 'Pupil magnification', kind: 'number', initial: () => '1', hint: () => '1 for a symmetric lens; see the lens data' },
		{ name: 'wavelengthNm', label: 'Wavelength (nm)', kind: 'number', initial: () => '550', hint: () => '550 nm is mid-green, the eye’s peak' },
		{ name: 'focalLengthMm', label: 'Focal length (mm)', kind: 'number', initial: () => '', optional: true, hint: () => 'Optional: for the extension and the working distance' }
	],
	toBody: (p) => ({
		aperture: p.aperture as number,
		magnification: p.magnification as number,
		cocMm: p.cocMm as number,
		pupilMagnification: p.pupilMagnification as number,
		wavelengthNm: p.wavelengthNm as number,
		...(p.focalLengthMm !== undefined ? { focalLengthMm: p.focalLengthMm as number } : {})
	}),
	describe(body, r, units: UnitSystem): Answer {
		const N = body.aperture;
		const m = body.magnification;
		const P = body.pupilMagnification ?? 1;
		const c = body.cocMm ?? 0.03;
		const lambda = body.wavelengthNm ?? 550;
		const working = [
			`Working aperture = marked aperture × (1 + m / P) = ${n(N)} × (1 + ${n(m)} / ${n(P)}) = ${formatFNumber(r.workingAperture)}.`,
			`Light lost = 2 × log₂(1 + m / P) = 2 × log₂(${n(1 + m / P)}) = ${n(r.lightLossStops, 2)} stops (the bellows factor ${n(r.bellowsFactor)}×).`,
			`Depth of field (close-up) = 2 × N × c × (1 + m / P) ÷ m² = 2 × ${n(N)} × ${n(c)} mm × ${n(1 + m / P)} ÷ ${n(m)}² = ${formatSmallLength(r.dofMm, units)}, about half in front of the plane of focus and half behind.`,
			`Airy disk = 2.44 × wavelength × working aperture = 2.44 × ${n(lambda / 1000)} µm × ${n(r.workingAperture)} = ${n(r.airyDiskUm)} µm across, against a circle of confusion of ${n(c * 1000)} µm.`,
			r.diffractionLimited
				? `The Airy disk is larger than the circle of confusion: diffraction already softens fine detail. It matches it at about ${formatFNumber(r.diffractionLimitAperture)} marked.`
				: `The Airy disk is smaller than the circle of confusion: diffraction is not yet the limit. It reaches it at about ${formatFNumber(r.diffractionLimitAperture)} marked.`
		];
		const facts = [
			{ label: 'Working aperture', value: formatFNumber(r.workingAperture) },
			{ label: 'Light lost', value: `${n(r.lightLossStops, 2)} stops` },
			{ label: 'Depth of field', value: formatSmallLength(r.dofMm, units) },
			{ label: 'Airy disk', value: `${n(r.airyDiskUm)} µm` }
		];
		if (r.extensionMm !== undefined && r.subjectDistanceMm !== undefined && body.focalLengthMm !== undefined) {
			working.push(
				`Extension beyond infinity focus = m × f = ${n(m)} × ${n(body.focalLengthMm)} mm = ${n(r.extensionMm)} mm; the subject is about f × (1 + 1/m) = ${formatDistance(r.subjectDistanceMm / 1000, units)} in front of the lens (thin-lens figure; real lenses differ).`
			);
			facts.push({ label: 'Extension', value: `${n(r.extensionMm)} mm` });
		}
		return {
			headline: `${formatFNumber(N)} at ${ratio(m)} works at ${formatFNumber(r.workingAperture)}: ${formatSmallLength(r.dofMm, units)} deep, ${r.diffractionLimited ? 'diffraction-limited' : 'not yet diffraction-limited'}`,
			facts,
			working,
			warnings: [],
			cautions: []
		};
	}
};
