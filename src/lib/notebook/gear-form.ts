/**
 * The gear shelf's forms: for each kind of gear, the fields a person fills in (as they would write
 * them: `1/128`, `1/250`, `30 cm`, `85 %`, `f/2.8`, `1:1`) and how each becomes the number the gear
 * spec holds (units in the spec's field names: metres, seconds, stops, degrees, millimetres).
 * Errors are keyed `spec.<field>` like the API's issue paths, so both land beside the same input.
 */
import { formatShutter, roundSig } from '$lib/light/format';
import { parseFNumber, parseFraction, parseLengthM, parseNumber, parseTimeS, UnitParseError } from '$lib/light/units';
import { parseMagnification } from './settings';

export const GEAR_KIND_LIST = ['flash', 'modifier', 'reflector', 'lens', 'camera'] as const;
export type GearKindName = (typeof GEAR_KIND_LIST)[number];

export const KIND_TITLES: Record<GearKindName, { one: string; many: string }> = {
	flash: { one: 'flash', many: 'Flashes' },
	modifier: { one: 'modifier', many: 'Modifiers' },
	reflector: { one: 'reflector', many: 'Reflectors' },
	lens: { one: 'lens', many: 'Lenses' },
	camera: { one: 'camera', many: 'Cameras' }
};

type Parse = 'number' | 'fraction' | 'time' | 'lengthCm' | 'fnumber' | 'magnification' | 'percent' | 'zoomTable' | 'select' | 'checkbox';

export interface GearField {
	key: string;
	label: string;
	hint: string;
	parse: Parse;
	optional?: boolean;
	options?: readonly string[];
	/** Shown in the table column heading. */
	column: string;
}

export const MODIFIER_SHAPE_OPTIONS = ['softbox', 'umbrella', 'dome', 'diffusion panel', 'snoot', 'grid', 'other'] as const;

export const GEAR_FIELDS: Record<GearKindName, GearField[]> = {
	flash: [
		{ key: 'guideNumberM', label: 'Guide number (metres, ISO 100, full power)', hint: 'e.g. 40', parse: 'number', column: 'GN (m)' },
		{ key: 'lowestPower', label: 'Lowest power step', hint: 'e.g. 1/128', parse: 'fraction', column: 'Lowest power' },
		{ key: 'syncSpeedS', label: 'Sync speed', hint: 'e.g. 1/250', parse: 'time', column: 'Sync' },
		{ key: 'calibrationOffsetStops', label: 'Calibration offset (stops, + = brighter than its GN)', hint: 'e.g. -0.3', parse: 'number', optional: true, column: 'Calibration' },
		{ key: 'zoomMm', label: 'Zoom head position the GN is for (mm)', hint: 'e.g. 35', parse: 'number', optional: true, column: 'Zoom' },
		{ key: 'guideNumbersByZoom', label: 'Guide number at each zoom position (mm: GN)', hint: 'e.g. 24 mm: 28, 35 mm: 40, 105 mm: 58', parse: 'zoomTable', optional: true, column: 'GN by zoom' },
		{ key: 'kelvin', label: 'Colour temperature (K)', hint: 'e.g. 5600', parse: 'number', optional: true, column: 'Kelvin' },
		{ key: 'mainsPowered', label: 'Runs from the mains (a studio strobe)', hint: '', parse: 'checkbox', optional: true, column: 'Mains' }
	],
	modifier: [
		{ key: 'shape', label: 'Shape', hint: '', parse: 'select', options: MODIFIER_SHAPE_OPTIONS, column: 'Shape' },
		{ key: 'lossStops', label: 'Light loss (stops)', hint: 'e.g. 1.7', parse: 'number', column: 'Loss' },
		{ key: 'beamAngleDeg', label: 'Beam angle (degrees, full angle at half intensity)', hint: 'e.g. 60', parse: 'number', column: 'Beam' },
		{ key: 'widthM', label: 'Front width', hint: 'e.g. 30 cm', parse: 'lengthCm', optional: true, column: 'Width' },
		{ key: 'heightM', label: 'Front height', hint: 'e.g. 30 cm', parse: 'lengthCm', optional: true, column: 'Height' }
	],
	reflector: [
		{ key: 'widthM', label: 'Width', hint: 'e.g. 30 cm or 12 in', parse: 'lengthCm', column: 'Width' },
		{ key: 'heightM', label: 'Height', hint: 'e.g. 20 cm', parse: 'lengthCm', column: 'Height' },
		{ key: 'reflectance', label: 'Reflectance', hint: 'e.g. 85 % or 0.85', parse: 'percent', column: 'Reflectance' },
		{ key: 'surface', label: 'Surface', hint: '', parse: 'select', options: ['diffuse', 'specular'], column: 'Surface' }
	],
	lens: [
		{ key: 'focalLengthMm', label: 'Focal length (mm)', hint: 'e.g. 100', parse: 'number', column: 'Focal length' },
		{ key: 'maxMagnification', label: 'Maximum magnification', hint: 'e.g. 1:1 or 0.5', parse: 'magnification', column: 'Max. magnification' },
		{ key: 'pupilMagnification', label: 'Pupil magnification (exit ÷ entrance pupil)', hint: 'e.g. 0.8', parse: 'number', optional: true, column: 'Pupil mag.' },
		{ key: 'widestAperture', label: 'Widest aperture', hint: 'e.g. f/2.8', parse: 'fnumber', column: 'Widest' },
		{ key: 'narrowestAperture', label: 'Narrowest aperture', hint: 'e.g. f/32', parse: 'fnumber', column: 'Narrowest' }
	],
	camera: [
		{ key: 'sensorWidthMm', label: 'Sensor width (mm)', hint: 'e.g. 36', parse: 'number', column: 'Sensor width' },
		{ key: 'sensorHeightMm', label: 'Sensor height (mm)', hint: 'e.g. 24', parse: 'number', column: 'Sensor height' },
		{ key: 'cocMm', label: 'Circle of confusion (mm)', hint: 'e.g. 0.03', parse: 'number', column: 'CoC' },
		{ key: 'pixelPitchUm', label: 'Pixel pitch (µm)', hint: 'e.g. 4.3', parse: 'number', optional: true, column: 'Pixel pitch' },
		{ key: 'syncSpeedS', label: 'Flash sync speed', hint: 'e.g. 1/200', parse: 'time', column: 'Sync' }
	]
};

function parseOne(field: GearField, raw: FormDataEntryValue | null): unknown {
	if (field.parse === 'checkbox') return raw !== null && raw !== '' && raw !== 'off';
	const text = typeof raw === 'string' ? raw.trim() : '';
	if (field.parse === 'select') return text;
	if (!text) return undefined;
	switch (field.parse) {
		case 'number':
			return parseNumber(text);
		case 'fraction':
			return parseNumber(text.replace(/\s*(?:power|of full)$/i, ''));
		case 'time':
			return parseTimeS(text);
		case 'lengthCm':
			return parseLengthM(text, 'cm');
		case 'fnumber':
			return parseFNumber(text);
		case 'magnification':
			return parseMagnification(text);
		case 'percent':
			return parseFraction(text);
		case 'zoomTable':
			return parseZoomTable(text);
	}
}

const ZOOM_ENTRY = /^(\d+(?:\.\d+)?)\s*(?:mm)?\s*[:=]\s*(\d+(?:\.\d+)?)\s*(?:m)?$/i;

/** "24 mm: 28, 35 mm: 40" (commas, semicolons or new lines between): the zoom positions with their guide numbers. */
export function parseZoomTable(text: string): { zoomMm: number; guideNumberM: number }[] {
	return text
		.split(/[,;\n]+/)
		.map((part) => part.trim())
		.filter(Boolean)
		.map((part) => {
			const m = part.match(ZOOM_ENTRY);
			if (!m) throw new UnitParseError(`cannot read “${part}”: write each position as zoom: guide number, e.g. 35 mm: 40`);
			return { zoomMm: Number(m[1]), guideNumberM: Number(m[2]) };
		});
}

/** The zoom positions as they are typed, widest first. */
function zoomTableText(value: unknown): string {
	if (!Array.isArray(value)) return '';
	return [...value]
		.sort((a, b) => a.zoomMm - b.zoomMm)
		.map((z) => `${roundSig(z.zoomMm, 4)} mm: ${roundSig(z.guideNumberM, 4)}`)
		.join(', ');
}

/** A gear form's spec, or the fields that could not be read (keyed `spec.<field>`). */
export function specFromForm(kind: GearKindName, form: FormData): { spec: Record<string, unknown>; errors: Record<string, string> } {
	const spec: Record<string, unknown> = {};
	const errors: Record<string, string> = {};
	for (const field of GEAR_FIELDS[kind]) {
		try {
			const v = parseOne(field, form.get(`spec.${field.key}`));
			if (v === undefined) {
				if (!field.optional) errors[`spec.${field.key}`] = 'is needed';
				continue;
			}
			spec[field.key] = v;
		} catch (e) {
			errors[`spec.${field.key}`] = e instanceof UnitParseError ? e.message : 'could not be read';
		}
	}
	return { spec, errors };
}

/** The text a form shows for a stored value (what a person would type back). */
export function fieldText(field: GearField, value: unknown): string {
	if (value === undefined || value === null) return '';
	if (field.parse === 'zoomTable') return zoomTableText(value);
	if (typeof value === 'boolean') return value ? 'on' : '';
	if (typeof value !== 'number') return String(value);
	switch (field.parse) {
		case 'fraction':
			return value < 1 ? `1/${roundSig(1 / value, 4)}` : String(value);
		case 'time':
			return value < 0.4 ? `1/${roundSig(1 / value, 4)}` : `${roundSig(value, 3)} s`;
		case 'lengthCm':
			return `${roundSig(value * 100, 4)} cm`;
		case 'fnumber':
			return `f/${roundSig(value, 3)}`;
		case 'magnification':
			return value >= 1 ? `${roundSig(value, 3)}:1` : `1:${roundSig(1 / value, 3)}`;
		case 'percent':
			return `${roundSig(value * 100, 3)} %`;
		default:
			return String(roundSig(value, 4));
	}
}

/** The value as a table cell. */
export function cellText(field: GearField, value: unknown): string {
	if (value === undefined || value === null || value === '' || (Array.isArray(value) && !value.length)) return '—';
	if (typeof value === 'boolean') return value ? 'yes' : 'no';
	if (typeof value === 'number') {
		if (field.parse === 'time') return formatShutter(value);
		if (field.key === 'calibrationOffsetStops') return value === 0 ? '0' : `${value > 0 ? '+' : '−'}${roundSig(Math.abs(value), 2)} stops`;
		if (field.key === 'lossStops') return `${roundSig(value, 2)} ${value === 1 ? 'stop' : 'stops'}`;
		if (field.key === 'beamAngleDeg') return `${roundSig(value, 3)}°`;
		if (field.key === 'kelvin') return `${roundSig(value, 4)} K`;
		if (field.key.endsWith('Mm')) return `${roundSig(value, 4)} mm`;
	}
	return fieldText(field, value);
}
