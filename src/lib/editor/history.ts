/**
 * Undo and redo by gesture. The history is a stack of reversible diffs and marks: a mark is set when
 * a gesture or a discrete change begins, every diff after it is squashed into one, and one undo takes
 * the model back to the mark before. `bail()` (Escape during a drag) returns to the last mark and
 * forgets what came after it, leaving nothing to redo.
 */
import { emptyDiff, isEmptyDiff, reverseDiff, squashInto, type ModelDiff } from './model/diff';

type Entry = { type: 'mark'; id: string } | { type: 'diff'; diff: ModelDiff };

let markCounter = 0;

export class History {
	#undos: Entry[] = [];
	#redos: Entry[] = [];
	/** Entries kept before the oldest are dropped (a long session stays small). */
	readonly limit: number;

	constructor(limit = 500) {
		this.limit = limit;
	}

	/** Begins a step. Returns the mark's id for `bailToMark`. */
	mark(id = `mark-${++markCounter}`): string {
		this.#undos.push({ type: 'mark', id });
		this.#trim();
		return id;
	}

	/** Records a change: squashed into the step in progress. Clears what could be redone. */
	record(diff: ModelDiff): void {
		if (isEmptyDiff(diff)) return;
		this.#redos = [];
		const top = this.#undos.at(-1);
		if (top?.type === 'diff') {
			squashInto(top.diff, diff);
			// Changes that cancel out (added then removed) leave no step behind.
			if (isEmptyDiff(top.diff)) this.#undos.pop();
		} else this.#undos.push({ type: 'diff', diff: squashInto(emptyDiff(), diff) });
		this.#trim();
	}

	get canUndo(): boolean {
		return this.#undos.some((e) => e.type === 'diff');
	}

	get canRedo(): boolean {
		return this.#redos.some((e) => e.type === 'diff');
	}

	/** The diff that undoes the last step (to apply to the model), or null. */
	undo(): ModelDiff | null {
		if (!this.canUndo) return null;
		// Marks with nothing after them (a click that did not drag) are not steps.
		while (this.#undos.at(-1)?.type === 'mark') this.#undos.pop();
		const toApply = emptyDiff();
		while (this.#undos.length) {
			const entry = this.#undos.pop()!;
			this.#redos.push(entry);
			if (entry.type === 'mark') break;
			squashInto(toApply, reverseDiff(entry.diff));
		}
		return toApply;
	}

	/** The diff that redoes the last undone step, or null. */
	redo(): ModelDiff | null {
		if (!this.canRedo) return null;
		const toApply = emptyDiff();
		while (this.#redos.at(-1)?.type === 'mark') this.#undos.push(this.#redos.pop()!);
		while (this.#redos.length && this.#redos.at(-1)!.type === 'diff') {
			const entry = this.#redos.pop() as Extract<Entry, { type: 'diff' }>;
			this.#undos.push(entry);
			squashInto(toApply, entry.diff);
		}
		return toApply;
	}

	/** Back to the last mark, forgetting the changes since (and the mark). The diff to apply, or null. */
	bail(): ModelDiff | null {
		const top = [...this.#undos].reverse().find((e) => e.type === 'mark');
		return top?.type === 'mark' ? this.bailToMark(top.id) : null;
	}

	/** Back to a given mark, forgetting every change since (and the mark). Null if the mark is gone. */
	bailToMark(id: string): ModelDiff | null {
		const at = this.#undos.findLastIndex((e) => e.type === 'mark' && e.id === id);
		if (at < 0) return null;
		const toApply = emptyDiff();
		for (const entry of this.#undos.splice(at).reverse()) {
			if (entry.type === 'diff') squashInto(toApply, reverseDiff(entry.diff));
		}
		return toApply;
	}

	/** Is this mark still on the stack (a gesture in progress can still bail to it)? */
	hasMark(id: string): boolean {
		return this.#undos.some((e) => e.type === 'mark' && e.id === id);
	}

	clear(): void {
		this.#undos = [];
		this.#redos = [];
	}

	/** Number of undoable steps (for tests and the menu). */
	get undoSteps(): number {
		let steps = 0;
		let inStep = false;
		for (const e of this.#undos) {
			if (e.type === 'mark') inStep = false;
			else if (!inStep) {
				steps++;
				inStep = true;
			}
		}
		return steps;
	}

	#trim() {
		if (this.#undos.length <= this.limit) return;
		// Drop whole steps from the bottom: up to the second mark.
		const excess = this.#undos.length - this.limit;
		let cut = excess;
		while (cut < this.#undos.length && this.#undos[cut].type !== 'mark') cut++;
		this.#undos.splice(0, cut);
	}
}
