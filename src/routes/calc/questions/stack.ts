import type { OpticsCalcBody } from '$lib/light/schema';
import type { OpticsCalcResult } from '$lib/light/optics';
import { formatFNumber, formatSmallLength, type UnitSystem } from '$lib/light/format';
import { hints, lensFields } from '../fields';
import { cocBody, cocFields, cocLine } from './optics';
import { lensBody, n, type Answer, type Question } from './types';

export const stackQuestion: Question<OpticsCalcBody, OpticsCalcResult> = {
	id: 'stack',
	title: 'Frames and rail step for a focus stack',
	intro: 'How many frames cover the subject from front to back, and how far to move the rail between them.',
	route: '/api/v1/calc/optics',
	fields: [
		{ name: 'subjectDepthMm', label: 'Subject depth', kind: 'smallLength', initial: () => '18 mm', hint: hints.smallLength },
		{ name: 'aperture', label: 'Aperture (marked)', kind: 'fNumber', initial: () => 'f/8' },
		{ name: 'magnification', label: 'Magnification', kind: 'magnification', initial: () => '1:1', hint: hints.magnification },
		{ name: 'overlap', label: 'Overlap between frames', kind: 'percent', initial: () => '20 %', hint: () => 'Share of each depth of field the next frame repeats' },
		...lensFields,
		...cocFields
	],
	toBody: (p) => ({
		subjectDepthMm: p.subjectDepthMm as number,
		aperture: p.aperture as number,
		...lensBody(p),
		overlap: p.overlap as number,
		...cocBody(p)
	}),
	describe(body, r, units: UnitSystem): Answer {
		const N = body.aperture;
		const m = body.magnification;
		const c = r.cocMm;
		const o = body.overlap ?? 0.2;
		const depth = body.subjectDepthMm as number;
		const stack = r.stack!;
		const rawSteps = (depth - r.dofMm) / stack.stepMm;
		const working = [
			cocLine(r, body),
			`Depth of field per frame = 2 × working aperture × c ÷ m² = 2 × ${n(r.workingAperture)} × ${n(c)} mm ÷ ${n(m)}² = ${formatSmallLength(r.dofMm, units)} (working aperture ${formatFNumber(r.workingAperture)} from ${formatFNumber(N)} marked).`,
			`Rail step = depth of field × (1 − overlap) = ${n(r.dofMm)} mm × (1 − ${n(o)}) = ${formatSmallLength(stack.stepMm, units)}.`,
			depth <= r.dofMm
				? `The subject (${formatSmallLength(depth, units)}) fits inside one depth of field: one frame is enough.`
				: `Frames = 1 + (subject depth − depth of field) ÷ step, rounded up = 1 + ⌈(${n(depth)} − ${n(r.dofMm)}) ÷ ${n(stack.stepMm)}⌉ = 1 + ⌈${n(rawSteps)}⌉ = ${stack.frames}.`
		];
		const b = r.balancedAperture;
		if (b) {
			working.push(
				`In a single frame the best compromise for ${formatSmallLength(depth, units)} of depth is about ${formatFNumber(b.markedAperture)} marked (${formatFNumber(b.workingAperture)} working), where the blur at the front and back equals the diffraction blur, about ${n(b.blurUm)} µm in all. That is ${b.blurUm > c * 1000 ? 'more than' : 'within'} the ${n(c * 1000)} µm circle of confusion${b.blurUm > c * 1000 ? ', which is why a stack is worth it' : ''}.`
			);
		}
		return {
			headline: `${stack.frames} ${stack.frames === 1 ? 'frame' : 'frames'}, ${formatSmallLength(stack.stepMm, units)} apart`,
			facts: [
				{ label: 'Frames', value: String(stack.frames) },
				{ label: 'Rail step', value: formatSmallLength(stack.stepMm, units) },
				{ label: 'Depth of field per frame', value: formatSmallLength(r.dofMm, units) },
				{ label: 'Working aperture', value: formatFNumber(r.workingAperture) }
			],
			working,
			warnings: r.diffractionLimited ? [`At ${formatFNumber(r.workingAperture)} working, ${r.diffractionNote} (Airy disk ${n(r.airyDiskUm)} µm); a wider aperture with more frames keeps more detail.`] : [],
			cautions: []
		};
	}
};
