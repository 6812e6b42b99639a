/**
 * The calculator's fields: their kinds, labels, starting values and hints. Reading what was typed
 * into SI numbers is in parse.ts, which needs mathjs; this file does not, so the page can render and
 * hydrate before the parser is loaded.
 */
import type { UnitSystem } from '$lib/light/format';

export type FieldKind =
	| 'guideNumber'
	| 'distance'
	| 'smallLength'
	| 'number'
	| 'fNumber'
	| 'magnification'
	| 'shutter'
	| 'percent'
	| 'kelvin'
	| 'select'
	| 'checkbox';

export interface FieldDef {
	name: string;
	label: string;
	kind: FieldKind;
	/** The starting value, as typed text, in the unit system shown. */
	initial: (units: UnitSystem) => string;
	hint?: (units: UnitSystem) => string;
	optional?: boolean;
	options?: { value: string; label: string }[];
	/** Shown only when this holds (e.g. the lux field when the ambient comes from a lux reading). */
	shownWhen?: (values: Record<string, string>) => boolean;
}

export type FieldValues = Record<string, string>;
export type FieldErrors = Record<string, string>;

export const lengthUnit = (units: UnitSystem) => (units === 'imperial' ? 'in' : 'cm');
export const gnUnit = (units: UnitSystem) => (units === 'imperial' ? 'ft' : 'm');

export function initialValues(defs: FieldDef[], units: UnitSystem): FieldValues {
	return Object.fromEntries(defs.map((d) => [d.name, d.initial(units)]));
}

/** Standard hints that tell what a bare number means in each system. */
export const hints = {
	distance: (units: UnitSystem) => `A bare number is in ${lengthUnit(units)}; or type 30 cm, 1 ft, 12 in`,
	guideNumber: (units: UnitSystem) => `At ISO 100, full power, in ${gnUnit(units)}; type 105 ft or 32 m to say which`,
	magnification: () => 'As 1:1, 1:2, 2:1 or 0.5',
	smallLength: () => 'A bare number is in mm; or type 0.5 in'
};

/** How the magnification is made, as the calculator offers it (the engine's `magnificationBy`). */
export const magnificationByOptions = [
	{ value: 'extension', label: 'Extension, bellows or the macro lens’s own focusing' },
	{ value: 'close-up-lens', label: 'A close-up lens (dioptre) on a lens at infinity' },
	{ value: 'reversed-lens', label: 'A reversed lens' },
	{ value: 'camera-shows-working', label: 'The camera already shows the working aperture' }
];

/** The fields every question with a magnification asks: how it is made and the lens's pupil magnification. */
export const lensFields: FieldDef[] = [
	{ name: 'magnificationBy', label: 'Magnification made by', kind: 'select', initial: () => 'extension', options: magnificationByOptions },
	{ name: 'pupilMagnification', label: 'Pupil magnification', kind: 'number', initial: () => '1', hint: () => '1 for a symmetric lens; about 0.5–0.7 for many internal-focusing macro lenses; see the lens data' }
];
