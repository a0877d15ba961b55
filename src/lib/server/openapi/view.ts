import type { JsonSchema } from './registry-params';

// The API page's reading of the OpenAPI document: the same document the API serves, grouped by tag,
// each route with its parameters in words and an example request. Nothing here knows a route.

export interface ParamRow {
	name: string;
	where: 'query' | 'path' | 'body';
	label?: string;
	/** What it takes, in short words: "whole number 1 to 720", "length 10 to 2000 mm", "one of mm, in". */
	takes: string;
	required: boolean;
	default?: string;
	description?: string;
}

export interface AnswerRow {
	status: string;
	description: string;
	/** Content types; a JSON answer also lists its top-level fields. */
	types: string[];
	fields: string[];
}

export interface OperationView {
	id: string;
	method: string;
	path: string;
	summary: string;
	description?: string;
	access: string;
	params: ParamRow[];
	bodyType?: string;
	answers: AnswerRow[];
	example: string;
}

export interface TagView {
	name: string;
	slug: string;
	description: string;
	operations: OperationView[];
}

type Doc = {
	servers: { url: string }[];
	tags: { name: string; description: string }[];
	paths: Record<string, Record<string, JsonSchema>>;
	components: { responses: Record<string, JsonSchema> };
};

const slug = (s: string) => s.toLowerCase().replace(/[^a-z0-9]+/g, '-');

/** A schema's value in short words. */
export function takesWords(schema: JsonSchema, rangeMm?: { minimum: number; maximum: number }, unit?: string): string {
	const u = unit ? (unit === '°' ? '°' : ` ${unit}`) : '';
	const range = schema.minimum !== undefined && schema.maximum !== undefined ? ` ${schema.minimum} to ${schema.maximum}${u}` : '';
	const types = ([] as unknown[]).concat(schema.type ?? []);
	if (rangeMm) return `length ${rangeMm.minimum} to ${rangeMm.maximum} mm (in units)`;
	if (Array.isArray(schema.enum)) return `one of ${schema.enum.join(', ')}`;
	if (types.includes('integer')) return `whole number${range}`;
	if (types.includes('number')) return `number${range}`;
	if (schema.format === 'uuid') return 'id (UUID)';
	if (schema.format === 'email') return 'e-mail address';
	if (types.includes('array')) return schema.maxItems !== undefined ? `list, at most ${schema.maxItems}` : 'list';
	if (types.includes('object')) return 'object';
	if (typeof schema.maxLength === 'number') return `text, at most ${schema.maxLength} characters`;
	return 'text';
}

const defaultWords = (schema: JsonSchema) =>
	schema.default === undefined || schema.default === ''
		? undefined
		: typeof schema.default === 'string'
			? schema.default
			: JSON.stringify(schema.default);

function bodyRows(schema: JsonSchema, prefix = ''): ParamRow[] {
	const required = new Set((schema.required as string[] | undefined) ?? []);
	const rows: ParamRow[] = [];
	for (const [name, prop] of Object.entries((schema.properties ?? {}) as Record<string, JsonSchema>)) {
		rows.push({
			name: `${prefix}${name}`,
			where: 'body',
			takes: takesWords(prop),
			required: required.has(name),
			default: defaultWords(prop),
			description: typeof prop.description === 'string' ? prop.description : undefined
		});
		// A tool's parameters inside `params` are listed one by one, as the tool's query takes them.
		if (prop.properties && name === 'params') rows.push(...bodyRows(prop, 'params.'));
	}
	return rows;
}

function exampleOf(server: string, method: string, path: string, op: JsonSchema): string {
	const params = (op.parameters ?? []) as { in: string; name: string; example?: unknown }[];
	const query = new URLSearchParams(
		params.filter((p) => p.in === 'query' && p.example !== undefined).map((p) => [p.name, String(p.example)])
	);
	const url = `${server}${path}${query.size ? `?${query}` : ''}`;
	const body = (op.requestBody as { content?: Record<string, { example?: unknown }> } | undefined)?.content;
	const lines = [`curl${method === 'get' ? '' : ` -X ${method.toUpperCase()}`} '${url}'`];
	if (op.security) lines.push(`  -b 'authjs.session-token=…'`);
	if (body?.['application/json']?.example !== undefined)
		lines.push(`  -H 'content-type: application/json'`, `  -d '${JSON.stringify(body['application/json'].example)}'`);
	if (body?.['multipart/form-data']) lines.push(`  -F 'file=@wheel.jpg'`);
	return lines.join(' \\\n');
}

function answersOf(op: JsonSchema, shared: Record<string, JsonSchema>): AnswerRow[] {
	return Object.entries(op.responses as Record<string, JsonSchema>).map(([status, r]) => {
		const ref = typeof r.$ref === 'string' ? r.$ref.split('/').pop()! : undefined;
		const response = (ref ? shared[ref] : r) ?? {};
		const content = (response.content ?? {}) as Record<string, { schema?: JsonSchema }>;
		const schema = content['application/json']?.schema;
		return {
			status,
			description: String(response.description ?? ''),
			types: Object.keys(content),
			fields: status.startsWith('2') && schema?.properties ? Object.keys(schema.properties as object) : []
		};
	});
}

/** The document as the API page shows it. */
export function apiView(document: JsonSchema): TagView[] {
	const doc = document as unknown as Doc;
	const server = doc.servers[0]?.url ?? '';
	const groups = new Map<string, TagView>(
		doc.tags.map((t) => [t.name, { name: t.name, slug: slug(t.name), description: t.description, operations: [] }])
	);
	for (const [path, ops] of Object.entries(doc.paths)) {
		for (const [method, op] of Object.entries(ops)) {
			const params = ((op.parameters ?? []) as JsonSchema[]).map((p): ParamRow => ({
				name: String(p.name),
				where: p.in as 'query' | 'path',
				label: p['x-label'] as string | undefined,
				takes: takesWords(p.schema as JsonSchema, p['x-range-mm'] as { minimum: number; maximum: number }, p['x-unit'] as string),
				required: p.required === true,
				default: defaultWords(p.schema as JsonSchema),
				description: typeof p.description === 'string' ? p.description : undefined
			}));
			const content = (op.requestBody as { content?: Record<string, { schema: JsonSchema }> } | undefined)?.content ?? {};
			const [bodyType, body] = Object.entries(content)[0] ?? [];
			const role = op['x-role'];
			groups.get((op.tags as string[])[0] ?? '')?.operations.push({
				id: String(op.operationId),
				method: method.toUpperCase(),
				path,
				summary: String(op.summary),
				description: op.description as string | undefined,
				access: role ? `Signed in, ${role} or above` : 'No account needed',
				params: [...params, ...(body ? bodyRows(body.schema) : [])],
				bodyType,
				answers: answersOf(op, doc.components.responses),
				example: exampleOf(server, method, path, op)
			});
		}
	}
	return [...groups.values()].filter((g) => g.operations.length);
}
