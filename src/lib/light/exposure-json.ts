/**
 * The `POST /api/v1/exposure` answer written as JSON (UTF-8 bytes), for the route. It is the same answer
 * as `JSON.stringify(computeExposure(scene))` (a test holds the two equal), written without the aperture
 * table's row objects: each row's camera-only columns are encoded once per lens setting (they come
 * memoised from `apertureColumns`), and a request writes only the three offset columns, straight into
 * the bytes. The table is most of the answer, and turning its numbers into text was most of the route's
 * own cost.
 *
 * Like the route's general path, it refuses to write a number that is not finite (JSON would make it
 * null without a word) and names where it is instead.
 */
import { findNonFinite } from './finite';
import { COLUMN_MEMO_SIZE, exposureParts, TABLE_STOPS_DECIMALS, type ApertureColumns } from './scene';
import type { ExposureScene } from './schema';

export type ExposureJson = { ok: true; bytes: Uint8Array<ArrayBuffer> } | { ok: false; nonFinite: string[] };

const encoder = new TextEncoder();

interface TableBytes {
	/**
	 * The table's fixed bytes around each row's three stops: `[{"aperture":…,"exposureOffsetStops":`
	 * first, then `,"dofMm":…},{"aperture":…,"exposureOffsetStops":` between rows, and `…}]` last.
	 */
	between: Uint8Array[];
	/** All the bytes a request writes for the table besides its stops. */
	fixedBytes: number;
	/** Where a camera-only column is not finite, if one is. */
	nonFinite: string[] | null;
}

const FLASH_KEY = encoder.encode(',"flashOffsetStops":');
const AMBIENT_KEY = encoder.encode(',"ambientOffsetStops":');
const TABLE_KEY = encoder.encode(',"apertureTable":');
/** Where a row's three stops go in the table written with nulls for them. */
const STOPS_GAP = 'null,"flashOffsetStops":null,"ambientOffsetStops":null';
/** The most bytes one table stops value can take ("-" + 16 digits + "." + 6, or a double's own form). */
const MAX_STOPS_BYTES = 26;

/** The byte forms of the last few tables, newest first (the same tables `apertureColumns` keeps). */
const recentTables: { columns: readonly ApertureColumns[]; bytes: TableBytes }[] = [];
const TABLE_MEMO_SIZE = COLUMN_MEMO_SIZE;

function tableBytesFor(columns: readonly ApertureColumns[]): TableBytes {
	for (const m of recentTables) if (m.columns === columns) return m.bytes;
	// The table written once with null stops, in the API's order, and cut where the stops go. Its text is
	// all ASCII (numbers, "f/…" labels, booleans, null), so characters and bytes count alike.
	const text = JSON.stringify(
		columns.map((c) => ({
			aperture: c.aperture,
			label: c.label,
			workingAperture: c.workingAperture,
			exposureOffsetStops: null,
			flashOffsetStops: null,
			ambientOffsetStops: null,
			dofMm: c.dofMm,
			airyDiskUm: c.airyDiskUm,
			diffractionLimited: c.diffractionLimited
		}))
	);
	const all = encoder.encode(text);
	const between: Uint8Array[] = [];
	let from = 0;
	for (let gap = text.indexOf(STOPS_GAP); gap >= 0; gap = text.indexOf(STOPS_GAP, from)) {
		between.push(all.subarray(from, gap));
		from = gap + STOPS_GAP.length;
	}
	between.push(all.subarray(from));
	const bad = findNonFinite(columns);
	const fixedBytes = TABLE_KEY.length + all.length - columns.length * (STOPS_GAP.length - FLASH_KEY.length - AMBIENT_KEY.length) + 1;
	const bytes = { between, fixedBytes, nonFinite: bad ? ['apertureTable', ...bad] : null };
	recentTables.unshift({ columns, bytes });
	if (recentTables.length > TABLE_MEMO_SIZE) recentTables.pop();
	return bytes;
}

const SCALE = 10 ** TABLE_STOPS_DECIMALS;
let scratch = new Uint8Array(16 * 1024);

/** Writes the digits of a whole number `n` ≥ 0 at `at`; returns where they end. */
function writeWhole(out: Uint8Array, at: number, n: number): number {
	let length = 1;
	for (let p = 10; p <= n; p *= 10) length++;
	for (let i = length - 1; i >= 0; i--) {
		const rest = Math.floor(n / 10);
		out[at + i] = 48 + (n - rest * 10);
		n = rest;
	}
	return at + length;
}

/**
 * Writes `stops` rounded as the table rounds it (`shifted` in scene.ts) with all its decimals
 * ("-0.265490"), digit by digit from the integer count of millionths: several times quicker than a
 * double's shortest form, and JSON reads it back as the same number. Null is written as null; a value
 * too large for the integer digits (none the schema allows) is written the ordinary way.
 */
export function writeTableStops(out: Uint8Array, at: number, stops: number | null): number {
	if (stops === null) {
		out[at] = 110; // n
		out[at + 1] = 117; // u
		out[at + 2] = 108; // l
		out[at + 3] = 108; // l
		return at + 4;
	}
	let units = Math.round(stops * SCALE);
	if (!(Math.abs(units) < Number.MAX_SAFE_INTEGER)) return at + encoder.encodeInto(String(units / SCALE), out.subarray(at)).written;
	if (units < 0) {
		out[at++] = 45; // -
		units = -units;
	}
	const whole = Math.floor(units / SCALE);
	at = writeWhole(out, at, whole);
	out[at++] = 46; // .
	let fraction = units - whole * SCALE;
	for (let i = TABLE_STOPS_DECIMALS - 1; i >= 0; i--) {
		const rest = Math.floor(fraction / 10);
		out[at + i] = 48 + (fraction - rest * 10);
		fraction = rest;
	}
	return at + TABLE_STOPS_DECIMALS;
}

/** The answer as UTF-8 bytes, ready to send. */
export function exposureAnswerJson(scene: ExposureScene): ExposureJson {
	const { answer, columns, totalStops, flashStops, shutterStops } = exposureParts(scene);
	const table = tableBytesFor(columns);
	if (table.nonFinite) return { ok: false, nonFinite: table.nonFinite };
	const bad = findNonFinite(answer);
	if (bad) return { ok: false, nonFinite: bad };
	const rest = JSON.stringify(answer);
	// UTF-8 takes at most 3 bytes per UTF-16 unit. The answer is written into a scratch buffer kept between
	// calls (the writing never yields, so no two answers share it) and copied out at its exact length.
	const bound = rest.length * 3 + table.fixedBytes + columns.length * 3 * MAX_STOPS_BYTES;
	if (scratch.length < bound) scratch = new Uint8Array(Math.max(bound, 2 * scratch.length));
	const out = scratch;
	// The rest of the answer without its closing brace, then the table as its last member.
	let at = encoder.encodeInto(rest, out).written - 1;
	out.set(TABLE_KEY, at);
	at += TABLE_KEY.length;
	out.set(table.between[0], at);
	at += table.between[0].length;
	for (let i = 0; i < columns.length; i++) {
		const shift = columns[i].shiftStops;
		const e = totalStops === null ? null : totalStops + shift;
		const f = flashStops === null ? null : flashStops + shift;
		const a = shutterStops === null ? null : shutterStops + shift;
		// Finite stops plus a finite shift can still overflow; say so as the general path would.
		if (!(e === null || Number.isFinite(e))) return { ok: false, nonFinite: ['apertureTable', String(i), 'exposureOffsetStops'] };
		if (!(f === null || Number.isFinite(f))) return { ok: false, nonFinite: ['apertureTable', String(i), 'flashOffsetStops'] };
		if (!(a === null || Number.isFinite(a))) return { ok: false, nonFinite: ['apertureTable', String(i), 'ambientOffsetStops'] };
		at = writeTableStops(out, at, e);
		out.set(FLASH_KEY, at);
		at = writeTableStops(out, at + FLASH_KEY.length, f);
		out.set(AMBIENT_KEY, at);
		at = writeTableStops(out, at + AMBIENT_KEY.length, a);
		const next = table.between[i + 1];
		out.set(next, at);
		at += next.length;
	}
	out[at++] = 125; // }
	return { ok: true, bytes: out.slice(0, at) };
}
