/**
 * The comparison's one rule for numbers: a value is compared as the reader sees it. A change that does
 * not show at the precision we print is not reported (no "900 cm² → 900 cm²"), and a difference is
 * worked out from the two figures as printed, so "−4.2 → −3.3 stops" reads "+0.9 stops": rounding each
 * side is monotonic, so the printed difference has the sign of the true one or is zero, never the other.
 */
import { formatStops } from '$lib/light/format';

/** `before → after` when the two read differently, else null (nothing to report). */
export function shownChange<T>(before: T, after: T, fmt: (v: T) => string): string | null {
	const a = fmt(before);
	const b = fmt(after);
	return a === b ? null : `${a} → ${b}`;
}

/** A stop figure as printed (one decimal), as a number. */
export const shownStops = (stops: number, digits = 1) => Number(stops.toFixed(digits));

/** The difference of two stop figures as printed: `+0.9 stops` for −4.2 → −3.3. */
export function shownStopsDelta(before: number, after: number, digits = 1): number {
	return Number((shownStops(after, digits) - shownStops(before, digits)).toFixed(digits));
}

/** `+0.9 stops`, from the printed figures of both sides. */
export const formatStopsDelta = (before: number, after: number) => formatStops(shownStopsDelta(before, after));

/** An angle as we print it: whole degrees. */
export const shownDegrees = (deg: number) => Math.round(Math.abs(deg));
