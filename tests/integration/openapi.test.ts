// The OpenAPI document as the built server serves it, checked against what the routes really do:
// the documented ranges are asked just outside (the route must refuse naming the field) and at
// their ends (the route must not refuse that field), and every example the document gives answers.
import { describe, expect, it } from 'vitest';
import { Client, freshEmail, signUp } from '../support/client';

const app = process.env.APP_URL!;

type Param = { name: string; in: string; required?: boolean; example?: unknown; schema: { minimum?: number; maximum?: number } };
type Op = { parameters?: Param[]; security?: unknown; responses: Record<string, { content?: Record<string, unknown> }> };
type Doc = { openapi: string; servers: { url: string }[]; paths: Record<string, Record<string, Op>> };

let cached: Doc | undefined;
async function document(): Promise<Doc> {
	cached ??= (await (await fetch(`${app}/api/v1/openapi.json`)).json()) as Doc;
	return cached;
}

function operation(doc: Doc, path: string): Op {
	const op = doc.paths[path]?.get;
	if (!op) throw new Error(`GET ${path} is not in the document`);
	return op;
}

/** The documented example query of an operation (what the page shows). */
const exampleQuery = (op: Op): Record<string, string> =>
	Object.fromEntries(
		(op.parameters ?? []).filter((p) => p.in === 'query' && p.example !== undefined).map((p) => [p.name, String(p.example)])
	);

/** A parameter's documented range: the schema's for numbers, `x-range-mm` for lengths (then asked with units=mm). */
function rangeOf(op: Op, name: string): { min: number; max: number; length: boolean } {
	const p = (op.parameters ?? []).find((q) => q.name === name) as
		(Param & { 'x-range-mm'?: { minimum: number; maximum: number } }) | undefined;
	if (!p) throw new Error(`no parameter ${name}`);
	const mm = p['x-range-mm'];
	if (mm) return { min: mm.minimum, max: mm.maximum, length: true };
	if (p.schema.minimum === undefined || p.schema.maximum === undefined) throw new Error(`${name} has no documented range`);
	return { min: p.schema.minimum, max: p.schema.maximum, length: false };
}

type Refused = { code: string; refusals: { field: string; message: string }[]; errors: Record<string, string> };

async function ask(path: string, query: Record<string, string>, client?: Client) {
	const url = `${path}?${new URLSearchParams(query)}`;
	const res = client ? await client.get(url, { accept: 'application/json' }) : await fetch(`${app}${url}`);
	const body = res.headers.get('content-type')?.includes('json') ? ((await res.json()) as Refused) : null;
	return { status: res.status, fields: body?.refusals?.map((r) => r.field) ?? [], body };
}

describe('GET /api/v1/openapi.json', () => {
	it('answers the OpenAPI 3.1 document as cacheable JSON, its server from ORIGIN', async () => {
		const res = await fetch(`${app}/api/v1/openapi.json`);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('application/json');
		expect(res.headers.get('cache-control')).toMatch(/^public, max-age=\d+/);
		const doc = (await res.json()) as Doc;
		expect(doc.openapi).toMatch(/^3\.1\./);
		// The test profile sets ORIGIN to the address the tests reach (scripts/profile.ts).
		expect(doc.servers).toEqual([{ url: `${app}/api/v1` }]);
		expect(Object.keys(doc.paths)).toEqual(expect.arrayContaining(['/wheel', '/builds/{buildId}', '/openapi.json']));
		// Another host named by a proxy header gets no document at all (origin.ts's Host check, seen here as 421).
		const forwarded = await fetch(`${app}/api/v1/openapi.json`, { headers: { 'x-forwarded-host': 'elsewhere.example' } });
		expect(forwarded.status).toBe(421);
	});
});

describe('documented ranges are the ranges the routes refuse', () => {
	// Each: a route, its parameter; the value asked comes from the document, the refusal from the route.
	const publicCases: [string, string][] = [
		['/wheel', 'teeth'],
		['/wheel', 'od'],
		['/wheel', 'thickness'],
		['/wheel', 'duty'],
		['/tape', 'tick'],
		['/tape', 'diameter'],
		// The phasing check narrows the shared tooth count to 2 and up (one tooth cannot be phased).
		['/phasing', 'teeth'],
		['/phasing', 'rpm']
	];

	it.each(publicCases)('GET %s: %s just outside its documented range is refused naming it; its ends are not', async (path, name) => {
		const doc = await document();
		const op = operation(doc, path);
		const { min, max, length } = rangeOf(op, name);
		const base = { ...exampleQuery(op), ...(length ? { units: 'mm' } : {}) };
		// A step well inside the resolution any of these ranges is written in (whole numbers, 0.05, 0.25).
		const step = Number.isInteger(min) && Number.isInteger(max) ? 1 : 0.01;
		const rangeWords = new Set<string>();
		for (const outside of [min - step, max + step]) {
			const r = await ask(`/api/v1${path}`, { ...base, [name]: String(outside) });
			expect(r.status, `${name}=${outside}`).toBe(400);
			expect(r.body?.code).toBe('invalid');
			expect(r.fields, `${name}=${outside}`).toContain(name);
			expect(r.body?.errors[name]).toMatch(new RegExp(`^${name}: `));
			rangeWords.add(r.body!.refusals.find((f) => f.field === name)!.message);
		}
		for (const end of [min, max]) {
			const r = await ask(`/api/v1${path}`, { ...base, [name]: String(end) });
			// Another rule may object to an extreme value (a wheel too thin for its teeth), never the range itself.
			expect(r.status, `${name}=${end}`).toBeLessThan(500);
			const own = r.body?.refusals?.find((f) => f.field === name)?.message;
			expect(rangeWords.has(own ?? ''), `${name}=${end}: ${own}`).toBe(false);
		}
	});

	it('GET /builds: page size just outside its documented range is refused naming it (signed in)', async () => {
		const client = await signUp('Range Reader', freshEmail('openapi-range'));
		const op = operation(await document(), '/builds');
		const { max } = rangeOf(op, 'size');
		const over = await ask('/api/v1/builds', { size: String(max + 1) }, client);
		expect(over.status).toBe(400);
		expect(over.fields).toEqual(['size']);
		const atEnd = await ask('/api/v1/builds', { size: String(max) }, client);
		expect(atEnd.status).toBe(200);
	});
});

describe('the document’s examples', () => {
	it('every example of a route needing no account answers with a documented type', async () => {
		const doc = await document();
		const tried: string[] = [];
		for (const [path, ops] of Object.entries(doc.paths)) {
			const op = ops.get;
			if (!op || op.security || path.includes('{')) continue;
			const res = await fetch(`${app}/api/v1${path}?${new URLSearchParams(exampleQuery(op))}`);
			const type = (res.headers.get('content-type') ?? '').split(';')[0]!;
			expect(res.status, `GET ${path}: ${res.status} ${res.status === 400 ? await res.text() : ''}`).toBe(200);
			expect(Object.keys(op.responses['200']?.content ?? {}), `GET ${path}`).toContain(type);
			await res.arrayBuffer().catch(() => undefined);
			tried.push(path);
		}
		// The walk reached the tools (read off the route folders by hand).
		expect(tried).toEqual(expect.arrayContaining(['/wheel', '/wheel.dxf', '/tape.pdf', '/tdc', '/phasing', '/build-sheet.pdf']));
	});
});

describe('the API page', () => {
	it('shows every section and links the document', async () => {
		const res = await fetch(`${app}/docs/api`);
		expect(res.status).toBe(200);
		const html = await res.text();
		expect(html).toContain('href="/api/v1/openapi.json"');
		for (const words of ['Wheel', 'Builds', 'Designs', 'Photos', 'Cutting packages', '/builds/{buildId}/engine', 'Signing in'])
			expect(html).toContain(words);
	});
});
