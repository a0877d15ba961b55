// Every public API route under src/routes/api, fed generated input with fast-check: query strings
// of the route's own parameter names (and others) with edge values, JSON bodies of the wrong shape
// and type, deep nesting, huge arrays, wrong content types, made-up ids in the path, unexpected
// methods. What must hold (the project's rule for bad input, and common practice for HTTP APIs):
// never a 5xx; a 400 carries `errors` whose keys are the route's parameters and whose messages
// start with the field they are about. Every wheel the API accepts must draw as closed cut
// contours that neither cross nor touch (checked with tests/support/outline-check.ts).
//
// The seed is fixed so CI runs the same thousands of inputs every time; FUZZ_SEED=<n> explores
// others. On a failure fast-check prints the seed, the path and the shrunk counterexample.
import fc from 'fast-check';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildSheetKeys } from '../../src/lib/schemas/phasing';
import { edgeLogDesignParams } from '../../src/lib/schemas/edge-log-design';
import { signalParams } from '../../src/lib/schemas/signal';
import { wheelParams as wheelRegistry } from '../../src/lib/schemas/wheel-params';
import { cutContours, drawWheel } from '../../src/lib/trade/wheel';
import { outlineDefects } from '../support/outline-check';
import { acceptedSpec, wheelParams } from '../support/wheel-params';
import { appUrl, signUp, freshEmail, type Client } from '../support/client';

const seed = Number(process.env.FUZZ_SEED ?? 8008);
const origin = new URL(appUrl).origin;
let total = 0;
afterAll(() => console.log(`fuzz: ${total} requests, seed ${seed}`));

// ---- Parameter names, as the schemas and the README name them ----

const wheelNames = wheelRegistry.names;
const tapeNames = [
	'units',
	'diameter',
	'circumference',
	'paperThickness',
	'rotation',
	'paper',
	'window',
	'tick',
	'mid',
	'label',
	'timing',
	'tdc2'
];
const tdcNames = ['a', 'b', 'scale', 'arc', 'rotation', 'distance', 'diameter', 'units'];
const cardNames = ['units', 'diameter', 'circumference', 'paperThickness', 'rotation', 'paper', 'curve'];
const phasingNames = [
	'teeth',
	'missing',
	'duty',
	'mount',
	'layout',
	'vAngle',
	'stroke',
	'intervals',
	'cylinders',
	'input',
	'toothAtTdc',
	'sensorAngle',
	'keywayAngle',
	'keyAngle',
	'edge',
	'rpm',
	'cranking',
	'sensor',
	'sensorMaxHz',
	'windowFrom',
	'windowTo',
	'resolution',
	'target',
	'keyFromSensor'
];
const sheetNames = [...new Set([...wheelNames, ...phasingNames, ...buildSheetKeys])];
const signalNames = signalParams.names;
const degreeWheelNames = [...tapeNames, 'shaft'];
/** Every name any route takes, for requests sent to routes at random. */
const everyName = [
	...new Set([
		...sheetNames,
		...tapeNames,
		...tdcNames,
		...cardNames,
		...signalNames,
		'shaft',
		'workshop',
		'q',
		'sort',
		'dir',
		'page',
		'size',
		'name',
		'engine',
		'notes',
		'params',
		'baseRevision',
		'revision',
		'message',
		'centre',
		'tips',
		'odMm',
		'image',
		'designId',
		'to',
		'quantity',
		'file',
		'design'
	])
];

// ---- Values ----

const edgeTexts = [
	'',
	' ',
	'0',
	'-0',
	'-1',
	'1',
	'2',
	'0.5',
	'36',
	'100',
	'720',
	'721',
	'1e308',
	'1e309',
	'-1e309',
	'1e-320',
	'4.9e-324',
	'9007199254740993',
	'NaN',
	'nan',
	'Infinity',
	'-Infinity',
	'+Infinity',
	'3 1/2',
	'3-1/2',
	'7/8',
	'1/0',
	'0/0',
	'-1/2',
	'1,5',
	'1.5.5',
	'1..5',
	'0x1F',
	'0b11',
	'0o7',
	'1_000',
	'+7',
	'.5',
	'5.',
	'1e',
	'e1',
	'٣',
	'１２',
	'½',
	'null',
	'undefined',
	'true',
	'false',
	'[]',
	'{}',
	'[object Object]',
	'none',
	'custom',
	'mm',
	'in',
	'%',
	'%00',
	'\u0000',
	'a\u0000b',
	'\n',
	'\r\n',
	'\t',
	'\u202e',
	'\ufeff',
	'\ud800',
	'\udfff',
	'😀',
	'é',
	'e\u0301',
	'<script>alert(1)</script>',
	"'; drop table build;--",
	'../../etc/passwd',
	'C:\\x\\y',
	'$(id)',
	'x'.repeat(5000),
	'9'.repeat(400),
	'-'.repeat(100),
	' 36 ',
	'36abc',
	'abc36'
];
const edgeText = fc.constantFrom(...edgeTexts);
const numberText = fc.oneof(
	fc.integer().map(String),
	fc.integer({ min: -5, max: 800 }).map(String),
	fc.double().map(String),
	fc.double({ min: -2000, max: 2000, noNaN: true }).map((x) => x.toFixed(3)),
	fc.double({ min: -1e3, max: 1e3, noNaN: true }).map((x) => x.toExponential()),
	fc.bigInt().map(String),
	fc.tuple(fc.nat(99), fc.nat(70), fc.integer({ min: 0, max: 64 })).map(([w, n, d]) => `${w} ${n}/${d}`)
);
/** Text with one character that storage, headers or parsers trip over, somewhere inside. */
const awkwardText = fc
	.tuple(
		fc.string({ maxLength: 10 }),
		fc.constantFrom('\u0000', '\ud800', '\udfff', '\u202e', '\r\n', '\u2028', '\ufffe', '%00', '\\', '"'),
		fc.string({ maxLength: 10 })
	)
	.map(([a, c, b]) => a + c + b);
const textValue = fc.oneof(
	{ weight: 4, arbitrary: edgeText },
	{ weight: 2, arbitrary: awkwardText },
	{ weight: 4, arbitrary: numberText },
	{ weight: 2, arbitrary: fc.string({ maxLength: 30 }) },
	{ weight: 1, arbitrary: fc.string({ unit: 'grapheme', maxLength: 20 }) },
	{ weight: 1, arbitrary: fc.string({ unit: 'binary', maxLength: 20 }) },
	{ weight: 1, arbitrary: fc.integer({ min: 50, max: 3000 }).map((n) => '7'.repeat(n)) }
);
const oddNames = [
	'__proto__',
	'constructor',
	'toString',
	'hasOwnProperty',
	'prototype',
	'TEETH',
	'teeth ',
	' od',
	'od[]',
	'a[b]',
	'',
	'.',
	'params.teeth',
	'0'
];
const rawBits = [
	'%',
	'%zz',
	'%ff',
	'%fe%ff',
	'%00',
	'%c0%af',
	'&&',
	'=',
	'==x',
	'teeth',
	'%E2%80%AE',
	'+',
	'od=%',
	'teeth=%ZZ',
	';',
	'a=1;b=2',
	'%u0041'
];

/** A query string: a valid base, some of it kept, names set to edge values, names repeated, raw bytes appended. */
function queryArb(known: readonly string[], base: Record<string, string>) {
	const name = fc.oneof(
		{ weight: 6, arbitrary: fc.constantFrom(...known) },
		{ weight: 1, arbitrary: fc.string({ maxLength: 12 }) },
		{ weight: 1, arbitrary: fc.constantFrom(...oddNames) }
	);
	const keys = Object.keys(base);
	return fc
		.record({
			keep: keys.length ? fc.oneof(fc.constant(keys), fc.subarray(keys)) : fc.constant([] as string[]),
			set: fc.array(fc.tuple(name, textValue), { maxLength: 5 }),
			repeat: fc.array(fc.tuple(fc.constantFrom(...known), textValue), { maxLength: 2 }),
			raw: fc.option(fc.constantFrom(...rawBits), { freq: 6, nil: undefined })
		})
		.map(({ keep, set, repeat, raw }) => {
			const q = new URLSearchParams();
			for (const k of keep) q.set(k, base[k]!);
			for (const [k, v] of set) q.set(k, v);
			for (const [k, v] of repeat) q.append(k, v);
			const s = q.toString();
			return raw ? (s ? `${s}&${raw}` : raw) : s;
		});
}

const jsonLeaf = fc.oneof(
	fc.constantFrom(0, -0, -1, 1, 1.5, 1e308, -1e308, 2 ** 31, 2 ** 53 + 2, 1e-300, 36, 100, 1_000_000, true, false, null),
	fc.double().filter(Number.isFinite),
	fc.integer(),
	edgeText,
	fc.string({ unit: 'binary', maxLength: 20 }),
	fc.constant({}),
	fc.constant([])
);
const jsonValue = fc.oneof(
	{ weight: 3, arbitrary: jsonLeaf },
	{ weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3, stringUnit: 'binary' }) }
);
/** Flat tool parameters as a JSON object: the tool's names and others, values of any JSON type. */
const paramsArb = (names: readonly string[], base: Record<string, string>) =>
	fc.oneof(
		// A valid set with one awkward name or value added: what reaches storage when the rest passes.
		fc
			.tuple(fc.oneof(fc.constantFrom(...names), fc.string({ maxLength: 12 }), awkwardText), awkwardText)
			.map(([k, v]) => ({ ...base, [k]: v })),
		fc.tuple(awkwardText, textValue).map(([k, v]) => ({ ...base, [k]: v })),
		fc
			.record({
				keep: fc.subarray(Object.keys(base)),
				set: fc.dictionary(fc.constantFrom(...names), fc.oneof(textValue, jsonValue), { maxKeys: 4 })
			})
			.map(({ keep, set }) => ({ ...Object.fromEntries(keep.map((k) => [k, base[k]])), ...set })),
		fc.dictionary(fc.oneof(fc.constantFrom(...names), fc.string({ maxLength: 50 })), jsonValue, { maxKeys: 6 }),
		fc.constant(Object.fromEntries(Array.from({ length: 200 }, (_, i) => [`p${i}`, '1']))),
		fc.constant({ ...base, teeth: 'x'.repeat(600) }),
		jsonValue
	);

/** A body too big to print: a counterexample shows its label. */
class Big {
	constructor(
		readonly label: string,
		readonly text: string
	) {}
	[fc.toStringMethod]() {
		return `<${this.label}, ${this.text.length} chars>`;
	}
}
const bodyText = (b: string | Big) => (typeof b === 'string' ? b : b.text);

// Built once: bodies too big or too deep to generate every run.
const deep = (n: number) => '['.repeat(n) + ']'.repeat(n);
const deepObject = (n: number) => '{"a":'.repeat(n) + '1' + '}'.repeat(n);
const hugeBodies = [
	new Big('10000 nested arrays', deep(10_000)),
	new Big('5000 nested objects', deepObject(5_000)),
	new Big('params nested 200 deep', JSON.stringify({ params: JSON.parse(deepObject(200)) })),
	new Big('50000 tips', JSON.stringify({ tips: Array.from({ length: 50_000 }, (_, i) => ({ x: i, y: i })), centre: { x: 1, y: 1 } })),
	new Big('array of 100000 numbers', JSON.stringify(Array.from({ length: 100_000 }, () => 1))),
	new Big('a name of a million characters', JSON.stringify({ name: 'n'.repeat(1_000_000) })),
	new Big('params with 20000 names', JSON.stringify({ params: Object.fromEntries(Array.from({ length: 20_000 }, (_, i) => [`k${i}`, i])) }))
];
const rawTexts = [
	'',
	'{',
	'{"a":',
	'NaN',
	"{'a':1}",
	'{"a":1}{"b":2}',
	'\u0000',
	'null',
	'[]',
	'"text"',
	'123',
	'true',
	'{"__proto__":{"x":1}}',
	'\ufeff{}',
	'name=x&engine=y',
	'--x\r\nContent-Disposition: form-data; name="name"\r\n\r\nx\r\n--x--'
];
const contentType = fc.constantFrom(
	'application/json',
	'application/json',
	'application/json',
	'text/plain',
	'application/x-www-form-urlencoded',
	'multipart/form-data; boundary=x',
	'application/xml',
	undefined,
	'application/json; charset=utf-16'
);

/** A JSON request body: a valid one with fields swapped for values of other types, any JSON, raw text, or a huge one. */
function bodyArb(fields: Record<string, fc.Arbitrary<unknown>>, base: Record<string, unknown>) {
	const keys = Object.keys(base);
	const mutated = fc
		.record({
			keep: fc.subarray(keys),
			set: fc.record(Object.fromEntries(Object.entries(fields).map(([k, a]) => [k, fc.oneof(a, jsonValue)])), { requiredKeys: [] })
		})
		.map(({ keep, set }) => JSON.stringify({ ...Object.fromEntries(keep.map((k) => [k, base[k]])), ...set }));
	return fc.record({
		body: fc.oneof(
			{ weight: 8, arbitrary: mutated },
			{ weight: 2, arbitrary: jsonValue.map((v) => JSON.stringify(v)) },
			{ weight: 1, arbitrary: fc.constantFrom(...rawTexts) },
			{ weight: 1, arbitrary: fc.constantFrom(...hugeBodies) },
			{ weight: 1, arbitrary: fc.uint8Array({ maxLength: 64 }).map((b) => Buffer.from(b).toString('latin1')) }
		),
		type: contentType
	});
}

const madeUpId = fc.oneof(
	fc.uuid().map(String),
	// Not '..' or '%2e%2e': the client resolves dot segments before sending (WHATWG URL), so they
	// reach other routes, not this one with an odd id.
	fc.constantFrom(
		'',
		'abc',
		'0',
		'-1',
		'00000000-0000-0000-0000-000000000000',
		'ffffffff-ffff-ffff-ffff-ffffffffffff',
		'...',
		'%00',
		'%2F',
		'%5C',
		'%252F',
		'x'.repeat(300),
		'null',
		'undefined',
		"1'or'1'='1",
		'😀'
	),
	fc.string({ maxLength: 40 }).map(encodeURIComponent)
);

// ---- Sending and judging ----

interface Request {
	method: string;
	path: string;
	body?: string | Big;
	type?: string;
}

interface Answer {
	request: Request;
	status: number;
	contentType: string;
	text: string;
	json?: { errors?: Record<string, unknown>; message?: string; code?: string };
}

let cookie = '';

async function send(request: Request, signedIn = true): Promise<Answer> {
	total++;
	const headers: Record<string, string> = { origin, accept: 'application/json' };
	if (signedIn && cookie) headers.cookie = cookie;
	if (request.type) headers['content-type'] = request.type;
	const res = await fetch(new URL(request.path, appUrl), {
		method: request.method,
		headers,
		body: request.body === undefined ? undefined : bodyText(request.body),
		redirect: 'manual'
	});
	const contentType = res.headers.get('content-type') ?? '';
	const bytes = Buffer.from(await res.arrayBuffer());
	const text = /json|text|html/.test(contentType) ? bytes.toString('utf8') : `<${bytes.length} bytes of ${contentType}>`;
	let json: Answer['json'];
	if (contentType.includes('json')) {
		try {
			json = JSON.parse(text);
		} catch {
			json = undefined;
		}
	}
	return { request, status: res.status, contentType, text, json };
}

const clip = (s: string) => (s.length > 300 ? `${s.slice(0, 300)}… (${s.length} chars)` : s);
const shown = (r: Request) =>
	`${r.method} ${clip(r.path)}${r.body !== undefined ? ` [${r.type ?? 'no type'}] ${r.body instanceof Big ? r.body[fc.toStringMethod]() : clip(r.body)}` : ''}`;
const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/** Whether a message names a field of the key: `teeth: …` for `teeth`, `params: …` or `teeth: …` for `params.teeth`. */
function namesField(key: string, message: string): boolean {
	const colon = message.indexOf(':');
	if (colon <= 0) return false;
	const head = message.slice(0, colon);
	return key.split('.').some((part) => part !== '' && new RegExp(`(^|[^\\w])${escape(part)}([^\\w]|$)`).test(head));
}

/**
 * No 5xx; a 400 names each field: `errors` keyed by the route's parameter names (`params.<name>`
 * for a tool's parameters, `body` / `form` for the request as a whole), each message starting
 * with the field it is about.
 */
function expectSound(a: Answer, known: readonly string[], tool: readonly string[] = []) {
	const where = `${shown(a.request)} → ${a.status}: ${a.text.slice(0, 400)}`;
	expect(a.status, where).toBeLessThan(500);
	expect(a.status, where).toBeGreaterThanOrEqual(200);
	// A HEAD answer has no body to carry the errors (RFC 9110 9.3.2); its GET twin is checked.
	if (a.status !== 400 || a.request.method === 'HEAD') return;
	const errors = a.json?.errors;
	expect(errors, `a 400 without errors naming the fields: ${where}`).toBeTypeOf('object');
	expect(Object.keys(errors!).length, where).toBeGreaterThan(0);
	for (const [key, message] of Object.entries(errors!)) {
		expect(message, where).toBeTypeOf('string');
		const [head, sub] = key.split('.');
		expect([...known, 'body', 'form'], `error key ${key} is none of this route's parameters: ${where}`).toContain(head);
		expect(namesField(key, message as string), `message for ${key} does not start with its field: ${where}`).toBe(true);
		// `params.<name>` with a name the tool does not take can only be about params itself.
		if (head === 'params' && sub !== undefined && !tool.includes(sub)) expect(namesField('params', message as string), where).toBe(true);
	}
}

const run = <T>(arb: fc.Arbitrary<T>, numRuns: number, check: (value: T) => Promise<void>, offset = 0) =>
	fc.assert(fc.asyncProperty(arb, check), { numRuns, seed: seed + offset });

// ---- The routes ----

const wheelBase = { teeth: '36', missing: '1', od: '100', depth: '5' };
const tapeBase = { diameter: '150' };
const tdcBase = { a: '-10', b: '19' };
const cardBase = { diameter: '150', curve: '1200:10,3000:20' };
const phasingBase = { teeth: '36', missing: '1', toothAtTdc: '9' };
const sheetBase = { ...wheelBase, toothAtTdc: '9', buildName: 'Fuzz' };

const statelessRoutes: { path: string; names: readonly string[]; base: Record<string, string>; runs: number }[] = [
	{ path: '/api/v1/wheel.dxf', names: wheelNames, base: wheelBase, runs: 120 },
	{ path: '/api/v1/wheel.svg', names: wheelNames, base: wheelBase, runs: 80 },
	{ path: '/api/v1/wheel.pdf', names: wheelNames, base: wheelBase, runs: 40 },
	{ path: '/api/v1/tape', names: tapeNames, base: tapeBase, runs: 250 },
	{ path: '/api/v1/tape.pdf', names: tapeNames, base: tapeBase, runs: 40 },
	{ path: '/api/v1/tdc', names: tdcNames, base: tdcBase, runs: 250 },
	{ path: '/api/v1/timing-card.pdf', names: cardNames, base: cardBase, runs: 60 },
	{ path: '/api/v1/phasing', names: phasingNames, base: phasingBase, runs: 300 },
	{ path: '/api/v1/build-sheet.pdf', names: sheetNames, base: sheetBase, runs: 40 },
	{ path: '/api/v1/wheel.stl', names: wheelNames, base: wheelBase, runs: 40 },
	{ path: '/api/v1/degree-wheel.pdf', names: degreeWheelNames, base: { ...tapeBase, shaft: '20' }, runs: 40 },
	{ path: '/api/v1/signal', names: signalNames, base: phasingBase, runs: 120 },
	{ path: '/api/v1/signal/edges.csv', names: signalNames, base: phasingBase, runs: 40 },
	{ path: '/api/health', names: ['x'], base: {}, runs: 20 }
];

describe('the stateless tool routes', () => {
	it('GET /api/v1/wheel: no 5xx, refusals name the field, and every accepted wheel draws closed, non-crossing contours', async () => {
		let accepted = 0;
		const check = async (query: string) => {
			const a = await send({ method: 'GET', path: `/api/v1/wheel?${query}` });
			expectSound(a, wheelNames);
			// The API and the trade library agree on what is buildable (the route is parseWheel + summarize).
			const params = Object.fromEntries(new URLSearchParams(query));
			const spec = acceptedSpec(params);
			expect(a.status === 200, `${query}: API ${a.status}, library ${spec ? 'accepts' : 'refuses'}`).toBe(spec !== null);
			if (!spec) return;
			accepted++;
			const body = a.json as unknown as { teethPresent: number };
			const drawing = drawWheel(spec);
			expect(body.teethPresent, query).toBe(drawing.spans.length);
			expect(outlineDefects(cutContours(drawing)), query).toEqual([]);
		};
		await run(queryArb(wheelNames, wheelBase), 250, check, 1);
		// Specs over the valid ranges, as a user would type them: about half are buildable, so the
		// outline check sees real wheels (the edge values above are nearly all refused).
		await run(
			wheelParams.map((p) => new URLSearchParams(p as Record<string, string>).toString()),
			150,
			check,
			2
		);
		expect(accepted).toBeGreaterThan(50);
	}, 120_000);

	// Inputs the fuzz found refused without naming the field ("Invalid input", "Too big: …"), kept as
	// regressions: a failed union or a bare max() in a schema reports zod's own words.
	it('regressions: union and length refusals name their field', async () => {
		const cases: [string, string, RegExp][] = [
			['/api/v1/wheel?teeth=36&missing=1&od=100&depth=5&mark=%00', 'mark', /^mark: none, or an angle/],
			['/api/v1/wheel.svg?teeth=36&missing=1&od=100&depth=5&mark=%EF%BF%BD', 'mark', /^mark: /],
			['/api/v1/wheel.dxf?teeth=36&od=100&depth=5&keyway=woodruff&woodruff=-10000000', 'woodruff', /^woodruff: /],
			['/api/v1/tape?diameter=150&window=%00', 'window', /^window: full, or a number from 5 to 180/],
			['/api/v1/tape.pdf?diameter=150&window=%21', 'window', /^window: /]
		];
		for (const [path, field, says] of cases) {
			const a = await send({ method: 'GET', path });
			expect(a.status, path).toBe(400);
			expect(a.json?.errors?.[field], path).toMatch(says);
		}
	});

	for (const [i, route] of statelessRoutes.entries()) {
		it(`GET ${route.path}: no 5xx, refusals name the field (${route.runs} runs)`, async () => {
			await run(
				queryArb(route.names, route.base),
				route.runs,
				async (query) => expectSound(await send({ method: 'GET', path: `${route.path}?${query}` }), route.names),
				10 + i
			);
		}, 120_000);
	}

	it('POST /api/v1/signal/log: any text as the log, any design in the query, any content type', async () => {
		const names = [...edgeLogDesignParams.names, 'log'];
		// Rows a scope or an ECU might write, and rows nobody would.
		const row = fc.oneof(fc.integer({ min: 0, max: 1e7 }).map(String), fc.double().map(String), edgeText, fc.string({ maxLength: 20 }));
		const log = fc.tuple(fc.array(row, { maxLength: 300 }), fc.constantFrom('\n', '\r\n', '\r', ',')).map(([rows, end]) => rows.join(end));
		const type = fc.constantFrom('text/csv', 'text/plain; charset=utf-8', 'application/json', 'multipart/form-data', 'image/png');
		await run(
			fc.record({ query: queryArb(edgeLogDesignParams.names, {}), log, type }),
			120,
			async ({ query, log, type }) =>
				expectSound(await send({ method: 'POST', path: `/api/v1/signal/log?${query}`, body: log, type }), names),
			40
		);
	}, 120_000);
});

describe('the signed-in routes', () => {
	let client: Client;
	let buildId: string;
	let designId: string;
	let photoId: string;
	const wheel = { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', thickness: '3' };

	beforeAll(async () => {
		client = await signUp('fuzz owner', freshEmail('fuzz'));
		cookie = [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
		buildId = (await client.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Fuzz bench', engine: '500 single' })).body.id;
		designId = (await client.send<{ id: string }>('POST', `/api/v1/builds/${buildId}/designs`, { name: 'Fuzz wheel', params: wheel })).body
			.id;
		expect((await client.send('PUT', `/api/v1/builds/${buildId}/engine`, { params: phasingBase })).status).toBe(200);
		expect((await client.send('POST', `/api/v1/builds/${buildId}/tdc-records`, { label: 'first', params: tdcBase })).status).toBe(201);
		expect((await client.send('POST', `/api/v1/builds/${buildId}/tapes`, { label: 'hub', params: tapeBase })).status).toBe(201);
		const png = await sharp({ create: { width: 64, height: 64, channels: 3, background: '#808080' } })
			.png()
			.toBuffer();
		const form = new FormData();
		form.append('file', new Blob([new Uint8Array(png)], { type: 'image/png' }), 'bench.png');
		photoId = (await client.send<{ photos: { id: string }[] }>('POST', `/api/v1/builds/${buildId}/photos`, form)).body.photos[0]!.id;
	});

	const buildFields = ['workshop', 'q', 'sort', 'dir', 'page', 'size', 'cursor'];
	const text = fc.oneof(textValue, fc.string({ maxLength: 200 }), awkwardText);

	it('GET /api/v1/builds: the list query', async () => {
		await run(
			queryArb(buildFields, { q: 'fuzz', sort: 'name', page: '1', size: '20' }),
			200,
			async (q) => expectSound(await send({ method: 'GET', path: `/api/v1/builds?${q}` }), buildFields),
			30
		);
	}, 120_000);

	it('POST /api/v1/builds and PATCH /api/v1/builds/:id: bodies of any shape', async () => {
		await run(
			bodyArb({ name: text, engine: text }, { name: 'Fuzz build', engine: 'twin' }),
			80,
			async ({ body, type }) => expectSound(await send({ method: 'POST', path: '/api/v1/builds', body, type }), ['name', 'engine']),
			31
		);
		await run(
			bodyArb({ name: text, engine: text, notes: text }, { name: 'Fuzz bench', engine: 'single', notes: 'n' }),
			80,
			async ({ body, type }) =>
				expectSound(await send({ method: 'PATCH', path: `/api/v1/builds/${buildId}`, body, type }), ['name', 'engine', 'notes']),
			32
		);
	}, 120_000);

	it('PUT /api/v1/builds/:id/engine: the phasing parameters', async () => {
		await run(
			bodyArb({ params: paramsArb(phasingNames, phasingBase) }, { params: phasingBase }),
			100,
			async ({ body, type }) =>
				expectSound(
					await send({ method: 'PUT', path: `/api/v1/builds/${buildId}/engine`, body, type }),
					['params', ...phasingNames],
					phasingNames
				),
			33
		);
	}, 120_000);

	it('POST /api/v1/builds/:id/designs: a new design with wheel parameters', async () => {
		const fields = { name: text, params: paramsArb(wheelNames, wheel), message: text };
		await run(
			bodyArb(fields, { name: 'Fuzz design', params: wheel, message: 'm' }),
			100,
			async ({ body, type }) => {
				const a = await send({ method: 'POST', path: `/api/v1/builds/${buildId}/designs`, body, type });
				expectSound(a, ['name', 'params', 'message'], wheelNames);
			},
			34
		);
	}, 120_000);

	it('POST /api/v1/designs/:id/revisions and /restore: saves on a base revision', async () => {
		const base = fc.oneof(fc.integer({ min: 0, max: 5 }), fc.constantFrom(2 ** 31, 2 ** 31 - 1, 2 ** 53, 1e300, -1, 0.5));
		await run(
			bodyArb(
				{ baseRevision: base, params: paramsArb(wheelNames, wheel), message: text },
				{ baseRevision: 1, params: wheel, message: 'm' }
			),
			100,
			async ({ body, type }) => {
				expectSound(
					await send({ method: 'POST', path: `/api/v1/designs/${designId}/revisions`, body, type }),
					['baseRevision', 'params', 'message'],
					wheelNames
				);
			},
			35
		);
		await run(
			bodyArb({ revision: base, baseRevision: base, message: text }, { revision: 1, baseRevision: 1 }),
			80,
			async ({ body, type }) => {
				expectSound(await send({ method: 'POST', path: `/api/v1/designs/${designId}/restore`, body, type }), [
					'revision',
					'baseRevision',
					'message'
				]);
			},
			36
		);
	}, 120_000);

	it('GET compare, revisions and revision files: queries and path segments', async () => {
		await run(
			queryArb(['a', 'b'], { a: '1', b: '1' }),
			100,
			async (q) => expectSound(await send({ method: 'GET', path: `/api/v1/designs/${designId}/compare?${q}` }), ['a', 'b']),
			37
		);
		const number = fc.oneof(
			fc.constantFrom(
				'1',
				'2',
				'0',
				'-1',
				'1.5',
				'1e3',
				'1e400',
				'NaN',
				'Infinity',
				'2147483648',
				'99999999999999999999',
				'%20',
				'+1',
				'0x1',
				' 1'
			),
			numberText.map(encodeURIComponent)
		);
		const file = fc.oneof(
			fc.constantFrom(
				'wheel.dxf',
				'wheel.svg',
				'wheel.pdf',
				'wheel.',
				'wheel',
				'wheel.exe',
				'WHEEL.DXF',
				'wheel.dxf.pdf',
				'..',
				'%2e%2e',
				'wheel.%00'
			),
			fc.string({ maxLength: 20 }).map(encodeURIComponent)
		);
		await run(
			fc.tuple(number, file),
			100,
			async ([n, f]) => {
				expectSound(await send({ method: 'GET', path: `/api/v1/designs/${designId}/revisions/${n}` }), []);
				expectSound(await send({ method: 'GET', path: `/api/v1/designs/${designId}/revisions/${n}/${f}` }), []);
			},
			38
		);
	}, 120_000);

	it('POST tdc-records and tapes: records with the tools’ parameters', async () => {
		await run(
			bodyArb({ label: text, params: paramsArb(tdcNames, tdcBase) }, { label: 'l', params: tdcBase }),
			80,
			async ({ body, type }) => {
				expectSound(
					await send({ method: 'POST', path: `/api/v1/builds/${buildId}/tdc-records`, body, type }),
					['label', 'params'],
					tdcNames
				);
			},
			39
		);
		await run(
			bodyArb({ label: text, params: paramsArb(tapeNames, tapeBase) }, { label: 'l', params: tapeBase }),
			80,
			async ({ body, type }) => {
				expectSound(await send({ method: 'POST', path: `/api/v1/builds/${buildId}/tapes`, body, type }), ['label', 'params'], tapeNames);
			},
			40
		);
	}, 120_000);

	it('POST /api/v1/photos/:id/reading: taps of any shape', async () => {
		const point = fc.oneof(
			fc.record({
				x: fc.oneof(fc.double(), fc.integer({ min: -10, max: 80 })),
				y: fc.oneof(fc.double(), fc.integer({ min: -10, max: 80 }))
			}),
			jsonValue
		);
		const tips = fc.oneof(fc.array(point, { maxLength: 30 }), jsonValue);
		const od = fc.oneof(fc.double(), fc.constantFrom('3 1/2', '100', '1/0', '', '9'.repeat(400)), jsonValue);
		const units = fc.oneof(fc.constantFrom('mm', 'in', 'cm', ''), jsonValue);
		await run(
			bodyArb(
				{ centre: point, tips, od, units, odMm: fc.oneof(fc.double(), jsonValue) },
				{ centre: { x: 32, y: 32 }, tips: [{ x: 60, y: 32 }], odMm: 100 }
			),
			80,
			async ({ body, type }) => {
				// `image` is the photo itself: the reading's refusal when the taps find no teeth in it.
				expectSound(await send({ method: 'POST', path: `/api/v1/photos/${photoId}/reading`, body, type }), [
					'centre',
					'tips',
					'od',
					'units',
					'odMm',
					'image'
				]);
			},
			41
		);
	}, 120_000);

	it('POST /api/v1/builds/:id/cutting-packages: the package request', async () => {
		const fields = {
			designId: fc.oneof(fc.constant(designId), fc.uuid().map(String), text),
			revision: fc.oneof(fc.integer({ min: -2, max: 3 }), fc.constantFrom(2 ** 31, 1e300, 0.5)),
			to: fc.oneof(fc.emailAddress(), text),
			quantity: fc.oneof(fc.integer({ min: -5, max: 20_000 }), fc.constantFrom(1e300, 0.5)),
			notes: text
		};
		await run(
			bodyArb(fields, { designId, revision: 1, to: 'cutter@example.test', quantity: 2, notes: '' }),
			80,
			async ({ body, type }) => {
				expectSound(await send({ method: 'POST', path: `/api/v1/builds/${buildId}/cutting-packages`, body, type }), [
					'designId',
					'revision',
					'to',
					'quantity',
					'notes'
				]);
			},
			42
		);
	}, 120_000);

	it('GET /api/v1/builds/:id/build-sheet.pdf: design and revision', async () => {
		await run(
			queryArb(['design', 'revision'], { revision: '1' }),
			60,
			async (q) =>
				expectSound(await send({ method: 'GET', path: `/api/v1/builds/${buildId}/build-sheet.pdf?${q}` }), [
					'design',
					'revision',
					...sheetNames
				]),
			43
		);
	}, 120_000);

	it('made-up ids in every path answer 4xx, never touching real objects', async () => {
		const paths = (id: string) => [
			['GET', `/api/v1/builds/${id}`],
			['PATCH', `/api/v1/builds/${id}`],
			['DELETE', `/api/v1/builds/${id}`],
			['PUT', `/api/v1/builds/${id}/engine`],
			['GET', `/api/v1/builds/${id}/designs`],
			['POST', `/api/v1/builds/${id}/designs`],
			['GET', `/api/v1/builds/${id}/photos`],
			['GET', `/api/v1/builds/${id}/cutting-packages`],
			['GET', `/api/v1/builds/${id}/build-sheet.pdf`],
			['POST', `/api/v1/builds/${id}/tdc-records`],
			['DELETE', `/api/v1/builds/${buildId}/tdc-records/${id}`],
			['POST', `/api/v1/builds/${id}/tapes`],
			['DELETE', `/api/v1/builds/${buildId}/tapes/${id}`],
			['GET', `/api/v1/designs/${id}`],
			['GET', `/api/v1/designs/${id}/revisions`],
			['POST', `/api/v1/designs/${id}/revisions`],
			['POST', `/api/v1/designs/${id}/restore`],
			['GET', `/api/v1/designs/${id}/compare?a=1&b=1`],
			['GET', `/api/v1/designs/${id}/revisions/1/wheel.dxf`],
			['GET', `/api/v1/photos/${id}`],
			['DELETE', `/api/v1/photos/${id}`],
			['GET', `/api/v1/photos/${id}/thumbnail`],
			['POST', `/api/v1/photos/${id}/reading`]
		];
		await run(
			madeUpId,
			20,
			async (id) => {
				for (const [method, path] of paths(id)) {
					const a = await send({
						method: method!,
						path: path!,
						...(method === 'GET' || method === 'DELETE' ? {} : { body: '{"name":"x","params":{}}', type: 'application/json' })
					});
					expectSound(a, []);
					// A made-up id finds nothing: never a success (the real ids are not among the generated
					// ones). An empty or dot segment may be answered by the router's redirect, not followed.
					expect(a.status >= 200 && a.status < 300, `${shown(a.request)} → ${a.status}`).toBe(false);
				}
			},
			44
		);
		// And the real objects are all still there.
		for (const path of [`/api/v1/builds/${buildId}`, `/api/v1/designs/${designId}`, `/api/v1/photos/${photoId}`])
			expect((await send({ method: 'GET', path })).status, path).toBe(200);
	}, 120_000);

	it('unexpected methods and bodies on every route answer 4xx or a success, never 5xx', async () => {
		const routes = () => [
			'/api/health',
			'/api/v1/wheel?teeth=36&od=100&depth=5',
			'/api/v1/wheel.dxf',
			'/api/v1/wheel.svg',
			'/api/v1/wheel.pdf',
			'/api/v1/tape',
			'/api/v1/tape.pdf',
			'/api/v1/tdc',
			'/api/v1/timing-card.pdf',
			'/api/v1/phasing',
			'/api/v1/build-sheet.pdf',
			'/api/v1/builds',
			`/api/v1/builds/${buildId}`,
			`/api/v1/builds/${buildId}/engine`,
			`/api/v1/builds/${buildId}/designs`,
			`/api/v1/builds/${buildId}/photos`,
			`/api/v1/builds/${buildId}/cutting-packages`,
			`/api/v1/builds/${buildId}/tdc-records`,
			`/api/v1/builds/${buildId}/tapes`,
			`/api/v1/builds/${buildId}/build-sheet.pdf`,
			`/api/v1/designs/${designId}`,
			`/api/v1/designs/${designId}/revisions`,
			`/api/v1/designs/${designId}/revisions/1`,
			`/api/v1/designs/${designId}/revisions/1/wheel.svg`,
			`/api/v1/designs/${designId}/restore`,
			`/api/v1/designs/${designId}/compare`,
			`/api/v1/photos/${photoId}`,
			`/api/v1/photos/${photoId}/thumbnail`,
			`/api/v1/photos/${photoId}/reading`
		];
		// DELETE only on made-up ids (above): here it would remove the bench itself.
		const method = fc.constantFrom('GET', 'HEAD', 'POST', 'PUT', 'PATCH', 'OPTIONS');
		await run(
			fc.tuple(
				fc.nat(),
				method,
				fc.option(
					fc.oneof(
						fc.constantFrom(...rawTexts),
						jsonValue.map((v) => JSON.stringify(v))
					),
					{ nil: undefined }
				),
				contentType
			),
			150,
			async ([n, m, body, type]) => {
				const list = routes();
				const withBody = m !== 'GET' && m !== 'HEAD';
				expectSound(
					await send({ method: m, path: list[n % list.length]!, ...(withBody && body !== undefined ? { body, type } : {}) }),
					everyName
				);
			},
			45
		);
		for (const path of [`/api/v1/builds/${buildId}`, `/api/v1/designs/${designId}`, `/api/v1/photos/${photoId}`])
			expect((await send({ method: 'GET', path })).status, path).toBe(200);
	}, 120_000);

	// Found by the fuzz or by what it pointed at (PostgreSQL refuses NUL in text, NUL and unpaired
	// surrogates in jsonb, and integers past 2^31 − 1: each was a 500), kept as regressions.
	it('regressions: values PostgreSQL cannot store, and numbers past its integer, are refused naming the field', async () => {
		const cases: [string, string, unknown, string, RegExp][] = [
			// Names are one line without control characters now (src/lib/schemas/text.ts): NUL is one of those.
			['POST', '/api/v1/builds', { name: 'a\u0000b' }, 'name', /^name: one line of text without control/],
			['PATCH', `/api/v1/builds/${buildId}`, { notes: 'lone \ud800 surrogate' }, 'notes', /^notes: text without NUL or unpaired surrogate/],
			['GET', '/api/v1/builds?q=%00', undefined, 'q', /^q: /],
			[
				'POST',
				`/api/v1/builds/${buildId}/designs`,
				{ name: 'n', params: { ...wheel, label: 'x\u0000' } },
				'params',
				/^params: names and values without NUL/
			],
			['POST', `/api/v1/builds/${buildId}/tapes`, { params: { diameter: '150', timing: '\udfff' } }, 'params', /^params: /],
			[
				'PUT',
				`/api/v1/builds/${buildId}/engine`,
				{ params: { ...phasingBase, layout: null } },
				'params.layout',
				/^params: each value text, a number or true\/false/
			],
			[
				'POST',
				`/api/v1/designs/${designId}/restore`,
				{ revision: 2 ** 31, baseRevision: 1 },
				'revision',
				/^revision: a whole number from 1 to 1000000/
			],
			['POST', `/api/v1/designs/${designId}/revisions`, { baseRevision: 2 ** 31, params: wheel }, 'baseRevision', /^baseRevision: /],
			[
				'POST',
				`/api/v1/builds/${buildId}/cutting-packages`,
				{ designId, revision: 2 ** 31, to: 'cutter@example.test', quantity: 1 },
				'revision',
				/^revision: /
			],
			['GET', `/api/v1/designs/${designId}/compare?a=&b=Infinity`, undefined, 'b', /^b: a whole number from 1/]
		];
		for (const [method, path, body, field, says] of cases) {
			const a = await send({ method, path, ...(body === undefined ? {} : { body: JSON.stringify(body), type: 'application/json' }) });
			expect(a.status, shown(a.request)).toBe(400);
			expect(a.json?.errors?.[field], shown(a.request)).toMatch(says);
		}
		const compare = await send({ method: 'GET', path: `/api/v1/designs/${designId}/compare?a=0&b=1` });
		expect(compare.json?.errors).toEqual({ a: 'a: a whole number from 1' });
	});

	it('regression: a large body a refusal leaves unread does not stall the connection for the next request', async () => {
		// 300 KB of JSON sent signed out is answered before it is read (401 then; now 413, over the
		// 64 KB body cap of every route but the photo upload); the next requests on the same
		// keep-alive connection used to hang until the server's keep-alive timeout reset them.
		const body = JSON.stringify({ name: 'x', engine: 'e'.repeat(300_000) });
		for (let i = 0; i < 4; i++) {
			const a = await send(
				{ method: i % 2 ? 'PATCH' : 'POST', path: i % 2 ? `/api/v1/builds/${buildId}` : '/api/v1/builds', body, type: 'application/json' },
				false
			);
			expect(a.status, `request ${i}`).toBe(413);
		}
		// Under the cap, the refusal is still the sign-in's.
		const small = JSON.stringify({ name: 'x', engine: 'e'.repeat(60_000) });
		for (let i = 0; i < 4; i++)
			expect(
				(await send({ method: 'POST', path: '/api/v1/builds', body: small, type: 'application/json' }, false)).status,
				`request ${i}`
			).toBe(401);
	});

	it('names with control, line-break or direction-override characters anywhere are refused naming the field, and never stored', async () => {
		// The characters: Unicode general category Cc (C0, DEL, C1), U+2028/U+2029, and UAX #9's explicit
		// embeddings, overrides and isolates (U+202A–U+202E, U+2066–U+2069).
		const refusedChars = [
			...Array.from({ length: 0x20 }, (_, i) => i),
			0x7f,
			0x85,
			0x9f,
			0x2028,
			0x2029,
			0x202a,
			0x202c,
			0x202e,
			0x2066,
			0x2069
		].map((cp) => String.fromCodePoint(cp));
		const named = fc
			.tuple(fc.string({ minLength: 1, maxLength: 12 }), fc.constantFrom(...refusedChars), fc.string({ minLength: 1, maxLength: 12 }))
			.map(([a, c, b]) => `x${a}${c}${b}x`);
		const routes: { method: string; path: () => string; body: (name: string) => unknown; field: string }[] = [
			{ method: 'POST', path: () => '/api/v1/builds', body: (name) => ({ name }), field: 'name' },
			{ method: 'PATCH', path: () => `/api/v1/builds/${buildId}`, body: (name) => ({ name }), field: 'name' },
			{ method: 'POST', path: () => `/api/v1/builds/${buildId}/designs`, body: (name) => ({ name, params: wheel }), field: 'name' },
			{ method: 'POST', path: () => `/api/v1/builds/${buildId}/tapes`, body: (label) => ({ label, params: tapeBase }), field: 'label' },
			{
				method: 'POST',
				path: () => `/api/v1/designs/${designId}/revisions`,
				body: (message) => ({ baseRevision: 1, params: wheel, message }),
				field: 'message'
			}
		];
		await run(
			fc.tuple(fc.nat(), named),
			120,
			async ([n, name]) => {
				const route = routes[n % routes.length]!;
				const a = await send({
					method: route.method,
					path: route.path(),
					body: JSON.stringify(route.body(name)),
					type: 'application/json'
				});
				expect(a.status, shown(a.request)).toBe(400);
				expect(String(a.json?.errors?.[route.field]), shown(a.request)).toMatch(new RegExp(`^${route.field}: one line of text`));
			},
			47
		);
		const { body } = await (async () => ({
			body: (await send({ method: 'GET', path: `/api/v1/builds/${buildId}` })).json as unknown as {
				build: { name: string };
				designs: { name: string }[];
				tapes: { label: string }[];
			}
		}))();
		const stored = [body.build.name, ...body.designs.map((d) => d.name), ...body.tapes.map((t) => t.label)];
		expect(stored.filter((s) => /[\p{Cc}\u2028\u2029\u202a-\u202e\u2066-\u2069]/u.test(s))).toEqual([]);
	}, 120_000);

	it('signed out, the signed-in routes refuse any input with 4xx, never 5xx', async () => {
		await run(
			fc.tuple(queryArb(buildFields, {}), bodyArb({ name: text }, { name: 'x' })),
			40,
			async ([q, { body, type }]) => {
				for (const [method, path] of [
					['GET', `/api/v1/builds?${q}`],
					['POST', '/api/v1/builds'],
					['PATCH', `/api/v1/builds/${buildId}`],
					['POST', `/api/v1/designs/${designId}/revisions`]
				]) {
					const a = await send({ method: method!, path: path!, ...(method === 'GET' ? {} : { body, type }) }, false);
					expectSound(a, buildFields);
					// A bad list query may be refused before the sign-in is looked at; nothing else gets through.
					expect([400, 401, 403, 404], shown(a.request)).toContain(a.status);
				}
			},
			46
		);
	}, 120_000);
});
