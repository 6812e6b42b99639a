/**
 * Colour: mired (micro reciprocal degrees), gel shifts, a gel on a source, the white balance for a mix of
 * sources weighted by their share of the exposure, and a warning when one scene mixes sources far apart.
 *
 * mired = 10⁶ / kelvin. A gel shifts a source by a fixed number of mired whatever the source, which is
 * why gels are rated in mired: result = 10⁶ / (10⁶/kelvin + gelMired). Positive mired warms (orange),
 * negative cools (blue).
 */
import { gelOnLightCaution } from './cautions';

export function mired(kelvin: number): number {
	return 1e6 / kelvin;
}

export function kelvinFromMired(miredValue: number): number {
	return 1e6 / miredValue;
}

/** The gel (in mired) that turns a `fromKelvin` source into `toKelvin`: 10⁶/to − 10⁶/from (API: /api/v1/openapi.json). */
export function miredShift(fromKelvin: number, toKelvin: number): number {
	return 1e6 / toKelvin - 1e6 / fromKelvin;
}

/** A gel of `gelMired` on a source of `kelvin`: 10⁶ / (10⁶/kelvin + gelMired) (API: /api/v1/openapi.json). */
export function gelledKelvin(kelvin: number, gelMired: number): number {
	return 1e6 / (1e6 / kelvin + gelMired);
}

/**
 * Nominal colour-correction gels in mired (from memory: the usual nominal shifts of full, half, quarter
 * and eighth colour temperature orange and blue; a full CTO takes 6500 K to about 3200 K, a full CTB
 * takes 3200 K to about 5700 K) and the light each costs (from memory: typical transmission figures of
 * such gels, about ⅔ stop for a full CTO and 1½ stops for a full CTB). A real gel's data sheet wins.
 */
export const GELS = {
	'full-cto': { mired: 159, label: 'Full CTO', lossStops: 0.7 },
	'half-cto': { mired: 109, label: '½ CTO', lossStops: 0.5 },
	'quarter-cto': { mired: 64, label: '¼ CTO', lossStops: 0.3 },
	'eighth-cto': { mired: 26, label: '⅛ CTO', lossStops: 0.1 },
	'eighth-ctb': { mired: -18, label: '⅛ CTB', lossStops: 0.2 },
	'quarter-ctb': { mired: -35, label: '¼ CTB', lossStops: 0.5 },
	'half-ctb': { mired: -78, label: '½ CTB', lossStops: 0.8 },
	'full-ctb': { mired: -137, label: 'Full CTB', lossStops: 1.5 }
} as const;

export type GelName = keyof typeof GELS;
export const GEL_NAMES = Object.keys(GELS) as GelName[];

/** The nominal gel nearest to a mired shift, with what it leaves over (shift − gel). */
export function nearestGel(shiftMired: number): { name: GelName | 'none'; label: string; mired: number; residualMired: number } {
	let best: { name: GelName | 'none'; label: string; mired: number } = { name: 'none', label: 'No gel', mired: 0 };
	for (const name of GEL_NAMES) {
		if (Math.abs(GELS[name].mired - shiftMired) < Math.abs(best.mired - shiftMired)) {
			best = { name, label: GELS[name].label, mired: GELS[name].mired };
		}
	}
	return { ...best, residualMired: shiftMired - best.mired };
}

export interface GelSuggestion {
	/** One gel, or two stacked (their mired shifts and their losses add). Empty: no gel needed. */
	gels: GelName[];
	label: string;
	mired: number;
	residualMired: number;
	lossStops: number;
}

/**
 * What the trade would put on the light for a shift: the single gel whose shift is nearest, or two
 * different gels of the same colour stacked when that comes more than `STACK_GAIN_MIRED` nearer (ours: about an
 * eighth of a CTO, the smallest step a viewer notices). Daylight to tungsten (+131 mired) is a full CTO
 * in everyday practice, leaving −28 mired to the white balance; ½ + ⅛ CTO (+135) matches it closer.
 */
export const STACK_GAIN_MIRED = 15;

export function suggestGel(shiftMired: number): GelSuggestion {
	const single = GEL_NAMES.map((g): GelName[] => [g]);
	const pairs = GEL_NAMES.flatMap((a, i) => GEL_NAMES.slice(i + 1).filter((b) => Math.sign(GELS[a].mired) === Math.sign(GELS[b].mired)).map((b): GelName[] => [a, b]));
	const miss = (gels: GelName[]) => Math.abs(shiftMired - gels.reduce((s, g) => s + GELS[g].mired, 0));
	const best = (options: GelName[][]) => options.reduce((a, b) => (miss(b) < miss(a) ? b : a));
	let gels = best(single);
	const pair = best(pairs);
	if (miss(pair) + STACK_GAIN_MIRED < miss(gels)) gels = pair;
	if (Math.abs(shiftMired) < miss(gels)) gels = [];
	const mired = gels.reduce((s, g) => s + GELS[g].mired, 0);
	return {
		gels,
		label: gels.length ? gels.map((g) => GELS[g].label).join(' + ') : 'No gel',
		mired,
		residualMired: shiftMired - mired,
		lossStops: gels.reduce((s, g) => s + GELS[g].lossStops, 0)
	};
}

/**
 * Mired spread above which one white balance cannot suit every source in a scene. Ours, stated: 50 mired
 * is about a quarter-to-half CTO, a difference most viewers see as a colour cast between lit areas.
 */
export const MIXED_LIGHT_WARNING_MIRED = 50;

export interface LightShare {
	kelvin: number;
	/** Share of the exposure (any non-negative weight; the X of each light in a scene). */
	share: number;
}

export interface WhiteBalanceMix {
	/** White balance for the mix: the share-weighted mean in mired, turned back to kelvin. */
	kelvin: number;
	spreadMired: number;
	mixed: boolean;
}

/**
 * White balance for a mix. Averaging in mired rather than kelvin follows how colour shifts add (equal
 * mired steps look like equal shifts). Returns null when no source carries any share.
 */
export function mixedWhiteBalance(sources: readonly LightShare[]): WhiteBalanceMix | null {
	const lit = sources.filter((s) => s.share > 0);
	const total = lit.reduce((sum, s) => sum + s.share, 0);
	if (!lit.length || !(total > 0)) return null;
	const meanMired = lit.reduce((sum, s) => sum + mired(s.kelvin) * s.share, 0) / total;
	const mireds = lit.map((s) => mired(s.kelvin));
	const spread = Math.max(...mireds) - Math.min(...mireds);
	return { kelvin: kelvinFromMired(meanMired), spreadMired: spread, mixed: spread > MIXED_LIGHT_WARNING_MIRED };
}

export function mixedLightWarning(mix: WhiteBalanceMix): string {
	return `The light sources are ${Math.round(mix.spreadMired)} mired apart: no single white balance suits them all; gel the odd one out or expect colour casts where each dominates.`;
}

export interface ColourCalcInput {
	fromKelvin?: number;
	toKelvin?: number;
	kelvin?: number;
	gelMired?: number;
	gel?: GelName;
	sources?: LightShare[];
}

export interface ColourCalcResult {
	miredShift?: number;
	nearestGel?: ReturnType<typeof nearestGel>;
	/** The gel (or two stacked) the trade would use for the shift, with the light it costs. */
	suggestedGel?: GelSuggestion;
	/** The light the named gel costs, stops (from memory; the data sheet wins). */
	gelLossStops?: number;
	resultKelvin?: number;
	gelMired?: number;
	whiteBalance?: WhiteBalanceMix | null;
	warnings: string[];
	/** Cautions for a gel on a light (when a gel is asked about). */
	cautions: string[];
}

/** `POST /api/v1/calc/colour` (see /api/v1/openapi.json), with a named gel and a mix as extras. */
export function colourCalc(input: ColourCalcInput): ColourCalcResult {
	const result: ColourCalcResult = { warnings: [], cautions: [] };
	if (input.fromKelvin !== undefined && input.toKelvin !== undefined) {
		result.miredShift = miredShift(input.fromKelvin, input.toKelvin);
		result.nearestGel = nearestGel(result.miredShift);
		result.suggestedGel = suggestGel(result.miredShift);
	}
	const gel = input.gelMired ?? (input.gel ? GELS[input.gel].mired : undefined);
	if (input.kelvin !== undefined && gel !== undefined) {
		result.gelMired = gel;
		result.resultKelvin = gelledKelvin(input.kelvin, gel);
		if (input.gel) result.gelLossStops = GELS[input.gel].lossStops;
		if (gel !== 0) result.cautions.push(gelOnLightCaution());
	}
	if (input.sources) {
		result.whiteBalance = mixedWhiteBalance(input.sources);
		if (result.whiteBalance?.mixed) result.warnings.push(mixedLightWarning(result.whiteBalance));
	}
	return result;
}
