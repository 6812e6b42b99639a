/**
 * The API as an OpenAPI 3.1 document, built from the route table (routes.ts) with zod's own JSON Schema
 * output (`z.toJSONSchema`, draft 2020-12, which OpenAPI 3.1 uses as is). Served at
 * `GET /api/v1/openapi.json` and read at `/api`.
 */
import { z } from 'zod';
import { setupDocumentSchema } from '$lib/scene/document';
import { documentInputSchema } from '$lib/scene/inputs';
import { API_ROUTES, GROUPS, type ApiRoute } from './routes';
import { errorAnswer, staleSaveAnswer } from './answers';

export type JsonSchema = Record<string, unknown>;

/** The setup document as a body accepts it: `documentInputSchema` takes any version, so show the current one. */
let documentJson: JsonSchema | undefined;

/** A zod schema as JSON Schema, the way a client writes it (defaults may be left out). */
export function jsonSchemaOf(schema: z.ZodType): JsonSchema {
	const { $schema: _, ...rest } = z.toJSONSchema(schema, {
		target: 'draft-2020-12',
		io: 'input',
		// A transform (such as a tag list without repeats) stands for what it accepts.
		unrepresentable: 'any',
		override: (ctx) => {
			if (ctx.zodSchema !== documentInputSchema) return;
			documentJson ??= jsonSchemaOf(setupDocumentSchema);
			Object.assign(ctx.jsonSchema, documentJson);
		}
	});
	return rest;
}

const PATH_PARAMETERS: Record<string, { description: string; schema: z.ZodType }> = {
	id: { description: 'the id of the setup or gear item', schema: z.uuid() },
	n: { description: 'a revision number', schema: z.int().min(1) },
	shotId: { description: 'the id of a shot of the setup', schema: z.uuid() },
	variant: { description: 'which image: original, preview or thumbnail', schema: z.enum(['original', 'preview', 'thumbnail']) },
	sessionId: { description: 'the id of a shooting session of the setup', schema: z.uuid() },
	calibrationId: { description: 'the id of one of the flash’s calibrations', schema: z.uuid() }
};

const REFUSALS: Record<number, string> = {
	400: 'Bad input: `issues` name every field at fault',
	401: 'Not signed in',
	403: 'Signed in, but the role does not allow it',
	404: 'Not found, or not visible to the caller',
	409: 'Stale: `baseRevision` is not the latest revision (`latestRevision` says which is)',
	413: 'The body is too large',
	415: 'The body is not of a media type the route takes',
	503: 'A service the route needs (object storage) is unreachable for a moment'
};

function refusalsOf(route: ApiRoute): number[] {
	const statuses = new Set(route.refusals ?? []);
	if (route.body) [400, 413].forEach((s) => statuses.add(s));
	if (route.query || route.path.includes('{n}')) statuses.add(400);
	if (route.access === 'signed-in') [401, 403, 404].forEach((s) => statuses.add(s));
	if (route.access === 'development') statuses.add(404);
	return [...statuses].sort();
}

function parametersOf(route: ApiRoute) {
	const inPath = [...route.path.matchAll(/\{(\w+)\}/g)].map(([, name]) => ({
		name,
		in: 'path',
		required: true,
		description: PATH_PARAMETERS[name].description,
		schema: jsonSchemaOf(PATH_PARAMETERS[name].schema)
	}));
	const inQuery = Object.entries(route.query?.shape ?? {}).map(([name, field]) => {
		const schema = jsonSchemaOf(field as z.ZodType);
		return {
			name,
			in: 'query',
			required: !(field as z.ZodType).safeParse(undefined).success,
			...(typeof schema.description === 'string' ? { description: schema.description } : {}),
			schema
		};
	});
	return [...inPath, ...inQuery];
}

function operationOf(route: ApiRoute) {
	const { answer, body } = route;
	const responses: Record<string, unknown> = {
		[answer.status]: {
			description: answer.description,
			...(answer.schema || answer.mediaType
				? { content: { [answer.mediaType ?? 'application/json']: answer.schema ? { schema: jsonSchemaOf(answer.schema) } : {} } }
				: {})
		}
	};
	for (const status of refusalsOf(route)) {
		const schema = status === 409 ? jsonSchemaOf(staleSaveAnswer) : { $ref: '#/components/schemas/Error' };
		responses[status] = { description: REFUSALS[status], content: { 'application/json': { schema } } };
	}
	const parameters = parametersOf(route);
	return {
		tags: [route.group],
		summary: route.summary,
		...(route.description ? { description: route.description } : {}),
		security: route.access === 'signed-in' ? [{ session: [] }, { token: [] }] : [],
		...(parameters.length ? { parameters } : {}),
		...(body
			? {
					requestBody: {
						required: body.required ?? true,
						content: Object.fromEntries(
							(body.mediaTypes ?? ['application/json']).map((type) => [
								type,
								{
									schema:
										type === 'multipart/form-data'
											? { type: 'object', properties: { file: { type: 'string', contentMediaType: 'application/json' } }, required: ['file'] }
											: jsonSchemaOf(body.schema)
								}
							])
						)
					}
				}
			: {}),
		responses
	};
}

let built: JsonSchema | undefined;

/** The OpenAPI 3.1 document of every route in API_ROUTES, built once. */
export function openApiDocument(): JsonSchema {
	if (built) return built;
	const paths: Record<string, Record<string, unknown>> = {};
	for (const route of API_ROUTES) (paths[route.path] ??= {})[route.method] = operationOf(route);
	built = {
		openapi: '3.1.0',
		info: {
			title: 'Squarelaw API',
			version: '1',
			description:
				'The calculation API (public) and the setups API (signed in) of Squarelaw, a lighting-setup notebook. Paths, field names, units and meanings under /api/v1 are stable: fields are added, never renamed or re-united. Units: distances in metres, small lengths in millimetres (…Mm), micrometres (…Um) and nanometres (…Nm), time in seconds, angles in degrees, exposure offsets in stops (positive = over-exposed). Guide numbers are in metres at ISO 100 and full power, as the flash head is set. An f-number without qualifier is the marked aperture; the working aperture is N × (1 + m/P) for magnification m and pupil magnification P (default 1).'
		},
		tags: Object.values(GROUPS).map(({ name, description }) => ({ name, description })),
		paths,
		components: {
			schemas: { Error: jsonSchemaOf(errorAnswer) },
			securitySchemes: {
				session: { type: 'apiKey', in: 'cookie', name: 'authjs.session-token', description: 'The session cookie of an e-mail sign-in (Auth.js)' },
				token: { type: 'http', scheme: 'bearer', description: 'A personal access token made on the account page (`slw_…`)' }
			}
		}
	};
	return built;
}
