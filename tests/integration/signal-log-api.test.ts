// POST /api/v1/signal/log against the built server, signed out: logs made from known wheels
// (tests/support/edge-logs.ts, no imports from src) read back, sent each way the route takes them,
// and hostile bodies refused with the row or the field named, never a 500.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { edgeLogCsv, expectedReading, wheelEdges, type WheelRun } from '$support/edge-logs';

const app = process.env.APP_URL!;
// SvelteKit refuses a form content type (multipart, text/plain) posted from another origin; a page of ours sends its own.
const origin = new URL(app).origin;
const post = (body: BodyInit, type: string | null, query: Record<string, string> = {}, headers: Record<string, string> = {}) =>
	fetch(`${app}/api/v1/signal/log?${new URLSearchParams(query)}`, {
		method: 'POST',
		body,
		headers: { ...(type ? { 'content-type': type } : {}), origin, ...headers }
	});

// A 60-2 cranking (a 30 % swing once per four-stroke cycle) with two dropped edges and a spike.
const run: WheelRun = {
	teeth: 60,
	missing: 2,
	rpm: 250,
	turns: 8,
	startPosition: 17,
	swingPct: 30,
	swingOrder: 0.5,
	jitter: 0.01,
	drop: [100, 300],
	double: [200],
	seed: 11
};
const edges = wheelEdges(run);
const csv = edgeLogCsv(edges, 'us');
const expected = expectedReading(run, edges, 'us');

describe('POST /api/v1/signal/log', () => {
	it('reads a text/csv log signed out: the pattern, the noise at its rows, compared with the design', async () => {
		const res = await post(csv, 'text/csv', { teeth: '60', missing: '2' });
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body).toMatchObject({
			kind: 'times',
			unit: 'us',
			pattern: { teeth: 60, missing: 2, gapAt: expected.gapAt, gapRow: expected.gapRow },
			matchesDesign: true,
			missingEdges: { count: 2, at: expected.missing },
			extraEdges: { count: 1, rows: expected.extraRows }
		});
		expect(body.meanRpm).toBeGreaterThan(240);
		expect(body.meanRpm).toBeLessThan(260);
		expect((await (await post(csv, 'text/csv', { teeth: '36', missing: '1' })).json()).designDifference).toBe(
			'the log shows 60-2; the design is 36-1 (60 tooth positions to the design’s 36, 2 missing to the design’s 1)'
		);
		expect(res.headers.get('set-cookie')).toBeNull();
	});

	it('takes the same log as a multipart file field log and as text/plain', async () => {
		const form = new FormData();
		form.append('log', new Blob([csv], { type: 'text/csv' }), 'crank.csv');
		const fromForm = await post(form, null, { pattern: 'custom', teeth: '60', gaps: '58, 59' });
		expect(fromForm.status).toBe(200);
		const plain = await post(csv, 'text/plain; charset=utf-8');
		const [a, b] = [await fromForm.json(), await plain.json()];
		expect(a.pattern).toEqual(b.pattern);
		expect(a.matchesDesign).toBe(true);
		expect(b.matchesDesign).toBeNull();
	});

	it('a 100,000-edge log (the bench’s size) is read whole', async () => {
		const long = wheelEdges({ teeth: 36, missing: 1, rpm: 6000, turns: Math.ceil(100_000 / 35), startPosition: 4 }).slice(0, 100_000);
		const text = edgeLogCsv(long, 'us');
		expect(new TextEncoder().encode(text).byteLength).toBeLessThan(4 * 1024 * 1024);
		const res = await post(text, 'text/csv');
		expect(res.status).toBe(200);
		expect(await res.json()).toMatchObject({ edges: 100_000, pattern: { teeth: 36, missing: 1, gapAt: 31 } });
	});

	it('refuses a bad file naming the row, on the field log', async () => {
		const rows = csv.split('\n');
		rows[16] = '12o45';
		const res = await post(rows.join('\n'), 'text/csv');
		expect(res.status).toBe(400);
		const body = await res.json();
		expect(body.refusals).toEqual([
			{ field: 'log', message: 'row 17: not a number (“12o45”); one edge time or tooth space per row, a point for decimals' }
		]);
		expect(body.errors).toEqual({ log: 'log: row 17: not a number (“12o45”); one edge time or tooth space per row, a point for decimals' });
		const back = await post('time_us\n1000\n2000\n1500\n', 'text/csv');
		expect((await back.json()).errors).toEqual({ log: 'log: row 4: time goes backwards (1500 after 2000)' });
		expect((await (await post('', 'text/csv')).json()).errors.log).toMatch(/^log: no rows/);
		expect((await (await post('\u0000\u0001binary', 'text/csv')).json()).errors.log).toMatch(/^log: row 1: not a number|^log: no rows/);
	});

	it('refuses a bad design in the query by its field, and what it cannot read', async () => {
		const bad = await post(csv, 'text/csv', { teeth: '36', missing: '40' });
		expect(bad.status).toBe(400);
		expect((await bad.json()).refusals.map((r: { field: string }) => r.field)).toEqual(['missing']);
		expect((await (await post(csv, 'text/csv', { missing: '2' })).json()).refusals[0]).toMatchObject({ field: 'teeth' });
		expect((await (await post(csv, 'text/csv', { teeth: 'many' })).json()).refusals[0]).toMatchObject({ field: 'teeth' });
		const json = await post(JSON.stringify({ log: csv }), 'application/json');
		expect(json.status).toBe(415);
		expect((await json.json()).refusals[0].field).toBe('log');
		const form = new FormData();
		form.append('file', new Blob([csv]), 'crank.csv');
		const misnamed = await post(form, null);
		expect(misnamed.status).toBe(400);
		expect((await misnamed.json()).errors.log).toBe('log: choose a file: the form has no field named log');
	});

	it('413 for a log over 4 MiB, as a body and as a file', async () => {
		const big = '1000\n'.repeat(Math.ceil((5 * 1024 * 1024) / 5));
		const body = await post(big, 'text/csv');
		expect(body.status).toBe(413);
		expect((await body.json()).code).toBe('too-large');
		// Over the log's cap but inside the route's (the cap plus a form's framing): refused by the route.
		const form = new FormData();
		form.append('log', new Blob(['1000\n'.repeat((4 * 1024 * 1024) / 5 + 10)]), 'big.csv');
		const file = await post(form, null);
		expect(file.status).toBe(413);
		expect(await file.json()).toEqual({ message: 'log: at most 4 MiB; split the log', code: 'too-large' });
	});

	// Hostile input is normal (the project's rule): generated bodies, content types and queries never
	// answer 5xx, and a 400 names only the route's own fields, each message starting with its name.
	it('generated bodies and queries: never a 5xx, refusals by field', async () => {
		const fields = ['log', 'pattern', 'teeth', 'missing', 'gaps', 'extraAfter'];
		const cell = fc.oneof(
			fc.double({ noDefaultInfinity: false }).map(String),
			fc.integer().map(String),
			fc.constantFrom('', '#', 'time_us', 'space', 'µs', '1e400', '-0', '0x10', '1,5', 'NaN', '\u0000', '\uFEFF12', '١٢٣'),
			fc.string({ maxLength: 12 })
		);
		const body = fc.oneof(
			fc.array(fc.array(cell, { minLength: 1, maxLength: 3 }), { maxLength: 60 }).map((rows) => rows.map((r) => r.join(',')).join('\n')),
			fc.constant(csv.slice(0, 2000)),
			fc.string({ maxLength: 300 })
		);
		const type = fc.constantFrom(
			'text/csv',
			'text/plain',
			'text/csv; charset=latin1',
			'application/json',
			'application/octet-stream',
			'multipart/form-data'
		);
		const query = fc.dictionary(fc.constantFrom(...fields, 'units', 'x'), fc.oneof(cell, fc.constantFrom('custom', 'extra', '36', '1')), {
			maxKeys: 3
		});
		await fc.assert(
			fc.asyncProperty(body, type, query, async (text, t, q) => {
				const res = await post(text, t, q as Record<string, string>);
				expect(res.status).toBeLessThan(500);
				const answer = await res.json();
				if (res.status === 400) {
					for (const [field, message] of Object.entries(answer.errors as Record<string, string>)) {
						expect(fields).toContain(field);
						expect(message.startsWith(`${field}: `)).toBe(true);
					}
				}
			}),
			{ numRuns: 150, seed: 1818 }
		);
	}, 120_000);
});
