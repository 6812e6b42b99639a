/**
 * The OpenAPI document as the `/api` page shows it: routes grouped by tag, and each body, query and
 * answer as a flat list of fields (dotted names, `[]` for list items, `{key}` for a map's values) with
 * their type, whether they are required and their limits. Read from the document itself, so the page
 * shows exactly what `/api/v1/openapi.json` publishes.
 */
import type { JsonSchema } from './index';

export interface FieldRow {
	name: string;
	type: string;
	required: boolean;
	notes: string;
}

export interface OperationView {
	anchor: string;
	method: string;
	path: string;
	summary: string;
	description: string;
	signedIn: boolean;
	parameters: (FieldRow & { in: string })[];
	body: { mediaTypes: string[]; required: boolean; fields: FieldRow[] } | null;
	answer: { status: string; description: string; mediaType: string | null; fields: FieldRow[] };
	refusals: { status: string; description: string }[];
}

export interface GroupView {
	name: string;
	description: string;
	operations: OperationView[];
}

type Schema = JsonSchema & {
	type?: string | string[];
	properties?: Record<string, Schema>;
	required?: string[];
	items?: Schema | false;
	prefixItems?: Schema[];
	additionalProperties?: Schema | boolean;
	anyOf?: Schema[];
	oneOf?: Schema[];
	enum?: unknown[];
	const?: unknown;
	$ref?: string;
};

const MAX_DEPTH = 6;

/** A schema's type in a few words: `number`, `string (uuid)`, `"a" | "b"`, `[number, number]`, `T | null`. */
function typeOf(s: Schema): string {
	if (s.const !== undefined) return JSON.stringify(s.const);
	if (s.enum) return s.enum.map((v) => JSON.stringify(v)).join(' | ');
	const variants = s.anyOf ?? s.oneOf;
	if (variants) {
		const types = [...new Set(variants.map(typeOf))];
		return types.length > 3 ? 'one of several' : types.join(' | ');
	}
	if (s.type === 'array') {
		if (s.prefixItems) return `[${s.prefixItems.map(typeOf).join(', ')}]`;
		return s.items ? `${typeOf(s.items)}[]` : 'array';
	}
	if (s.type === 'string' && typeof s.format === 'string') return `string (${s.format})`;
	if (s.type === 'object' && s.additionalProperties && !s.properties) return 'map';
	if (Array.isArray(s.type)) return s.type.join(' | ');
	return s.type ?? 'any';
}

/** Limits, default and description, e.g. "> 0, ≤ 1 · default 1". */
function notesOf(s: Schema): string {
	const notes: string[] = [];
	const bound = (key: string, sign: string) => {
		const v = s[key];
		if (typeof v === 'number' && Math.abs(v) < Number.MAX_SAFE_INTEGER) notes.push(`${sign} ${v}`);
	};
	bound('exclusiveMinimum', '>');
	bound('minimum', '≥');
	bound('exclusiveMaximum', '<');
	bound('maximum', '≤');
	const count = (n: number, unit: string) => `${n} ${unit}${n === 1 ? '' : 's'}`;
	if (typeof s.minLength === 'number' && s.minLength > 0) notes.push(`at least ${count(s.minLength, 'character')}`);
	if (typeof s.maxLength === 'number') notes.push(`at most ${count(s.maxLength, 'character')}`);
	if (typeof s.minItems === 'number' && s.minItems > 0 && !s.prefixItems) notes.push(`at least ${count(s.minItems, 'item')}`);
	if (typeof s.maxItems === 'number' && !s.prefixItems) notes.push(`at most ${count(s.maxItems, 'item')}`);
	if (s.pattern === '^\\d+$') notes.push('a whole number');
	const parts = [notes.join(', ')];
	if (s.default !== undefined) parts.push(`default ${JSON.stringify(s.default)}`);
	if (typeof s.description === 'string') parts.push(s.description);
	return parts.filter(Boolean).join(' · ');
}

/** The variant's tag, e.g. `kind "flash"`, from the first property that is a constant. */
function variantLabel(s: Schema): string | null {
	const tag = Object.entries(s.properties ?? {}).find(([, p]) => p.const !== undefined);
	return tag ? `${tag[0]} ${JSON.stringify(tag[1].const)}` : null;
}

/** The fields inside a schema, each nested object, list item and map value flattened under its name. */
function fieldsOf(schema: Schema, resolve: (s: Schema) => Schema, prefix = '', depth = 0, when = ''): FieldRow[] {
	const s = resolve(schema);
	if (depth > MAX_DEPTH) return [];
	const rows: FieldRow[] = [];
	const variants = (s.oneOf ?? s.anyOf)?.filter((v) => resolve(v).type !== 'null');
	if (variants && variants.length > 0) {
		for (const v of variants) {
			const label = variantLabel(resolve(v));
			rows.push(...fieldsOf(v, resolve, prefix, depth + 1, label ? `when ${label}` : when));
		}
		return rows;
	}
	if (s.type === 'array' && s.items && !s.prefixItems) return fieldsOf(s.items, resolve, `${prefix}[]`, depth + 1, when);
	if (s.type !== 'object') return rows;
	if (!s.properties && typeof s.additionalProperties === 'object') {
		return fieldsOf(s.additionalProperties, resolve, `${prefix}{key}`, depth + 1, when);
	}
	for (const [key, raw] of Object.entries(s.properties ?? {})) {
		const prop = resolve(raw);
		const name = prefix ? `${prefix}.${key}` : key;
		rows.push({ name, type: typeOf(prop), required: s.required?.includes(key) ?? false, notes: [when, notesOf(prop)].filter(Boolean).join(' · ') });
		rows.push(...fieldsOf(prop, resolve, name, depth + 1, when));
	}
	return rows;
}

type Operation = {
	tags?: string[];
	summary?: string;
	description?: string;
	security?: unknown[];
	parameters?: { name: string; in: string; required?: boolean; description?: string; schema: Schema }[];
	requestBody?: { required?: boolean; content: Record<string, { schema?: Schema }> };
	responses: Record<string, { description: string; content?: Record<string, { schema?: Schema }> }>;
};

/** The document's routes grouped by their tag, in the document's order. */
export function apiReference(document: JsonSchema): GroupView[] {
	const doc = document as {
		tags: { name: string; description: string }[];
		paths: Record<string, Record<string, Operation>>;
		components: { schemas: Record<string, Schema> };
	};
	const resolve = (s: Schema): Schema => (s.$ref ? doc.components.schemas[s.$ref.split('/').pop()!] : s);
	const groups: GroupView[] = doc.tags.map((t) => ({ name: t.name, description: t.description, operations: [] }));
	for (const [path, operations] of Object.entries(doc.paths)) {
		for (const [method, op] of Object.entries(operations)) {
			// The answer a route is for: its 2xx, or for a route that only fails (`/api/dev/fail`) its one answer.
			const responses = Object.entries(op.responses);
			const [status, answer] = responses.find(([code]) => code.startsWith('2')) ?? responses[0];
			const answerMedia = answer.content ? Object.keys(answer.content)[0] : null;
			const bodyMedia = op.requestBody ? Object.keys(op.requestBody.content) : [];
			const view: OperationView = {
				anchor: `${method}-${path.replace(/[^a-z0-9]+/gi, '-').replace(/^-|-$/g, '')}`,
				method: method.toUpperCase(),
				path,
				summary: op.summary ?? '',
				description: op.description ?? '',
				signedIn: (op.security?.length ?? 0) > 0,
				parameters: (op.parameters ?? []).map((p) => ({
					in: p.in,
					name: p.name,
					type: typeOf(p.schema),
					required: p.required ?? false,
					notes: notesOf(p.schema)
				})),
				body: op.requestBody
					? {
							mediaTypes: bodyMedia,
							required: op.requestBody.required ?? false,
							fields: fieldsOf(op.requestBody.content[bodyMedia[0]].schema ?? {}, resolve)
						}
					: null,
				answer: {
					status,
					description: answer.description,
					mediaType: answerMedia,
					fields: answerMedia ? fieldsOf(answer.content![answerMedia].schema ?? {}, resolve) : []
				},
				refusals: responses
					.filter(([code]) => code !== status)
					.map(([code, r]) => ({ status: code, description: r.description }))
			};
			groups.find((g) => g.name === op.tags?.[0])?.operations.push(view);
		}
	}
	return groups.filter((g) => g.operations.length > 0);
}
