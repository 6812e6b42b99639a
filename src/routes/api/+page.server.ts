import { openApiDocument } from '$lib/server/openapi';
import { apiReference } from '$lib/server/openapi/reference';

/** The API reference, read from the OpenAPI document that /api/v1/openapi.json serves. */
export function load() {
	const document = openApiDocument() as { info: { title: string; version: string; description: string } };
	return { info: document.info, groups: apiReference(document) };
}
