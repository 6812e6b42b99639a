/**
 * Flash power as photographers write it, read and shown. Common practice (flash manuals and the trade):
 * power is a fraction of full power in whole stops, `1/1`, `1/2` … `1/256`, and thirds between them are
 * written above the whole stop below, `1/8 +0.3` and `1/8 +0.7`, where 0.3 and 0.7 stand for one and two
 * thirds of a stop. A stop is a factor of two, so `-3 EV` from full power is 1/8.
 *
 * Read: `1/32`, `1/8 +0.3` (also `1/8+0.7`, `1/16 -0.3`, `1/8 +0.5`), `0.25`, `-3 EV` (or `-3 stops`),
 * `full`. The bounds (above 0, at most full power) are the element schema's to check.
 */

export type PowerReading = { ok: true; power: number } | { ok: false; message: string };

export const POWER_HINT = 'type a fraction of full power such as 1/32, 1/8 +0.3, 0.25 or -3 EV';

const NUMBER = String.raw`(\d+(?:\.\d*)?|\.\d+)`;
const FRACTION = new RegExp(String.raw`^${NUMBER}\s*/\s*${NUMBER}(?:\s*([+-])\s*${NUMBER}\s*(?:ev|stops?)?)?$`, 'i');
const STOPS = new RegExp(String.raw`^([+-]?)\s*${NUMBER}\s*(?:ev|stops?)$`, 'i');
const DECIMAL = new RegExp(String.raw`^${NUMBER}$`);

/** "0.3" and "0.7" are how the trade writes a third and two thirds of a stop; other figures are taken as written. */
function stopsFromOffset(text: string): number {
	const n = Number(text);
	if (n === 0.3 || n === 0.33) return 1 / 3;
	if (n === 0.7 || n === 0.67) return 2 / 3;
	return n;
}

export function parsePower(text: string): PowerReading {
	const t = text.trim().replace(/[−–]/g, '-').replace(/,/g, '.').toLowerCase();
	if (t === '') return { ok: false, message: `must not be empty: ${POWER_HINT}` };
	if (t === 'full' || t === 'full power') return { ok: true, power: 1 };
	let m = FRACTION.exec(t);
	if (m) {
		const [, num, den, sign, offset] = m;
		if (Number(den) === 0) return { ok: false, message: 'cannot divide by 0' };
		const stops = sign ? (sign === '-' ? -1 : 1) * stopsFromOffset(offset) : 0;
		return { ok: true, power: (Number(num) / Number(den)) * 2 ** stops };
	}
	m = STOPS.exec(t);
	if (m) return { ok: true, power: 2 ** ((m[1] === '-' ? -1 : 1) * Number(m[2])) };
	m = DECIMAL.exec(t);
	if (m) return { ok: true, power: Number(m[1]) };
	return { ok: false, message: `is not a power: ${POWER_HINT}` };
}

/**
 * The trade's notation: the whole stop at or below the power, then the stops above it to a tenth
 * (`1/32`, `1/8 +0.3`, `1/8 +0.7`, `1/1`). A third of a stop shows as 0.3, so every ladder step keeps
 * its usual label.
 */
export function formatPower(power: number): string {
	if (!(power > 0) || !Number.isFinite(power)) return '—';
	const stops = Math.log2(power);
	let whole = Math.floor(stops + 1e-9);
	let above = Math.round((stops - whole) * 10) / 10;
	if (above >= 1) {
		whole += 1;
		above = 0;
	}
	const base = whole >= 0 ? `${2 ** whole}/1` : `1/${2 ** -whole}`;
	return above > 0 ? `${base} +${above}` : base;
}
