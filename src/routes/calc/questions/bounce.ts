import type { ExposureSceneInput } from '$lib/light/schema';
import type { ExposureResult } from '$lib/light/scene';
import { formatDistance, formatFNumber, formatStops, formatStopsOff, type UnitSystem } from '$lib/light/format';
import { hints, lensFields } from '../fields';
import { lengthNumber as L, lengthUnitLabel, lensBody, n, type Answer, type Question } from './types';

/** Card surfaces with their usual reflectance (common practice; a measured figure from the gear shelf wins). */
export const CARD_SURFACES = {
	white: { reflectance: 0.85, surface: 'diffuse', label: 'White card or foam board (about 85 %)' },
	paper: { reflectance: 0.75, surface: 'diffuse', label: 'Matte white paper (about 75 %)' },
	grey: { reflectance: 0.18, surface: 'diffuse', label: 'Neutral grey card (18 %)' },
	silver: { reflectance: 0.85, surface: 'specular', label: 'Silver, mirror-like (about 85 %)' }
} as const;
type CardKind = keyof typeof CARD_SURFACES;

/**
 * The card sits opposite the flash, facing the subject: flash, subject and card on one line, as in the
 * quartz-on-velvet setup with a white card opposite the softbox.
 */
export const bounceQuestion: Question<ExposureSceneInput, ExposureResult> = {
	id: 'bounce',
	title: 'What a bounce card adds',
	intro: 'A card opposite the flash, facing the subject: how much does it fill the shadow side, and what lighting ratio does that give?',
	route: '/api/v1/exposure',
	fields: [
		{ name: 'guideNumber', label: 'Guide number', kind: 'guideNumber', initial: (u) => (u === 'imperial' ? '105 ft' : '32 m'), hint: hints.guideNumber },
		{ name: 'power', label: 'Flash power', kind: 'number', initial: () => '1/8', hint: () => 'A fraction of full power: 1/8, 0.125' },
		{ name: 'flashDistance', label: 'Flash to subject', kind: 'distance', initial: (u) => (u === 'imperial' ? '12 in' : '30 cm'), hint: hints.distance },
		{ name: 'cardDistance', label: 'Card to subject', kind: 'distance', initial: (u) => (u === 'imperial' ? '6 in' : '15 cm'), hint: hints.distance },
		{ name: 'cardWidth', label: 'Card width', kind: 'distance', initial: (u) => (u === 'imperial' ? '8 in' : '20 cm') },
		{ name: 'cardHeight', label: 'Card height', kind: 'distance', initial: (u) => (u === 'imperial' ? '12 in' : '30 cm') },
		{
			name: 'card',
			label: 'Card surface',
			kind: 'select',
			initial: () => 'white',
			options: Object.entries(CARD_SURFACES).map(([value, c]) => ({ value, label: c.label }))
		},
		{ name: 'aperture', label: 'Aperture (marked)', kind: 'fNumber', initial: () => 'f/16' },
		{ name: 'magnification', label: 'Magnification', kind: 'magnification', initial: () => '1:2', hint: hints.magnification },
		...lensFields,
		{ name: 'iso', label: 'ISO', kind: 'number', initial: () => '100' }
	],
	toBody(p) {
		const card = CARD_SURFACES[p.card as CardKind];
		const width = p.cardWidth as number;
		const height = p.cardHeight as number;
		return {
			camera: { iso: p.iso as number, aperture: p.aperture as number, shutter: 1 / 125, ...lensBody(p) },
			subject: { position: [0, 0, 0] },
			lights: [
				{ id: 'flash', kind: 'flash', position: [-(p.flashDistance as number), 0, 0], guideNumber: p.guideNumber as number, power: p.power as number },
				{
					id: 'card',
					kind: 'reflector',
					position: [p.cardDistance as number, 0, 0],
					areaM2: width * height,
					reflectance: card.reflectance,
					surface: card.surface,
					source: 'flash',
					normal: [-1, 0, 0]
				}
			]
		};
	},
	fieldFor(path) {
		if (path[0] === 'lights' && path[1] === '0') return path[2] === 'position' ? 'flashDistance' : path[2];
		if (path[0] === 'lights' && path[1] === '1') return path[2] === 'areaM2' ? 'cardWidth' : path[2] === 'position' ? 'cardDistance' : 'card';
		if (path[0] === 'camera') return path[1];
		return undefined;
	},
	describe(body, r, units: UnitSystem): Answer {
		const flash = body.lights[0] as { position: number[] };
		const card = body.lights[1] as { position: number[]; areaM2: number; reflectance: number; surface: string };
		const d = -flash.position[0];
		const d2 = card.position[0];
		const d1 = d + d2;
		const key = r.lights.find((l) => l.id === 'flash')!;
		const fill = r.lights.find((l) => l.id === 'card')!;
		const share = (d / d1) ** 2;
		const pct = Math.round(card.reflectance * 100);
		const rad = Math.sqrt(card.areaM2 / Math.PI);
		const disc = (rad * rad) / (rad * rad + d2 * d2);
		const fillRatio = fill.x / key.x;
		const working = [
			`The flash is ${formatDistance(d, units)} from the subject and ${formatDistance(d, units)} + ${formatDistance(d2, units)} = ${formatDistance(d1, units)} from the card, so by the inverse-square law the card gets (${n(L(d, units))} ÷ ${n(L(d1, units))})² = ${n(share)} of the light the subject gets.`
		];
		if (card.surface === 'diffuse') {
			working.push(
				`The card is treated as a matte (Lambertian) disc of the same area, ${n(L(Math.sqrt(card.areaM2), units) ** 2)} ${lengthUnitLabel(units)}²: radius r = √(A / π) = ${formatDistance(rad, units)}.`,
				`A matte disc ${formatDistance(d2, units)} away sends back r² / (r² + d²) = ${n(L(rad, units))}² / (${n(L(rad, units))}² + ${n(L(d2, units))}²) = ${n(disc)} of the light falling on it, times its reflectance.`,
				`Fill = reflectance × light at the card × disc share = ${n(card.reflectance)} × ${n(share)} × ${n(disc)} = ${n(fillRatio)} of the key, that is ${formatStops(Math.log2(fillRatio))} from the key.`
			);
		} else {
			working.push(
				`A mirror-like card returns the flash as if from ${formatDistance(d1, units)} + ${formatDistance(d2, units)} = ${formatDistance(d1 + d2, units)} away: ${n(card.reflectance)} × (${n(L(d, units))} ÷ ${n(L(d1 + d2, units))})² = ${n(fillRatio)} of the key (${formatStops(Math.log2(fillRatio))}). In practice a silver card returns a hard spot only where its reflection lines up.`
			);
		}
		const faces = r.faces!;
		const shadowStops = faces.shadow.exposureOffsetStops;
		working.push(
			`The card faces the subject from the side opposite the flash, so it lights the shadow face, not the face the flash lights: the lit face stays at the key’s ${formatStops(key.stops)}, and the aperture is set for it.`,
			`Shadow face: ${shadowStops === null ? 'no light' : formatStops(shadowStops)}. Lighting ratio, lit face : shadow face = key : fill = 1 : ${n(fillRatio)} = ${n(1 / fillRatio)}:1 (with a card opposite the key, nothing of the fill reaches the lit face; a fill near the camera would give key + fill : fill).`,
			`Exposure at ${formatFNumber(body.camera.aperture)} (working ${formatFNumber(r.workingAperture)}): lit face ${formatStopsOff(faces.lit.exposureOffsetStops!)}, shadow face ${shadowStops === null ? 'unlit' : formatStopsOff(shadowStops)}.`
		);
		return {
			headline: `The card fills the shadow side at ${formatStops(Math.log2(fillRatio))}: a ${n(1 / fillRatio)}:1 lighting ratio`,
			facts: [
				{ label: 'Lighting ratio (key : fill)', value: `${n(1 / fillRatio)}:1` },
				{ label: 'Fill', value: `${Math.round(fillRatio * 1000) / 10} % of the key` },
				{ label: 'Lit face', value: formatStopsOff(faces.lit.exposureOffsetStops!) },
				{ label: 'Shadow face', value: shadowStops === null ? 'unlit' : formatStopsOff(shadowStops) },
				{ label: 'Card reflectance', value: `${pct} %` }
			],
			working,
			warnings: r.warnings,
			cautions: r.cautions
		};
	}
};
