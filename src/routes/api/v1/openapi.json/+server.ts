import { json } from '@sveltejs/kit';
import { openApiDocument } from '$lib/server/openapi';

/** The API as OpenAPI 3.1, built from the route table in $lib/server/openapi/routes.ts; read it at /api. */
export function GET() {
	return json(openApiDocument(), { headers: { 'cache-control': 'public, max-age=300' } });
}
