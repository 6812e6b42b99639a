/** The notes of two revisions: a line diff (the `diff` package) and a sentence about it. */
import { diffArrays } from 'diff';
import type { NotesChange } from './index';

export type LineDiffOp = { op: 'same' | 'added' | 'removed'; line: string };

/** Beyond this many changed lines the diff gives up and says the whole text was replaced. */
const MAX_EDIT_LINES = 2000;

const linesOf = (text: string) => (text === '' ? [] : text.split(/\r?\n/));

/** Two texts compared line by line; a replaced line reads as the new line, then the old one. */
export function diffLines(before: string, after: string): LineDiffOp[] {
	const a = linesOf(before);
	const b = linesOf(after);
	const changes = diffArrays(a, b, { maxEditLength: MAX_EDIT_LINES });
	if (!changes) return [...b.map((line) => ({ op: 'added' as const, line })), ...a.map((line) => ({ op: 'removed' as const, line }))];
	const ops: LineDiffOp[] = [];
	const push = (op: LineDiffOp['op'], lines: string[]) => lines.forEach((line) => ops.push({ op, line }));
	for (let i = 0; i < changes.length; i++) {
		const change = changes[i];
		const next = changes[i + 1];
		if (change.removed && next?.added) {
			push('added', next.value);
			push('removed', change.value);
			i++;
		} else push(change.added ? 'added' : change.removed ? 'removed' : 'same', change.value);
	}
	return ops;
}

export function notesChange(before: string, after: string): NotesChange {
	if (before === after) return { changed: false, linesAdded: 0, linesRemoved: 0, text: null, lines: [] };
	const lines = diffLines(before, after);
	const linesAdded = lines.filter((l) => l.op === 'added').length;
	const linesRemoved = lines.filter((l) => l.op === 'removed').length;
	let text: string;
	if (before.trim() === '') text = 'Notes written';
	else if (after.trim() === '') text = 'Notes cleared';
	else {
		const parts = [];
		if (linesAdded) parts.push(`${linesAdded} ${linesAdded === 1 ? 'line' : 'lines'} added`);
		if (linesRemoved) parts.push(`${linesRemoved} ${linesRemoved === 1 ? 'line' : 'lines'} removed`);
		text = `Notes changed${parts.length ? ` (${parts.join(', ')})` : ' (spacing only)'}`;
	}
	return { changed: true, linesAdded, linesRemoved, text, lines };
}
