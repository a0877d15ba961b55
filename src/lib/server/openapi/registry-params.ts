import { z } from 'zod';
import { allows, defaultOf, type ParamDef, type Registry } from '$lib/schemas/registry';

// The tools' parameters as OpenAPI describes them, read from their registries (name, label, help,
// kind, range, choices, default) and the zod schemas of the rest: nothing here restates a range.

export type JsonSchema = Record<string, unknown>;

/** An OpenAPI parameter object (query or path). */
export interface Parameter {
	name: string;
	in: 'query' | 'path';
	required?: boolean;
	description?: string;
	schema: JsonSchema;
	example?: unknown;
	/** The registry's label: the page's parameter tables show it. */
	'x-label'?: string;
	/** A length's range in mm; the value is read in `units` (fractions and a unit after the number allowed). */
	'x-range-mm'?: { minimum: number; maximum: number };
	/** The unit of a number (°, rpm, Hz …) where the registry names one. */
	'x-unit'?: string;
}

/** The query's one registry, or several whose names add up (first definition of a name wins). */
export type Query = Registry | readonly Registry[] | z.ZodObject;

const numeric = (text: string | undefined) => (text !== undefined && text !== '' && Number.isFinite(Number(text)) ? Number(text) : text);

/** A parameter's value as JSON Schema, the value as the query carries it. */
export function paramSchema(def: ParamDef): JsonSchema {
	const given = defaultOf(def, 'mm');
	const withDefault = (s: JsonSchema, value: unknown) => (value === undefined || value === '' ? s : { ...s, default: value });
	switch (def.kind) {
		// Typed text: "3 1/2", "20 mm", "3/4 in" are all lengths; the range is in the description and x-range-mm.
		case 'length':
			return withDefault({ type: 'string' }, given);
		case 'angle':
		case 'number':
			return withDefault({ type: 'number', minimum: def.min, maximum: def.max }, numeric(given));
		case 'whole':
			return withDefault({ type: 'integer', minimum: def.min, maximum: def.max }, numeric(given));
		case 'choice':
			return withDefault({ type: 'string', enum: [...def.values] }, given);
		case 'text':
			return withDefault({ type: 'string', maxLength: def.max }, given);
		case 'free':
			return withDefault({ type: 'string' }, given);
	}
}

/** The registry's words for a parameter: label, help, what it takes (in both unit systems for a length), its default. */
export function paramDescription(def: ParamDef): string {
	const parts = [`${def.label}.`];
	if (def.help) parts.push(def.help.endsWith('.') ? def.help : `${def.help}.`);
	parts.push(def.kind === 'length' ? `Takes ${allows(def, 'mm')} (with units=in: ${allows(def, 'in')}).` : `Takes ${allows(def, 'mm')}.`);
	if (def.kind === 'choice' && def.labels) parts.push(def.values.map((v) => `${v}: ${def.labels?.[v] ?? v}`).join('; ') + '.');
	const mm = defaultOf(def, 'mm');
	const inch = defaultOf(def, 'in');
	if (def.whenEmpty) parts.push(`Empty: ${def.whenEmpty}.`);
	else if (mm !== undefined && mm !== '') parts.push(mm === inch ? `Default ${mm}.` : `Default ${mm} (with units=in: ${inch}).`);
	if (def.required && def.appliesWhen) parts.push('Required where it applies.');
	else if (def.appliesWhen) parts.push('Read only where it applies to the other parameters.');
	return parts.join(' ');
}

function unitOf(def: ParamDef): string | undefined {
	if (def.kind === 'angle') return def.unit ?? '°';
	if (def.kind === 'whole' || def.kind === 'number') return def.unit?.trim() || undefined;
	return undefined;
}

/** One registry parameter as a query parameter. */
export function queryParam(def: ParamDef): Parameter {
	const unit = unitOf(def);
	return {
		name: def.name,
		in: 'query',
		// A parameter needed only for some settings of the others is optional to the document.
		...(def.required && !def.appliesWhen ? { required: true } : {}),
		description: paramDescription(def),
		schema: paramSchema(def),
		'x-label': def.label,
		...(def.kind === 'length' ? { 'x-range-mm': { minimum: def.minMm, maximum: def.maxMm } } : {}),
		...(unit ? { 'x-unit': unit } : {})
	};
}

const isRegistry = (q: unknown): q is Registry => typeof q === 'object' && q !== null && 'params' in q && 'read' in q;

/** Every definition of the registries, each name once (the first registry's definition wins, as the checks read them). */
export function definitionsOf(registries: readonly Registry[]): ParamDef[] {
	const seen = new Map<string, ParamDef>();
	for (const r of registries) for (const def of r.params) if (!seen.has(def.name)) seen.set(def.name, def);
	return [...seen.values()];
}

/** A zod schema as JSON Schema, as a caller writes it (input side), without zod's long uuid and e-mail patterns. */
export function zodSchema(schema: z.ZodType): JsonSchema {
	const out = z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' }) as JsonSchema;
	delete out.$schema;
	return JSON.parse(JSON.stringify(out), (_key, value: unknown) => {
		if (value && typeof value === 'object' && !Array.isArray(value)) {
			const v = value as JsonSchema;
			if (v.pattern !== undefined && (v.format === 'uuid' || v.format === 'email')) delete v.pattern;
		}
		return value;
	}) as JsonSchema;
}

/** A query's parameters: from its registries, or from the zod object the route reads it with. */
export function queryParams(query: Query): Parameter[] {
	if (isRegistry(query)) return query.params.map(queryParam);
	if (Array.isArray(query)) return definitionsOf(query as readonly Registry[]).map(queryParam);
	const object = zodSchema(query as z.ZodObject);
	const required = new Set((object.required as string[] | undefined) ?? []);
	return Object.entries((object.properties ?? {}) as Record<string, JsonSchema>).map(([name, schema]) => ({
		name,
		in: 'query',
		...(required.has(name) ? { required: true } : {}),
		schema
	}));
}

/**
 * A tool's flat parameters inside a JSON body (a saved revision, a record, the engine profile):
 * each value text, a number or true/false, read as the tool's query reads it.
 */
export function registryObject(registries: Registry | readonly Registry[], description: string): JsonSchema {
	const defs = definitionsOf(isRegistry(registries) ? [registries] : (registries as readonly Registry[]));
	const properties = Object.fromEntries(
		defs.map((def) => {
			const s = paramSchema(def);
			// JSON numbers and text are both read; the range applies to the number either way.
			const type = s.type === 'number' || s.type === 'integer' ? [s.type, 'string'] : def.kind === 'length' ? ['string', 'number'] : s.type;
			return [def.name, { ...s, type, description: paramDescription(def) }];
		})
	);
	const required = defs.filter((d) => d.required && !d.appliesWhen).map((d) => d.name);
	return {
		type: 'object',
		description,
		properties,
		...(required.length ? { required } : {}),
		additionalProperties: { type: ['string', 'number', 'boolean'] }
	};
}
