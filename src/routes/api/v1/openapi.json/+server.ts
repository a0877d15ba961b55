import { openApiJson } from '$lib/server/openapi/document';

/** The OpenAPI 3.1 document of this API, built once per process from the route table and the tools' registries. */
export function GET() {
	return new Response(openApiJson(), {
		headers: { 'content-type': 'application/json', 'cache-control': 'public, max-age=3600' }
	});
}
