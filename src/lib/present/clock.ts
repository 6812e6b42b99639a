/** The presenter window's clock and elapsed time. */

/** "0:07:05" from milliseconds (hours always shown: a workshop evening runs past an hour). */
export function elapsedText(ms: number): string {
	const total = Math.max(0, Math.floor(ms / 1000));
	const h = Math.floor(total / 3600);
	const m = Math.floor((total % 3600) / 60);
	const s = total % 60;
	return `${h}:${String(m).padStart(2, '0')}:${String(s).padStart(2, '0')}`;
}
