/**
 * Reads what was typed into the calculator's fields (typed units through the units module, which uses
 * mathjs) into the SI numbers the API wants. Shared by the form actions and the live client, which
 * loads it on first use.
 */
import {
	parseFNumber,
	parseFraction,
	parseLengthM,
	parseLengthMm,
	parseNumber,
	parseTimeS,
	UnitParseError,
	type UnitSystem
} from '$lib/light/units';
import { gnUnit, lengthUnit, type FieldDef, type FieldErrors, type FieldValues } from './fields';

/** Magnification as photographers write it: `1:1`, `1:2`, `2:1`, `0.5`, `1/2`, `2x`, `0.5×`. */
export function parseMagnification(text: string): number {
	const t = text.trim().replace(/\s*[x×]\s*$/i, '');
	const ratio = t.match(/^(\d+(?:[.,]\d+)?)\s*:\s*(\d+(?:[.,]\d+)?)$/);
	if (ratio) {
		const a = Number(ratio[1].replace(',', '.'));
		const b = Number(ratio[2].replace(',', '.'));
		if (!(b > 0)) throw new UnitParseError('needs a ratio like 1:2');
		return a / b;
	}
	return parseNumber(t);
}

/** Kelvin with or without its unit: `5500`, `5500 K`, `5500K`. */
export function parseKelvin(text: string): number {
	return parseNumber(text.trim().replace(/\s*k$/i, ''));
}

/** Parses one field to the number the API wants (metres, mm, seconds, fractions). */
export function parseField(def: FieldDef, raw: string, units: UnitSystem): number | string | boolean {
	switch (def.kind) {
		case 'guideNumber':
			return parseLengthM(raw, gnUnit(units));
		case 'distance':
			return parseLengthM(raw, lengthUnit(units));
		case 'smallLength':
			return parseLengthMm(raw, 'mm');
		case 'number':
			return parseNumber(raw);
		case 'fNumber':
			return parseFNumber(raw);
		case 'magnification':
			return parseMagnification(raw);
		case 'shutter':
			return parseTimeS(raw);
		case 'percent':
			return parseFraction(raw);
		case 'kelvin':
			return parseKelvin(raw);
		case 'select':
			if (!def.options?.some((o) => o.value === raw)) throw new UnitParseError('is not one of the choices');
			return raw;
		case 'checkbox':
			return raw === 'on' || raw === 'true';
	}
}

/**
 * Reads every shown field. Returns the parsed values, or the errors beside their fields. An empty
 * optional field is left out.
 */
export function readFields(
	defs: FieldDef[],
	values: FieldValues,
	units: UnitSystem
): { ok: true; parsed: Record<string, number | string | boolean | undefined> } | { ok: false; errors: FieldErrors } {
	const parsed: Record<string, number | string | boolean | undefined> = {};
	const errors: FieldErrors = {};
	for (const def of defs) {
		if (def.shownWhen && !def.shownWhen(values)) continue;
		const raw = (values[def.name] ?? '').trim();
		if (def.kind === 'checkbox') {
			parsed[def.name] = raw === 'on' || raw === 'true';
			continue;
		}
		if (!raw) {
			if (def.optional) continue;
			errors[def.name] = `${def.label} is needed`;
			continue;
		}
		try {
			parsed[def.name] = parseField(def, raw, units);
		} catch (e) {
			errors[def.name] = `${def.label} ${e instanceof UnitParseError ? e.message : 'could not be read'}`;
		}
	}
	return Object.keys(errors).length ? { ok: false, errors } : { ok: true, parsed };
}

