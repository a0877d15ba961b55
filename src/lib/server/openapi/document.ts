import type { z } from 'zod';
import { config } from '$lib/server/config';
import { answerResponse, components, extraResponse } from './answers';
import { queryParams, registryObject, zodSchema, type JsonSchema, type Parameter } from './registry-params';
import { pathParams, routes, tags, type Method, type Operation, type RouteTable } from './routes';

// The OpenAPI 3.1 document of /api/v1, from the route table (routes.ts), the tools' registries and
// the zod schemas the routes read with. Built once per process: nothing in it changes while it runs.

/** The session cookie Auth.js sets (`__Secure-` prefixed over https). */
export const sessionCookie = 'authjs.session-token';

const signingIn =
	'The API uses the session cookie the pages use. Sign in at /signin in a browser, or post the sign-in form ' +
	'(`POST /signin?/password` with `email` and `password` as application/x-www-form-urlencoded, an `Origin` header of this server ' +
	'and `x-sveltekit-action: true`), keep the cookie it sets (`__Secure-authjs.session-token` over https) and send it with every call. ' +
	'Writes from a page on another origin are refused.';

const overview =
	'The public API of Phasewright: trigger wheels, degree tapes, TDC, phasing and build sheets from their parameters (no account needed), ' +
	'and a workshop’s builds, wheel designs, records, photos and cutting packages (signed in). Every tool takes the same parameter names ' +
	'on its page, in its address and here, and the page and the API run one check, so a refusal reads the same in both. ' +
	'Lengths are read in `units` (mm unless units=in; fractions like 3 1/2 and a unit after the number, like 20 mm, are allowed). ' +
	'Bad parameters answer 400 with `refusals` (the first reason per field) and `errors` (the same as a field → "field: message" map). ' +
	'While the database is down, what needs it answers 503 with Retry-After. A request whose Host is not this server’s answers 421. ' +
	'Verify timing with a timing light before load; check every printout with a rule before cutting.';

const pathParamsOf = (path: string): Parameter[] =>
	[...path.matchAll(/\{(\w+)\}/g)].map(([, name = '']) => ({
		name,
		in: 'path',
		required: true,
		schema: pathParams[name] ?? { type: 'string', format: 'uuid' }
	}));

/** The request body of an entry, with a tool's parameters spelled out inside `params` (or the body itself). */
function requestBody(body: NonNullable<Operation['body']>, example: unknown): JsonSchema {
	if ('content' in body)
		return { required: true, content: Object.fromEntries(Object.entries(body.content).map(([type, schema]) => [type, { schema }])) };
	if ('multipart' in body) return { required: true, content: { 'multipart/form-data': { schema: body.multipart } } };
	let schema = '_zod' in body.json ? zodSchema(body.json as z.ZodType) : (body.json as JsonSchema);
	if (body.params) {
		const props = (schema.properties ?? {}) as Record<string, JsonSchema>;
		if (props.params) {
			const tool = registryObject(body.params, 'The tool’s parameters, by the names its query takes; each value text or a number.');
			schema = { ...schema, properties: { ...props, params: tool } };
		} else {
			// The tool's parameters are the body itself; the entry's own properties (points …) win.
			const tool = registryObject(body.params, 'The tool’s parameters.');
			const required = [...new Set([...((tool.required as string[]) ?? []), ...((schema.required as string[]) ?? [])])];
			schema = { ...tool, ...schema, properties: { ...(tool.properties as object), ...props }, ...(required.length ? { required } : {}) };
		}
	}
	const content: JsonSchema = { schema, ...(example === undefined ? {} : { example }) };
	return { required: true, content: { 'application/json': content } };
}

/** An example as the parameter's schema types it (a whole number is a number, not its text). */
const exampleValue = (p: Parameter, text: string): unknown =>
	(p.schema.type === 'integer' || p.schema.type === 'number') && Number.isFinite(Number(text)) ? Number(text) : text;

const ref = (name: keyof typeof components.responses) => ({ $ref: `#/components/responses/${name}` });

function operation(path: string, method: Method, op: Operation): JsonSchema {
	const query = op.query ? queryParams(op.query) : [];
	const example = op.example?.query ?? {};
	const parameters = [
		...pathParamsOf(path),
		...query.map((p) => {
			const given = example[p.name];
			return given === undefined ? p : { ...p, example: exampleValue(p, given) };
		})
	];
	const signedIn = op.access === 'read' || op.access === 'edit';
	const responses: Record<string, unknown> = { [op.answer.status]: answerResponse(op.answer) };
	if (op.query || op.body) responses['400'] = ref('Refused');
	if (signedIn) Object.assign(responses, { 401: ref('Unauthenticated'), 403: ref('Forbidden') });
	if (signedIn || pathParamsOf(path).length) responses['404'] = ref('NotFound');
	if (op.body) responses['413'] = ref('TooLarge');
	for (const extra of op.also ?? []) responses[extra.status] = extraResponse(extra);
	if (signedIn) responses['503'] = ref('Unavailable');
	const sorted = Object.fromEntries(Object.entries(responses).sort(([a], [b]) => Number(a) - Number(b)));
	return {
		operationId: `${method.toLowerCase()}${path.replace(/[^A-Za-z0-9]+(.)?/g, (_, c: string | undefined) => (c ?? '').toUpperCase())}`,
		tags: [op.tag],
		summary: op.summary,
		...(op.description ? { description: op.description } : {}),
		...(parameters.length ? { parameters } : {}),
		...(op.body ? { requestBody: requestBody(op.body, op.example?.body) } : {}),
		responses: sorted,
		...(signedIn ? { security: [{ session: [] }], 'x-role': op.access === 'edit' ? 'editor' : 'viewer' } : {})
	};
}

/** The document for a server at `origin` (scheme://host[:port]), from a route table. */
export function buildDocument(origin: string, table: RouteTable = routes): JsonSchema {
	const paths = Object.fromEntries(
		Object.entries(table).map(([path, methods]) => [
			path,
			Object.fromEntries(
				Object.entries(methods).map(([method, op]) => [method.toLowerCase(), operation(path, method as Method, op as Operation)])
			)
		])
	);
	return {
		openapi: '3.1.1',
		info: { title: 'Phasewright API', version: '1', description: overview },
		// From the configured ORIGIN only: a request's Host header names whatever the caller wrote.
		servers: [{ url: `${origin}/api/v1` }],
		tags: Object.entries(tags).map(([name, description]) => ({ name, description })),
		paths,
		components: {
			...components,
			securitySchemes: { session: { type: 'apiKey', in: 'cookie', name: sessionCookie, description: signingIn } }
		}
	};
}

let built: { origin: string; json: string; document: JsonSchema } | undefined;

/** The document of this server (its ORIGIN), built on first use. */
export function openApiDocument(): JsonSchema {
	const { origin } = config();
	if (built?.origin !== origin) {
		const document = buildDocument(origin);
		built = { origin, json: JSON.stringify(document), document };
	}
	return built.document;
}

/** The document as JSON text, serialised once. */
export function openApiJson(): string {
	openApiDocument();
	return built!.json;
}
