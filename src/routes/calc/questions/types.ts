import { formatFNumber, type UnitSystem } from '$lib/light/format';
import type { MagnificationMethod } from '$lib/light/optics';
import type { FieldDef } from '../fields';

/** What the page shows for an answer: the headline, a few facts, and the working in plain words. */
export interface Answer {
	headline: string;
	facts: { label: string; value: string }[];
	working: string[];
	warnings: string[];
	cautions: string[];
}

export type Parsed = Record<string, number | string | boolean | undefined>;

export interface Question<Body = Record<string, unknown>, Result = unknown> {
	id: string;
	title: string;
	intro: string;
	/** The API route the answer comes from (the same with and without JavaScript). */
	route: string;
	fields: FieldDef[];
	toBody(parsed: Parsed, units: UnitSystem): Body;
	/** The form field an API issue path belongs to, when it is not simply the first key. */
	fieldFor?(path: string[]): string | undefined;
	describe(body: Body, result: Result, units: UnitSystem): Answer;
}

/** The lens part of a body: magnification, how it is made, pupil magnification (shared by every question). */
export function lensBody(p: Parsed) {
	return {
		magnification: p.magnification as number,
		magnificationBy: p.magnificationBy as MagnificationMethod,
		pupilMagnification: p.pupilMagnification as number
	};
}

/**
 * The working aperture's line of the working, in the words of how the magnification is made: the same
 * rule (optics.ts, `apertureFactor`) that the API applies.
 */
export function workingApertureLine(N: number, m: number, P: number, by: MagnificationMethod | undefined, wa: number): string {
	switch (by) {
		case 'close-up-lens':
			return `A close-up lens on a lens focused at infinity costs no light: at ${ratio(m)} the working aperture is the marked one, ${formatFNumber(wa)}.`;
		case 'reversed-lens':
			return `Working aperture of a reversed lens = marked aperture × (1 / P + m) = ${n(N)} × (1 / ${n(P)} + ${n(m)}) = ${formatFNumber(wa)}: turned round, its pupils swap.`;
		case 'camera-shows-working':
			return `The camera already shows the working aperture: ${formatFNumber(wa)}, with no correction on top.`;
		default:
			return `Working aperture = marked aperture × (1 + m / P) = ${n(N)} × (1 + ${n(m)} / ${n(P)}) = ${formatFNumber(wa)}. At ${ratio(m)} the lens passes light as if it were set to ${formatFNumber(wa)}.`;
	}
}

/** Numbers for the working: three significant figures, no trailing zeros. */
export function n(value: number, digits = 3): string {
	if (!Number.isFinite(value)) return '—';
	if (value === 0) return '0';
	const abs = Math.abs(value);
	if (abs >= 1e6 || abs < 1e-3) return value.toExponential(digits - 1);
	return String(Number(value.toPrecision(digits)));
}

/** A magnification as a ratio when it is a simple one (1:1, 1:2, 2:1), else a decimal. */
export function ratio(m: number): string {
	if (m >= 1 && Math.abs(m - Math.round(m)) < 1e-9) return `${Math.round(m)}:1`;
	const inv = 1 / m;
	if (m < 1 && Math.abs(inv - Math.round(inv)) < 1e-9) return `1:${Math.round(inv)}`;
	return `${n(m)}×`;
}

/** A table distance as a bare number in the system's small unit (cm or in), for ratios in the working. */
export function lengthNumber(metres: number, units: UnitSystem): number {
	return units === 'imperial' ? metres / 0.0254 : metres * 100;
}

export function lengthUnitLabel(units: UnitSystem): string {
	return units === 'imperial' ? 'in' : 'cm';
}
