/**
 * A fast path for accepting a large, valid body: the zod schema turned into JSON Schema
 * (`z.toJSONSchema`) and compiled once by Ajv, which checks a six-light scene in a few microseconds where
 * zod's parse takes tens. Zod stays the one place the rules are written, and the only one that explains a
 * refusal: a body the fast check does not pass goes through zod as before, so every error still names
 * its field in zod's words. A body it passes is used as sent (zod would only have dropped unknown keys,
 * which the engine never reads), after the schema's rules across fields, which JSON Schema cannot say.
 *
 * Only for schemas without defaults or transforms (their output is their input); `fastAcceptor` refuses
 * the others when it compiles them, so a later change to a schema cannot silently skip a default.
 */
import { Ajv2020 } from 'ajv/dist/2020.js';
import { z } from 'zod';

export type Acceptor<T> = (raw: unknown) => raw is T;

// `unicode: false`: string lengths in UTF-16 units, as zod counts them. Ajv calls the option deprecated
// (it prefers code points) but honours it; its notice about that one option is all the logger drops.
const logger = {
	log: console.log,
	warn: (...args: unknown[]) => {
		if (!String(args[0]).startsWith('DEPRECATED: option unicode')) console.warn(...args);
	},
	error: console.error
};
const ajv = new Ajv2020({ strict: false, allErrors: false, validateFormats: false, unicode: false, discriminator: true, logger });

type JsonSchema = { [key: string]: unknown };

/**
 * zod writes a discriminated union as a plain `oneOf`, which Ajv checks by trying every branch (a light
 * against the flash, the continuous light and the reflector). Where each branch fixes the same required
 * property to its own constant, Ajv's `discriminator` picks the one branch to check: the same verdict,
 * since no two branches can share that constant (and every branch is an object).
 */
function markDiscriminators(node: unknown): void {
	if (Array.isArray(node)) return node.forEach(markDiscriminators);
	if (!node || typeof node !== 'object') return;
	const schema = node as JsonSchema;
	Object.values(schema).forEach(markDiscriminators);
	const branches = schema.oneOf as JsonSchema[] | undefined;
	if (!Array.isArray(branches) || !branches.length) return;
	const tag = (b: JsonSchema, key: string) => ((b.properties as Record<string, JsonSchema> | undefined)?.[key]?.const as unknown);
	const first = branches[0].properties as Record<string, JsonSchema> | undefined;
	const key = Object.keys(first ?? {}).find((k) => {
		const consts = branches.map((b) => tag(b, k));
		return (
			consts.every((c) => typeof c === 'string') &&
			new Set(consts).size === branches.length &&
			branches.every((b) => Array.isArray(b.required) && b.required.includes(k))
		);
	});
	if (!key || !branches.every((b) => b.type === 'object')) return;
	// Ajv applies `discriminator` to objects only, and skips the `oneOf` it replaces: say "object" here.
	schema.discriminator = { propertyName: key };
	schema.type = 'object';
}

/**
 * A check that says yes only to a body `schema` would accept unchanged. `rules` are the schema's rules
 * across fields, run on a body whose fields passed; any issue sends the body to zod for the full answer.
 */
export function fastAcceptor<S extends z.ZodType>(schema: S, rules: (value: z.output<S>) => readonly unknown[] = () => []): Acceptor<z.output<S>> {
	const json = z.toJSONSchema(schema, { io: 'input', unrepresentable: 'throw' });
	if (JSON.stringify(json).includes('"default"')) {
		throw new Error('fastAcceptor: the schema has defaults, so its output differs from its input; validate it with zod');
	}
	markDiscriminators(json);
	const validate = ajv.compile(json);
	return (raw: unknown): raw is z.output<S> => validate(raw) === true && rules(raw as z.output<S>).length === 0;
}
