// The exercise table and the gradebook as CSV (RFC 4180: comma-separated, CRLF, fields quoted where
// needed). A cell that would start a spreadsheet formula is prefixed with an apostrophe.
import type { Exercise, Workshop } from '$lib/server/db/schema';
import { STATE_WORDS } from '$lib/exercises/states';
import type { HandInRow } from '$lib/exercises/types';

export function csvCell(value: string | number | boolean | null): string {
	if (value === null) return '';
	let text = String(value);
	if (/^[=+\-@\t\r]/.test(text)) text = `'${text}`;
	return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function toCsv(rows: (string | number | boolean | null)[][]): string {
	return rows.map((r) => r.map(csvCell).join(',')).join('\r\n') + '\r\n';
}

const HEADER = ['exercise', 'due', 'student', 'email', 'handed in', 'version', 'late', 'targets met', 'targets', 'state'];

function line(e: Exercise, r: HandInRow): (string | number | boolean | null)[] {
	return [
		e.title,
		e.dueAt.toISOString(),
		r.name ?? '',
		r.email,
		r.handedInAt ?? '',
		r.version,
		r.handInId ? (r.late ? 'yes' : 'no') : '',
		r.targetsMet,
		r.targetsTotal,
		r.state ? STATE_WORDS[r.state] : 'Not handed in'
	];
}

export function gradebookCsv(exercises: { exercise: Exercise; rows: HandInRow[] }[]): string {
	return toCsv([HEADER, ...exercises.flatMap(({ exercise, rows }) => rows.map((r) => line(exercise, r)))]);
}

/** A file name from a title: letters, digits and dashes. */
export function csvFileName(workshop: Pick<Workshop, 'title'>, what: string): string {
	const slug = (s: string) => s.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'workshop';
	return `${slug(workshop.title)}-${slug(what)}.csv`;
}
