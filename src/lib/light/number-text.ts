/**
 * What people type into a number field, read without the unit parser where it is a plain number
 * (`30`, `0,3`, `1,500`, `-2.5`, `1e-3`), which is what most fields hold. Anything else (`30 cm`,
 * `1 ft + 2 in`, `1/125`) goes to the mathjs parser in units.ts, which the browser loads only then:
 * mathjs is most of the JavaScript a page would otherwise load for its number fields.
 */

export class UnitParseError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'UnitParseError';
	}
}

/** The text as both readers see it: trimmed, × and − as * and -, thousands commas dropped, a decimal comma as a point. */
export function normaliseNumberText(text: string): string {
	return text
		.trim()
		.replace(/×/g, '*')
		.replace(/−/g, '-')
		.replace(/,(?=\d{3}\b)/g, '')
		.replace(/(\d),(\d)/g, '$1.$2');
}

const PLAIN_NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?$/i;

/** A plain decimal number, or null for anything the unit parser must read (or refuse). */
export function plainNumber(text: string): number | null {
	const t = normaliseNumberText(text);
	if (!PLAIN_NUMBER.test(t)) return null;
	const n = Number(t);
	return Number.isFinite(n) ? n : null;
}

/** Metres in one of the units a length field reads a bare number in. */
const METRES_PER: Record<string, number> = { m: 1, cm: 0.01, mm: 0.001, in: 0.0254, ft: 0.3048 };

/**
 * A typed length in metres; a bare number is read in `defaultUnit` (`cm` for table distances). Loads
 * the unit parser only for text that is not a plain number. Throws UnitParseError, naming the problem.
 */
export async function readLengthM(text: string, defaultUnit = 'm'): Promise<number> {
	const n = plainNumber(text);
	if (n !== null && defaultUnit in METRES_PER) return n * METRES_PER[defaultUnit];
	const { parseLengthM } = await import('./units');
	return parseLengthM(text, defaultUnit);
}
