/**
 * Drawing colours of the plan, from the theme (tailwind.config.ts: paper, graphite, tungsten, daylight,
 * caution), for the light scheme and the dim-studio (dark) scheme. Beams take their colour from the
 * light's kelvin; their outline is the same hue, darkened, so a near-white daylight beam still shows
 * on paper.
 */
import { DEFAULT_CONTINUOUS_KELVIN, DEFAULT_FLASH_KELVIN } from './model/defaults';
import { gelledKelvin } from '$lib/light/colour';
import type { EmitterElement } from './model/schema';
import { kelvinToRgb, rgbToHex } from './kelvin-colour';

export interface PlanPalette {
	paper: string;
	ink: string;
	inkSoft: string;
	gridMinor: string;
	gridMajor: string;
	selection: string;
	snapLine: string;
	dimension: string;
	caution: string;
	fieldOfView: string;
	subjectFill: string;
	cardFill: string;
	flagFill: string;
	marqueeFill: string;
}

export const PALETTE_LIGHT: PlanPalette = {
	paper: '#f7f5f0',
	ink: '#171b1f',
	inkSoft: '#5a6570',
	gridMinor: '#e3e6e8',
	gridMajor: '#c6ccd1',
	selection: '#3d7fb8',
	snapLine: '#b8322a',
	dimension: '#363e46',
	caution: '#b8322a',
	fieldOfView: '#3d7fb8',
	subjectFill: '#ece8df',
	cardFill: '#ffffff',
	flagFill: '#171b1f',
	marqueeFill: 'rgba(61, 127, 184, 0.08)'
};

export const PALETTE_DARK: PlanPalette = {
	paper: '#0e1114',
	ink: '#e3e6e8',
	inkSoft: '#a0a9b1',
	gridMinor: '#1d2227',
	gridMajor: '#2c333a',
	selection: '#8fbde3',
	snapLine: '#f3c9c5',
	dimension: '#c6ccd1',
	caution: '#f3c9c5',
	fieldOfView: '#8fbde3',
	subjectFill: '#252b31',
	cardFill: '#c6ccd1',
	flagFill: '#000000',
	marqueeFill: 'rgba(143, 189, 227, 0.1)'
};

/** The kelvin a light is drawn at: its own (after its gel), or its kind's usual value when unstated. */
export function drawnKelvin(el: EmitterElement): number {
	const k = el.kelvin ?? (el.kind === 'flash' ? DEFAULT_FLASH_KELVIN : DEFAULT_CONTINUOUS_KELVIN);
	return el.gelMired ? gelledKelvin(k, el.gelMired) : k;
}

export interface BeamColours {
	fill: string;
	stroke: string;
}

export function beamColours(kelvin: number, dark: boolean): BeamColours {
	const rgb = kelvinToRgb(kelvin);
	const shade = dark ? 1 : 0.62;
	const stroke = rgb.map((c) => Math.round(c * shade)) as [number, number, number];
	return { fill: `rgba(${rgb[0]}, ${rgb[1]}, ${rgb[2]}, ${dark ? 0.22 : 0.38})`, stroke: rgbToHex(stroke) };
}
