import { readdirSync, readFileSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { Validator } from '@seriousme/openapi-schema-validator';
import { describe, expect, it } from 'vitest';
import { buildDocument } from './document';

const origin = 'https://phasewright.example';
const doc = buildDocument(origin) as {
	openapi: string;
	servers: { url: string }[];
	paths: Record<
		string,
		Record<string, { parameters?: { name: string; in: string; schema: Record<string, unknown> }[]; responses: object }>
	>;
};

type Op = { parameters?: Record<string, unknown>[]; responses: Record<string, unknown>; security?: unknown };
/** One operation of the document, or a failed test that says which is missing. */
function op(path: string, method: string): Op {
	const found = doc.paths[path]?.[method];
	if (!found) throw new Error(`${method} ${path} is not in the document`);
	return found as unknown as Op;
}

const apiDir = join(process.cwd(), 'src/routes/api/v1');
const methods = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS', 'HEAD', 'fallback'];

/** Every +server.ts under api/v1, as SvelteKit routes it: `[buildId]` → `{buildId}`, with the methods the file exports. */
function routesOnDisk(): string[] {
	const found: string[] = [];
	const walk = (dir: string) => {
		for (const entry of readdirSync(dir, { withFileTypes: true })) {
			const full = join(dir, entry.name);
			if (entry.isDirectory()) walk(full);
			else if (entry.name === '+server.ts' || entry.name === '+server.js') {
				const rel = relative(apiDir, dir).split(sep).join('/');
				const path = `/${rel}`.replace(/\[(?:\.\.\.)?(\w+)\]/g, '{$1}');
				const source = readFileSync(full, 'utf8');
				// export async function GET / export function GET / export const GET = … (read from the source, not the table)
				const exported = [...source.matchAll(/export\s+(?:async\s+function|function|const|let)\s+([A-Za-z]+)\b/g)].map((m) => m[1] ?? '');
				for (const m of exported.filter((e) => methods.includes(e))) found.push(`${m} ${path}`);
			}
		}
	};
	walk(apiDir);
	return found.sort();
}

const documented = () =>
	Object.entries(doc.paths)
		.flatMap(([path, ops]) => Object.keys(ops).map((m) => `${m.toUpperCase()} ${path}`))
		.sort();

describe('the OpenAPI document', () => {
	it('has every route file under src/routes/api/v1 with every method it exports, and nothing else', () => {
		const disk = routesOnDisk();
		// Sanity of the walk itself: the wheel's route and a nested one are there (read off the tree by hand).
		expect(disk).toContain('GET /wheel');
		expect(disk).toContain('DELETE /builds/{buildId}/tapes/{recordId}');
		expect(documented()).toEqual(disk);
	});

	it('validates as OpenAPI 3.1 against the official schema (@seriousme/openapi-schema-validator)', async () => {
		const validator = new Validator();
		const result = await validator.validate(structuredClone(doc));
		expect(result.errors ?? []).toEqual([]);
		expect(result.valid).toBe(true);
		expect(validator.version).toBe('3.1');
		// Compiling the official schema takes a while on a busy machine.
	}, 30_000);

	it('catches a broken document (the validator is not a rubber stamp)', async () => {
		const broken = structuredClone(doc) as Record<string, unknown>;
		(broken.paths as Record<string, unknown>)['/wheel'] = { get: { responses: { 200: { content: {} } } } };
		const result = await new Validator().validate(broken);
		expect(result.valid).toBe(false);
	}, 30_000);

	it('takes its server from the configured origin, with the API prefix', () => {
		expect(doc.servers).toEqual([{ url: 'https://phasewright.example/api/v1' }]);
	});

	it('declares every path parameter its path names', () => {
		for (const [path, ops] of Object.entries(doc.paths)) {
			const named = [...path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]).sort();
			for (const op of Object.values(ops))
				expect(
					(op.parameters ?? [])
						.filter((p) => p.in === 'path')
						.map((p) => p.name)
						.sort(),
					path
				).toEqual(named);
		}
	});

	it('states the wheel’s ranges and units as the designer takes them', () => {
		const teeth = op('/wheel', 'get').parameters?.find((p) => p.name === 'teeth');
		// The parameter table the README published before this document: teeth 1–720, required; od 10–2000 mm.
		expect(teeth?.schema).toMatchObject({ type: 'integer', minimum: 1, maximum: 720 });
		const od = op('/wheel', 'get').parameters?.find((p) => p.name === 'od') ?? {};
		expect(od['x-range-mm']).toEqual({ minimum: 10, maximum: 2000 });
		expect(od.description).toMatch(/10 mm to 2000 mm/);
		expect(od.required).toBe(true);
	});

	it('documents the one 400 shape and sign-in on the routes that need it', () => {
		const post = op('/builds', 'post');
		expect(Object.keys(post.responses)).toEqual(['201', '400', '401', '403', '404', '409', '413', '503']);
		expect(post.security).toEqual([{ session: [] }]);
		expect(op('/wheel', 'get').security).toBeUndefined();
	});
});
