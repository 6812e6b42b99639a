/**
 * The `POST /api/v1/exposure` answer written as JSON text, for the route. It is the same answer as
 * `JSON.stringify(computeExposure(scene))` (a test holds the two equal), written without the aperture
 * table's row objects: each row's camera-only columns are turned into text once per lens setting (they
 * come memoised from `apertureColumns`), and a request writes only the three offset columns. The table is
 * most of the answer, and turning its numbers into text was most of the route's own cost.
 *
 * Like the route's general path, it refuses to write a number that is not finite (JSON would make it
 * null without a word) and names where it is instead.
 */
import { findNonFinite } from './finite';
import { exposureParts, TABLE_STOPS_DECIMALS, type ApertureColumns } from './scene';
import type { ExposureScene } from './schema';

export type ExposureJson = { ok: true; json: string } | { ok: false; nonFinite: string[] };

interface RowText {
	/** `{"aperture":…,"label":…,"workingAperture":…,"exposureOffsetStops":` */
	head: string;
	/** `,"dofMm":…,"airyDiskUm":…,"diffractionLimited":…}` */
	tail: string;
}
interface TableText {
	rows: RowText[];
	/** Where a camera-only column is not finite, if one is. */
	nonFinite: string[] | null;
}

const tableTexts = new WeakMap<readonly ApertureColumns[], TableText>();

function tableText(columns: readonly ApertureColumns[]): TableText {
	let text = tableTexts.get(columns);
	if (text) return text;
	const bad = findNonFinite(columns);
	text = {
		nonFinite: bad ? ['apertureTable', ...bad] : null,
		rows: columns.map((c) => ({
			head: `{"aperture":${c.aperture},"label":${JSON.stringify(c.label)},"workingAperture":${c.workingAperture},"exposureOffsetStops":`,
			tail: `,"dofMm":${c.dofMm},"airyDiskUm":${c.airyDiskUm},"diffractionLimited":${c.diffractionLimited}}`
		}))
	};
	tableTexts.set(columns, text);
	return text;
}

const SCALE = 10 ** TABLE_STOPS_DECIMALS;

/**
 * `stops` rounded as the table rounds it (`shifted` in scene.ts), written with all its decimals
 * ("-0.265490"): the digits of an integer, which are several times quicker to write than a double's
 * shortest form. JSON reads it back as the same number. Null stays null; a value too large for the
 * integer digits (none the schema allows) is written the ordinary way.
 */
export function tableStopsText(stops: number | null): string {
	if (stops === null) return 'null';
	let units = Math.round(stops * SCALE);
	if (!(Math.abs(units) < Number.MAX_SAFE_INTEGER)) return String(units / SCALE);
	let sign = '';
	if (units < 0) {
		units = -units;
		sign = '-';
	} else if (Object.is(units, -0)) units = 0;
	const whole = Math.floor(units / SCALE);
	return `${sign}${whole}.${String(units - whole * SCALE + SCALE).slice(1)}`;
}

export function exposureAnswerJson(scene: ExposureScene): ExposureJson {
	const { answer, columns, totalStops, flashStops, shutterStops } = exposureParts(scene);
	const table = tableText(columns);
	if (table.nonFinite) return { ok: false, nonFinite: table.nonFinite };
	const bad = findNonFinite(answer);
	if (bad) return { ok: false, nonFinite: bad };
	const rows: string[] = new Array(columns.length);
	for (let i = 0; i < columns.length; i++) {
		const shift = columns[i].shiftStops;
		const e = totalStops === null ? null : totalStops + shift;
		const f = flashStops === null ? null : flashStops + shift;
		const a = shutterStops === null ? null : shutterStops + shift;
		// Finite stops plus a finite shift can still overflow; say so as the general path would.
		if (!(e === null || Number.isFinite(e))) return { ok: false, nonFinite: ['apertureTable', String(i), 'exposureOffsetStops'] };
		if (!(f === null || Number.isFinite(f))) return { ok: false, nonFinite: ['apertureTable', String(i), 'flashOffsetStops'] };
		if (!(a === null || Number.isFinite(a))) return { ok: false, nonFinite: ['apertureTable', String(i), 'ambientOffsetStops'] };
		const row = table.rows[i];
		rows[i] = `${row.head}${tableStopsText(e)},"flashOffsetStops":${tableStopsText(f)},"ambientOffsetStops":${tableStopsText(a)}${row.tail}`;
	}
	const rest = JSON.stringify(answer);
	return { ok: true, json: `${rest.slice(0, -1)},"apertureTable":[${rows.join(',')}]}` };
}
