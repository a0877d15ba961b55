import type { JsonSchema } from './registry-params';

// What the routes answer, as the document states it: the shared error shapes once (components),
// and the helpers a route's entry uses to say what it answers.

const error = (codes: string[], more: JsonSchema = {}): JsonSchema => ({
	type: 'object',
	required: ['message', 'code'],
	properties: {
		message: { type: 'string', description: 'What went wrong, in words for a person.' },
		code: { type: 'string', enum: codes },
		...more
	}
});

/** The schemas and responses every route shares; `refuse()` in src/lib/server/api.ts writes the 400. */
export const components = {
	schemas: {
		Refusal: {
			type: 'object',
			required: ['field', 'message'],
			properties: {
				field: { type: 'string', description: 'The parameter to change (`params.b` for a tool parameter inside a saved record).' },
				message: { type: 'string', description: 'Why, and what the field takes, worded to stand beside the field (without its name).' }
			}
		},
		Refused: error(['invalid'], {
			errors: {
				type: 'object',
				additionalProperties: { type: 'string' },
				description: 'The same refusals as a map of field to a message that starts with the field’s name (`"od": "od: 10 mm to 2000 mm"`).'
			},
			refusals: {
				type: 'array',
				items: { $ref: '#/components/schemas/Refusal' },
				description: 'The first reason per field, in the order the check found them: the same words the tool’s page shows.'
			}
		}),
		Error: error([
			'unauthenticated',
			'forbidden',
			'not-found',
			'conflict',
			'stale',
			'throttled',
			'too-large',
			'invalid',
			'unavailable',
			'mail-failed'
		])
	},
	responses: {
		Refused: {
			description: 'Bad parameters: each field with the first reason and what it takes. Nothing was saved.',
			content: { 'application/json': { schema: { $ref: '#/components/schemas/Refused' } } }
		},
		Unauthenticated: {
			description: 'Not signed in (no session cookie, or its session was ended).',
			content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } }
		},
		Forbidden: {
			description: 'Signed in, but the role in this workshop is too low (viewers read; editors and owners write).',
			content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } }
		},
		NotFound: {
			description: 'No such object among the caller’s workshops (another workshop’s id answers the same as a made-up one).',
			content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } }
		},
		TooLarge: {
			description: 'The request body is over its limit (64 KB; photo uploads 20 MB per photo).',
			content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } }
		},
		Unavailable: {
			description: 'The database cannot be reached; try again after Retry-After seconds.',
			headers: { 'retry-after': { schema: { type: 'integer' }, description: 'Seconds to wait (5).' } },
			content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } }
		}
	}
} as const;

/** The answer of a route that went well. */
export type Answer =
	| { kind: 'json'; status: number; description: string; fields: Record<string, string> }
	| { kind: 'file'; status: number; description: string; types: readonly string[] }
	| { kind: 'empty'; status: number; description: string };

/**
 * A JSON answer and its top-level fields, each `type` or `type: what it holds`; a type is a JSON
 * type, several joined by `|` (`object|null`).
 */
export const json = (description: string, fields: Record<string, string>, status = 200): Answer => ({
	kind: 'json',
	status,
	description,
	fields
});

/** A file download (content-disposition: attachment, cacheable). */
export const file = (description: string, ...types: string[]): Answer => ({ kind: 'file', status: 200, description, types });

export const empty = (description: string, status = 204): Answer => ({ kind: 'empty', status, description });

const jsonTypes = new Set(['string', 'number', 'integer', 'boolean', 'object', 'array', 'null']);

/** One field's words as JSON Schema: `array: every tooth …` → { type: 'array', description }. */
export function fieldSchema(words: string): JsonSchema {
	const [head = '', ...rest] = words.split(': ');
	const types = head.split('|');
	if (!types.every((t) => jsonTypes.has(t))) throw new Error(`openapi: "${words}" should start with a JSON type`);
	const description = rest.join(': ');
	return { type: types.length === 1 ? types[0] : types, ...(description ? { description } : {}) };
}

/** The OpenAPI response of a good answer. */
export function answerResponse(answer: Answer): JsonSchema {
	switch (answer.kind) {
		case 'json':
			return {
				description: answer.description,
				content: {
					'application/json': {
						schema: {
							type: 'object',
							properties: Object.fromEntries(Object.entries(answer.fields).map(([name, words]) => [name, fieldSchema(words)]))
						}
					}
				}
			};
		case 'file':
			return {
				description: answer.description,
				headers: { 'content-disposition': { schema: { type: 'string' }, description: 'The file name.' } },
				content: Object.fromEntries(answer.types.map((t) => [t, { schema: { type: 'string', contentMediaType: t } }]))
			};
		case 'empty':
			return { description: answer.description };
	}
}

/** A route's own error answer (409, 413, 422, 429, 502): its status, what it means, its code. */
export interface Extra {
	status: number;
	description: string;
	/** Fields beside message and code (a 409 `stale` carries the newest revision). */
	fields?: Record<string, string>;
}

export function extraResponse(extra: Extra): JsonSchema {
	const schema: JsonSchema = extra.fields
		? {
				allOf: [
					{ $ref: '#/components/schemas/Error' },
					{ type: 'object', properties: Object.fromEntries(Object.entries(extra.fields).map(([n, w]) => [n, fieldSchema(w)])) }
				]
			}
		: { $ref: '#/components/schemas/Error' };
	// A throttled caller is told when to come back.
	const headers =
		extra.status === 429 ? { headers: { 'retry-after': { schema: { type: 'integer' }, description: 'Seconds to wait.' } } } : {};
	return { description: extra.description, ...headers, content: { 'application/json': { schema } } };
}
