/**
 * The addresses of an invitation list, pasted (one a line, or separated by commas or semicolons, also
 * as `Name <address>`) or read from a CSV file (the column headed "email", "e-mail" or "address", else
 * the first column). Each bad entry is named with why, so the good ones can still be sent.
 */
import { emailSchema } from '$lib/schemas/account';

export const MAX_INVITATIONS_AT_ONCE = 200;

export interface AddressList {
	/** Lower-cased, each once, in the order given. */
	valid: string[];
	invalid: { entry: string; message: string }[];
}

function check(entries: string[]): AddressList {
	const valid: string[] = [];
	const invalid: AddressList['invalid'] = [];
	for (const raw of entries) {
		const entry = raw.trim();
		if (!entry) continue;
		const bracketed = /<([^<>]*)>\s*$/.exec(entry);
		const parsed = emailSchema.safeParse(bracketed ? bracketed[1] : entry);
		if (!parsed.success) invalid.push({ entry, message: parsed.error.issues[0].message });
		else if (!valid.includes(parsed.data)) valid.push(parsed.data);
	}
	return { valid, invalid };
}

/** Pasted text: one address a line, or several separated by commas or semicolons. */
export function parseAddressText(text: string): AddressList {
	return check(text.split(/[\n\r,;]+/));
}

/** Splits one CSV line on commas (or semicolons when there are no commas), honouring double quotes. */
function csvCells(line: string): string[] {
	const separator = line.includes(',') ? ',' : ';';
	const cells: string[] = [];
	let cell = '';
	let quoted = false;
	for (let i = 0; i < line.length; i++) {
		const c = line[i];
		if (quoted) {
			if (c === '"' && line[i + 1] === '"') {
				cell += '"';
				i++;
			} else if (c === '"') quoted = false;
			else cell += c;
		} else if (c === '"') quoted = true;
		else if (c === separator) {
			cells.push(cell);
			cell = '';
		} else cell += c;
	}
	cells.push(cell);
	return cells.map((c) => c.trim());
}

const HEADER = /^(e-?mail|e-?mail address|address)$/i;

/** A CSV file: the column headed e-mail or address, else the first column. */
export function parseAddressCsv(text: string): AddressList {
	const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/).filter((l) => l.trim().length > 0);
	if (!lines.length) return { valid: [], invalid: [] };
	const first = csvCells(lines[0]);
	const headed = first.findIndex((c) => HEADER.test(c));
	const column = headed >= 0 ? headed : 0;
	const rows = headed >= 0 ? lines.slice(1) : lines;
	return check(rows.map((l) => csvCells(l)[column] ?? ''));
}

/** Both at once (a form may carry pasted text and a file). */
export function mergeAddressLists(...lists: AddressList[]): AddressList {
	const valid: string[] = [];
	for (const l of lists) for (const a of l.valid) if (!valid.includes(a)) valid.push(a);
	return { valid, invalid: lists.flatMap((l) => l.invalid) };
}
