/** The figures the present view shows large, worked out from the engine's answer. */
import type { ApertureRow } from '$lib/light/scene';

/**
 * The aperture-table rows around the set aperture: `each` third-stop rows either side of the row
 * nearest to it (fewer at the table's ends), and the index of that row among them.
 */
export function rowsAround(rows: readonly ApertureRow[], aperture: number, each = 2): { rows: ApertureRow[]; setIndex: number } {
	if (!rows.length) return { rows: [], setIndex: -1 };
	let nearest = 0;
	rows.forEach((r, i) => {
		if (Math.abs(Math.log2(r.aperture / aperture)) < Math.abs(Math.log2(rows[nearest].aperture / aperture))) nearest = i;
	});
	const from = Math.max(0, nearest - each);
	return { rows: rows.slice(from, nearest + each + 1), setIndex: nearest - from };
}

/** An offset in stops as the hall reads it: "+0.7", "−1.3", "0.0"; null when no light reaches the subject. */
export function offsetText(stops: number | null): string {
	if (stops === null || !Number.isFinite(stops)) return 'no light';
	const r = Math.round(stops * 10) / 10;
	if (r === 0) return '0.0';
	return `${r > 0 ? '+' : '−'}${Math.abs(r).toFixed(1)}`;
}
