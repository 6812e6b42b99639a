// The OpenAPI document against the code: every `+server.ts` under src/routes/api and each method it
// exports is in the document (and nothing else is), and the document is valid OpenAPI 3.1 by the
// specification's own JSON Schema (@seriousme/openapi-schema-validator).
import fs from 'node:fs';
import path from 'node:path';
import { Validator } from '@seriousme/openapi-schema-validator';
import { describe, expect, it } from 'vitest';
import { openApiDocument } from './index';

const ROUTES_DIR = path.join(process.cwd(), 'src', 'routes');
const METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'];

/** `src/routes/api/v1/setups/[id]/+server.ts` → `/api/v1/setups/{id}`, with the methods it exports. */
function serverRoutes(dir: string): { path: string; methods: string[] }[] {
	const found: { path: string; methods: string[] }[] = [];
	for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
		const full = path.join(dir, entry.name);
		if (entry.isDirectory()) found.push(...serverRoutes(full));
		else if (entry.name === '+server.ts') {
			const source = fs.readFileSync(full, 'utf8');
			const methods = METHODS.filter((m) => new RegExp(`export\\s+(?:const|(?:async\\s+)?function)\\s+${m}\\b`).test(source));
			const route = '/' + path.relative(ROUTES_DIR, dir).split(path.sep).join('/').replace(/\[(\w+)(?:=\w+)?\]/g, '{$1}');
			found.push({ path: route, methods });
		}
	}
	return found;
}

describe('the OpenAPI document', () => {
	const document = openApiDocument() as { paths: Record<string, Record<string, unknown>> };

	it('has every route folder under src/routes/api with each method it exports, and nothing more', () => {
		const inCode = serverRoutes(path.join(ROUTES_DIR, 'api'));
		expect(inCode.map((r) => r.path)).toContain('/api/v1/setups/{id}/revisions/{n}/thumbnail');
		const fromCode = inCode.flatMap((r) => r.methods.map((m) => `${m} ${r.path}`)).sort();
		const fromDocument = Object.entries(document.paths)
			.flatMap(([p, ops]) => Object.keys(ops).map((m) => `${m.toUpperCase()} ${p}`))
			.sort();
		expect(fromCode.length).toBeGreaterThan(20);
		expect(fromDocument).toEqual(fromCode);
	});

	it('is valid OpenAPI 3.1', async () => {
		const validator = new Validator();
		const result = await validator.validate(structuredClone(document));
		expect(result, JSON.stringify(result.errors)?.slice(0, 2000)).toEqual({ valid: true });
		expect(validator.version).toBe('3.1');
	});

	it('the validator would catch a broken document (a parameter in the body, as OpenAPI 2 had it)', async () => {
		const broken = structuredClone(document) as any;
		broken.paths['/api/v1/setups/{id}'].get.parameters[0].in = 'body';
		expect((await new Validator().validate(broken)).valid).toBe(false);
	});

	it('writes each body from its zod schema: names, types, limits and required fields', () => {
		const flash = document.paths['/api/v1/calc/flash'].post as any;
		const schema = flash.requestBody.content['application/json'].schema;
		expect(schema.required).toEqual(['guideNumber', 'distance']);
		expect(schema.properties.power).toMatchObject({ type: 'number', exclusiveMinimum: 0, maximum: 1, default: 1 });
		// The setup document is shown as the current version, not as "anything" (it is migrated on read).
		const save = (document.paths['/api/v1/setups/{id}'].put as any).requestBody.content['application/json'].schema;
		expect(save.properties.document.properties.scene.required).toEqual(['camera', 'subject', 'lights']);
		expect(Object.keys((document.paths['/api/v1/setups/{id}'].put as any).responses)).toContain('409');
	});
});
