/** The shape of a row of the route table (`routes.ts`) and the groups the OpenAPI document sorts routes into. */
import type { z } from 'zod';

export type HttpMethod = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** Who may call a route: anyone, a signed-in caller (session cookie or bearer token), or only in development. */
export type Access = 'public' | 'signed-in' | 'development';

export interface ApiRoute {
	method: HttpMethod;
	/** OpenAPI's form: `/api/v1/setups/{id}` for the route folder `setups/[id]`. */
	path: string;
	group: string;
	access: Access;
	summary: string;
	description?: string;
	query?: z.ZodObject;
	body?: { schema: z.ZodType; required?: boolean; mediaTypes?: string[] };
	answer: { status: number; description: string; schema?: z.ZodType; mediaType?: string };
	/** Error answers beyond the ones every route of its access level can give (API errors share one body). */
	refusals?: number[];
}

/** What a row says beyond its method, path, group, access and summary. */
export type RouteDetails = Omit<ApiRoute, 'method' | 'path' | 'group' | 'access' | 'summary'>;

/** A maker of rows for routes that share a group, who may call them and the start of their path. */
export function routesOf(group: string, access: Access, basePath: string) {
	return (method: HttpMethod, rest: string, summary: string, details: RouteDetails): ApiRoute => ({
		method,
		path: `${basePath}${rest}`,
		group,
		access,
		summary,
		...details
	});
}

export const GROUPS = {
	calc: { name: 'Calculations', description: 'The exposure and optics math. No sign-in; bad input is a 400 naming the field, never a 500.' },
	setups: {
		name: 'Setups',
		description:
			'The notebook: setups, their revisions, trash, export and import. Session cookie or `Authorization: Bearer` personal access token. A setup the caller may not see is a 404.'
	},
	shots: {
		name: 'Shots',
		description:
			'Photographs of a setup, their EXIF, predicted against actual exposure, shooting sessions and the pre-shot checklist. Viewers read; editors upload, measure, calibrate and delete. A shot of a setup the caller may not see is a 404, its images included.'
	},
	gear: { name: 'Gear shelf', description: 'Flashes, modifiers, reflectors, lenses and cameras of a studio. Signed in.' },
	meta: { name: 'Service', description: 'Health and this document.' },
	dev: { name: 'Development only', description: 'Present when the local mail fake runs (development and tests), never in production.' }
} as const;
