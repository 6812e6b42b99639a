/**
 * Formatting SI numbers for people: metric or imperial lengths, shutter times, f-numbers and stops.
 * Kept apart from the parser so code that only formats never loads mathjs.
 */
import { METRES_PER_FOOT, METRES_PER_INCH } from './constants';

export type UnitSystem = 'metric' | 'imperial';

function guideNumberMetresToFeet(guideNumberM: number): number {
	return guideNumberM / METRES_PER_FOOT;
}

/** Rounds to `digits` significant figures, without trailing zeros. */
export function roundSig(value: number, digits = 3): string {
	if (!Number.isFinite(value)) return '—';
	if (value === 0) return '0';
	const s = Number(value.toPrecision(digits));
	return String(Math.abs(s) >= 1e6 || Math.abs(s) < 1e-4 ? s.toExponential(digits - 1) : s);
}

/** A distance for a table or a room: cm or m in metric, inches or feet in imperial. */
export function formatDistance(distanceM: number, system: UnitSystem): string {
	if (system === 'imperial') {
		const inches = distanceM / METRES_PER_INCH;
		if (Math.abs(inches) < 36) return `${roundSig(inches, 3)} in`;
		return `${roundSig(distanceM / METRES_PER_FOOT, 3)} ft`;
	}
	if (Math.abs(distanceM) < 1) return `${roundSig(distanceM * 100, 3)} cm`;
	return `${roundSig(distanceM, 3)} m`;
}

/** A small length (depth of field, rail step): mm in metric; inches with mm beside in imperial. */
export function formatSmallLength(lengthMm: number, system: UnitSystem): string {
	const mm = `${roundSig(lengthMm, 3)} mm`;
	if (system === 'imperial') return `${roundSig(lengthMm / 25.4, 3)} in (${mm})`;
	return mm;
}

/** A guide number in the system's length unit. */
export function formatGuideNumber(guideNumberM: number, system: UnitSystem): string {
	return system === 'imperial'
		? `${roundSig(guideNumberMetresToFeet(guideNumberM), 3)} (ft)`
		: `${roundSig(guideNumberM, 3)} (m)`;
}

/** A shutter time as photographers write it: `1/125 s` below half a second, `2 s` above. */
export function formatShutter(seconds: number): string {
	if (!Number.isFinite(seconds) || seconds <= 0) return '—';
	if (seconds < 0.4) {
		const denominator = 1 / seconds;
		return `1/${denominator >= 10 ? Math.round(denominator) : roundSig(denominator, 2)} s`;
	}
	return `${roundSig(seconds, 2)} s`;
}

/** An f-number: `f/16`, `f/5.6`, `f/11.3` for an exact working value. */
export function formatFNumber(n: number, digits = 2): string {
	if (!Number.isFinite(n)) return '—';
	const rounded = n >= 10 ? Math.round(n * 10) / 10 : Number(n.toPrecision(digits));
	return `f/${rounded}`;
}

/** A signed stop figure: `+1.3 stops`, `−0.7 stops`, `0 stops`. */
export function formatStops(stops: number | null, digits = 1): string {
	if (stops === null || !Number.isFinite(stops)) return 'no light';
	const r = Number(stops.toFixed(digits));
	if (r === 0) return '0 stops';
	const sign = r > 0 ? '+' : '−';
	const word = Math.abs(r) === 1 ? 'stop' : 'stops';
	return `${sign}${Math.abs(r)} ${word}`;
}

/**
 * A stop figure in words, with no sign to contradict the word: `0.3 stop over`, `1 stop under`,
 * `1.7 stops under`, `on the mark` when it rounds to 0. `under` can be given another word (`short`).
 */
export function formatStopsOff(stops: number, digits = 1, underWord = 'under', overWord = 'over'): string {
	const r = Number(Math.abs(stops).toFixed(digits));
	if (r === 0) return 'on the mark';
	return `${r} ${r === 1 ? 'stop' : 'stops'} ${stops > 0 ? overWord : underWord}`;
}
