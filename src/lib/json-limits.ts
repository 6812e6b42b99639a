/**
 * What any text or JSON we accept must be, whatever the field: checked once at the edge (request bodies,
 * uploaded files) and by the setup document's schema, and used to read back a stored document safely.
 *
 * - Text is stored in PostgreSQL, which refuses the NUL character (U+0000) in text and jsonb, and UTF-8
 *   has no encoding for a lone UTF-16 surrogate (`"\ud800"`, which JSON allows): either is refused with
 *   the field named, never stored, replaced or left to fail as a 500.
 * - JSON nests at most so deep and a container holds at most so many entries: pages, `JSON.stringify`
 *   and `structuredClone` recurse, and a few thousand levels overflow their stack.
 *
 * Pure TypeScript: the walks are iterative, so a body nested 100,000 levels deep is measured, not recursed.
 */

/** Levels of nesting a request body may have (a setup document has its own, tighter limit). */
export const MAX_BODY_DEPTH = 64;
/** Levels of nesting in a setup document (the document itself is level 0); the known fields use 5. */
export const MAX_DOCUMENT_DEPTH = 32;
/** Entries (keys or items) in any one object or array of a setup document. */
export const MAX_DOCUMENT_ENTRIES = 1000;

export interface JsonProblem {
	path: string[];
	message: string;
}

const LONE_SURROGATE = /[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/;

/** Why a string cannot be stored as text, or null when it can. */
export function unstorableTextProblem(text: string): string | null {
	if (text.includes('\u0000')) return 'must not contain the NUL character (U+0000)';
	const lone = LONE_SURROGATE.exec(text);
	if (lone) {
		const code = lone[0].charCodeAt(0).toString(16).toUpperCase();
		return `must not contain a lone UTF-16 surrogate (U+${code}), which is not a character`;
	}
	return null;
}

/** A key as it may appear in a path shown to people: the characters refused are written as escapes. */
export function printableKey(key: string): string {
	return key.replace(/[\u0000\ud800-\udfff]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

interface WalkLimits {
	maxDepth: number;
	/** Entries in one object or array; unlimited when left out. */
	maxEntries?: number;
}

/**
 * The first problem in a parsed JSON value, in document order: a string or key that is not storable
 * text, a container nested deeper than `maxDepth` (the value itself is level 0), or one holding more
 * than `maxEntries`. The path names the field at fault.
 */
export function findJsonProblem(value: unknown, { maxDepth, maxEntries = Infinity }: WalkLimits): JsonProblem | null {
	const stack: { value: unknown; path: string[] }[] = [{ value, path: [] }];
	while (stack.length) {
		const { value: v, path } = stack.pop()!;
		if (typeof v === 'string') {
			const problem = unstorableTextProblem(v);
			if (problem) return { path, message: problem };
			continue;
		}
		if (v === null || typeof v !== 'object') continue;
		if (path.length >= maxDepth) return { path, message: `nests more than ${maxDepth} levels deep` };
		const entries: [string, unknown][] = Array.isArray(v) ? v.map((item, i) => [String(i), item]) : Object.entries(v);
		if (entries.length > maxEntries) return { path, message: `must hold at most ${maxEntries} entries` };
		// Pushed in reverse so the walk meets fields in document order.
		for (let i = entries.length - 1; i >= 0; i--) {
			const [key, item] = entries[i];
			const keyProblem = unstorableTextProblem(key);
			if (keyProblem) return { path: [...path, printableKey(key)], message: `(a field name) ${keyProblem}` };
			stack.push({ value: item, path: [...path, key] });
		}
	}
	return null;
}

/**
 * A copy of a parsed JSON value without the objects and arrays that `findJsonProblem` finds nested too
 * deep (an object's field dropped, an array's item set to null), and the paths of what was left out.
 * The copy recurses at most `maxDepth` levels, so it is safe on any input.
 */
export function trimJson(value: unknown, maxDepth: number): { value: unknown; dropped: string[][] } {
	const dropped: string[][] = [];
	const copy = (v: unknown, path: string[]): unknown => {
		if (v === null || typeof v !== 'object') return v;
		if (Array.isArray(v)) {
			return v.map((item, i) => {
				if (path.length + 1 >= maxDepth && item !== null && typeof item === 'object') {
					dropped.push([...path, String(i)]);
					return null;
				}
				return copy(item, [...path, String(i)]);
			});
		}
		const out: Record<string, unknown> = {};
		for (const [key, item] of Object.entries(v)) {
			if (path.length + 1 >= maxDepth && item !== null && typeof item === 'object') {
				dropped.push([...path, key]);
				continue;
			}
			out[key] = copy(item, [...path, key]);
		}
		return out;
	};
	return { value: copy(value, []), dropped };
}
