import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { exposureSceneSchema, exposureSceneShape, sceneRuleIssues } from '$lib/light/schema';
import { fastAcceptor } from './fast-accept';

const accept = fastAcceptor(exposureSceneShape, sceneRuleIssues);

const scene = {
	camera: { iso: 200, aperture: 16, shutter: 1 / 160, magnification: 0.5, lossStops: 0.3 },
	subject: { position: [0, 0, 0.05] },
	ambient: { ev100: 11, kelvin: 6500 },
	lights: [
		{ id: 'key', kind: 'flash', position: [-0.3, 0.1, 0.25], guideNumber: 24, power: 0.25, lossStops: 1 },
		{ id: 'lamp', kind: 'continuous', position: [0.6, -0.4, 0.5], luxAt1m: 3000, runsHot: false },
		{ id: 'card', kind: 'reflector', position: [0.25, -0.05, 0.1], areaM2: 0.06, reflectance: 0.85, surface: 'diffuse', source: 'key' }
	],
	flags: [{ id: 'black', from: [0.4, 0.3], to: [0.45, -0.5] }]
};

/** A copy of `value` with the thing at `path` replaced (or removed, for `undefined`). */
function withAt(value: unknown, path: (string | number)[], replacement: unknown): unknown {
	if (path.length === 0) return replacement;
	const copy = (Array.isArray(value) ? [...value] : { ...(value as object) }) as Record<string | number, unknown>;
	const [head, ...rest] = path;
	const next = withAt(copy[head], rest, replacement);
	if (next === undefined) delete copy[head];
	else copy[head] = next;
	return copy;
}

/** Every path in a JSON value, so a mutation can land anywhere in the scene. */
function pathsOf(value: unknown, prefix: (string | number)[] = []): (string | number)[][] {
	const here = [prefix];
	if (Array.isArray(value)) return [...here, ...value.flatMap((v, i) => pathsOf(v, [...prefix, i]))];
	if (value && typeof value === 'object') return [...here, ...Object.entries(value).flatMap(([k, v]) => pathsOf(v, [...prefix, k]))];
	return here;
}

const PATHS = pathsOf(scene);
const jsonish = fc.oneof(
	fc.constant(undefined),
	fc.constant(null),
	fc.boolean(),
	fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e6, max: 1e6 }),
	fc.constantFrom(0, -1, 1, 0.5, 1e9, 100, 101),
	fc.string({ maxLength: 5 }),
	fc.constantFrom('ambient', 'key', 'lamp', 'card', 'flash', 'reflector', 'specular', 'x'.repeat(101), '😀'.repeat(51)),
	fc.array(fc.double({ noNaN: true, noDefaultInfinity: true, min: -2, max: 2 }), { maxLength: 4 }),
	fc.constant({})
);

describe('fastAcceptor (Ajv from the zod schema)', () => {
	it('accepts the valid scene, as zod does', () => {
		expect(exposureSceneSchema.safeParse(scene).success).toBe(true);
		expect(accept(scene)).toBe(true);
	});

	it('never accepts a body zod refuses (2 000 random mutations anywhere in a scene)', () => {
		fc.assert(
			fc.property(fc.array(fc.tuple(fc.constantFrom(...PATHS), jsonish), { minLength: 1, maxLength: 3 }), (mutations) => {
				const body = mutations.reduce<unknown>((b, [path, v]) => withAt(b, path, v), scene);
				if (accept(body)) expect(exposureSceneSchema.safeParse(body).success).toBe(true);
			}),
			{ numRuns: 2000 }
		);
	});

	it('sends what JSON Schema cannot say to zod: tuple lengths, the rules across fields, UTF-16 lengths', () => {
		const refused = [
			withAt(scene, ['subject', 'position'], [0, 0]),
			withAt(scene, ['subject', 'position'], [0, 0, 0, 0]),
			withAt(scene, ['lights', 1, 'id'], 'key'), // duplicate id: a rule across fields
			withAt(scene, ['lights', 2, 'source'], 'nobody'),
			withAt(scene, ['lights', 0, 'id'], '😀'.repeat(51)), // 102 UTF-16 units, over zod's 100
			withAt(scene, ['lights', 0, 'kind'], 'strobe'),
			withAt(scene, ['lights'], undefined)
		];
		for (const body of refused) {
			expect(accept(body)).toBe(false);
			expect(exposureSceneSchema.safeParse(body).success).toBe(false);
		}
	});

	it('refuses to compile a schema with defaults, whose output is not its input', () => {
		expect(() => fastAcceptor(z.object({ iso: z.number().default(100) }))).toThrow(/defaults/);
	});
});
