/**
 * Reading the setup page's camera form: what people type (`f/16`, `1/125`, `1:2`) into the numbers of
 * the scene's camera, each checked with the light engine's own field schema so the limits and their
 * messages are the API's. Errors are keyed by the form's field names.
 */
import { sceneCameraSchema } from '$lib/light/schema';
import { parseFNumber, parseNumber, parseTimeS, UnitParseError } from '$lib/light/units';

export const CAMERA_FIELDS = ['iso', 'aperture', 'shutter', 'magnification'] as const;
export type CameraField = (typeof CAMERA_FIELDS)[number];
export type CameraSettings = Record<CameraField, number>;

const NAMES: Record<CameraField, string> = {
	iso: 'ISO',
	aperture: 'Aperture',
	shutter: 'Shutter speed',
	magnification: 'Magnification'
};

/** `0.5`, `0.5x`, `1:2`, `1/2`, `2×` all read as a magnification. */
export function parseMagnification(text: string): number {
	const t = text.trim().replace(/\s*[x×]$/i, '');
	const ratio = t.match(/^(\d+(?:[.,]\d+)?)\s*:\s*(\d+(?:[.,]\d+)?)$/);
	if (ratio) {
		const a = Number(ratio[1].replace(',', '.'));
		const b = Number(ratio[2].replace(',', '.'));
		if (b === 0) throw new UnitParseError('cannot divide by 0');
		return a / b;
	}
	return parseNumber(t);
}

const PARSERS: Record<CameraField, (text: string) => number> = {
	iso: parseNumber,
	aperture: parseFNumber,
	shutter: parseTimeS,
	magnification: parseMagnification
};

export function parseCameraSettings(values: Record<CameraField, string>):
	| { ok: true; value: CameraSettings }
	| { ok: false; errors: Partial<Record<CameraField, string>> } {
	const errors: Partial<Record<CameraField, string>> = {};
	const value = {} as CameraSettings;
	for (const field of CAMERA_FIELDS) {
		const text = values[field] ?? '';
		let n: number;
		try {
			n = PARSERS[field](text);
		} catch (e) {
			errors[field] = `${NAMES[field]} ${e instanceof UnitParseError ? e.message : 'could not be read'}.`;
			continue;
		}
		const checked = sceneCameraSchema.shape[field].safeParse(n);
		if (!checked.success) errors[field] = `${NAMES[field]} ${checked.error.issues[0].message}.`;
		else value[field] = checked.data;
	}
	return Object.keys(errors).length ? { ok: false, errors } : { ok: true, value };
}

/** Tags as typed: comma-separated, trimmed, lower-case, without repeats. */
export function parseTags(text: string): string[] {
	return [...new Set(text.split(',').map((t) => t.trim().toLowerCase()).filter(Boolean))];
}
