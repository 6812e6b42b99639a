import { describe, expect, it } from 'vitest';
import { findJsonProblem, trimJson, unstorableTextProblem } from './json-limits';

/** `{"a":{"a":…1…}}` nested `levels` deep, parsed. */
function nested(levels: number): unknown {
	return JSON.parse('{"a":'.repeat(levels) + '1' + '}'.repeat(levels));
}

describe('unstorableTextProblem', () => {
	it('refuses NUL and lone surrogates, accepts any other text', () => {
		expect(unstorableTextProblem('a\u0000b')).toMatch(/NUL/);
		expect(unstorableTextProblem('a\ud800b')).toMatch(/lone UTF-16 surrogate \(U\+D800\)/);
		expect(unstorableTextProblem('a\udc00')).toMatch(/U\+DC00/);
		expect(unstorableTextProblem('\udbff')).toMatch(/U\+DBFF/);
		expect(unstorableTextProblem('quartz 🪨 f/16 — Ø 5 mm\t\n')).toBeNull();
		expect(unstorableTextProblem('')).toBeNull();
	});
});

describe('findJsonProblem', () => {
	it('names the first field with text that cannot be stored, keys included', () => {
		expect(findJsonProblem({ title: 'ok', document: { notes: 'x\u0000' } }, { maxDepth: 64 })).toEqual({
			path: ['document', 'notes'],
			message: expect.stringMatching(/NUL/)
		});
		expect(findJsonProblem({ tags: ['a', 'b\ud800'] }, { maxDepth: 64 })?.path).toEqual(['tags', '1']);
		const key = findJsonProblem({ plan: { ['x\u0000']: 1 } }, { maxDepth: 64 });
		expect(key?.path).toEqual(['plan', 'x\\u0000']);
		expect(key?.message).toMatch(/field name/);
	});

	it('bounds nesting without recursing, however deep the value', () => {
		expect(findJsonProblem(nested(32), { maxDepth: 32 })).toBeNull();
		const deep = findJsonProblem(nested(33), { maxDepth: 32 });
		expect(deep?.path).toHaveLength(32);
		expect(deep?.message).toBe('nests more than 32 levels deep');
		expect(findJsonProblem(nested(100_000), { maxDepth: 64 })?.message).toMatch(/64 levels/);
		expect(findJsonProblem(JSON.parse('['.repeat(100_000) + ']'.repeat(100_000)), { maxDepth: 64 })).not.toBeNull();
	});

	it('bounds the entries of any one object or array', () => {
		expect(findJsonProblem({ x: Array(1000).fill(0) }, { maxDepth: 8, maxEntries: 1000 })).toBeNull();
		expect(findJsonProblem({ x: { y: Array(1001).fill(0) } }, { maxDepth: 8, maxEntries: 1000 })).toEqual({
			path: ['x', 'y'],
			message: 'must hold at most 1000 entries'
		});
	});
});

describe('trimJson', () => {
	it('leaves out what nests too deep and says where, keeping everything else', () => {
		const value = { keep: { a: [1, { b: 2 }] }, deep: nested(50), list: [nested(40), 'x'] };
		const { value: trimmed, dropped } = trimJson(value, 4);
		expect(findJsonProblem(trimmed, { maxDepth: 4 })).toBeNull();
		expect((trimmed as typeof value).keep).toEqual({ a: [1, { b: 2 }] });
		expect((trimmed as { list: unknown[] }).list).toEqual([{ a: {} }, 'x']);
		expect(dropped).toEqual([
			['deep', 'a', 'a', 'a'],
			['list', '0', 'a', 'a']
		]);
	});

	it('copies a value within the limit unchanged', () => {
		const value = { a: [1, 'two', null, { b: true }] };
		expect(trimJson(value, 32)).toEqual({ value, dropped: [] });
	});
});
