import { describe, expect, it } from 'vitest';
import { buildDocument } from './document';
import { apiView, takesWords } from './view';

const doc = buildDocument('https://phasewright.example');
const view = apiView(doc);
const operations = view.flatMap((g) => g.operations);
const find = (method: string, path: string) => operations.find((o) => o.method === method && o.path === path);

describe('the API page’s reading of the document', () => {
	it('shows every operation of the document once', () => {
		const inDoc = Object.entries(doc.paths as Record<string, object>).flatMap(([path, ops]) =>
			Object.keys(ops).map((m) => `${m.toUpperCase()} ${path}`)
		);
		expect(operations.map((o) => `${o.method} ${o.path}`).sort()).toEqual(inDoc.sort());
		expect(new Set(operations.map((o) => o.id)).size).toBe(operations.length);
	});

	it('words ranges as a person reads them', () => {
		expect(takesWords({ type: 'integer', minimum: 1, maximum: 720 })).toBe('whole number 1 to 720');
		expect(takesWords({ type: 'number', minimum: 0.25, maximum: 10 }, undefined, '°')).toBe('number 0.25 to 10°');
		expect(takesWords({ type: 'string' }, { minimum: 10, maximum: 2000 })).toBe('length 10 to 2000 mm (in units)');
		expect(takesWords({ type: 'string', enum: ['mm', 'in'] })).toBe('one of mm, in');
	});

	it('gives a request to copy: the query example for a tool, the body and the cookie for a signed-in write', () => {
		const wheel = find('GET', '/wheel')!;
		const url = new URL(/'([^']+)'/.exec(wheel.example)![1]!);
		expect(url.origin + url.pathname).toBe('https://phasewright.example/api/v1/wheel');
		expect(url.searchParams.get('teeth')).toBe('36');
		const post = find('POST', '/builds')!;
		expect(post.example).toMatch(/^curl -X POST 'https:\/\/phasewright\.example\/api\/v1\/builds'/);
		expect(post.example).toContain(`-b 'authjs.session-token=…'`);
		expect(JSON.parse(/-d '(.+)'$/m.exec(post.example)![1]!)).toEqual({ name: 'CB750 race', engine: 'Honda CB750, 4 cyl' });
		expect(post.access).toBe('Signed in, editor or above');
	});

	it('lists a tool’s parameters inside a saved record’s params, one by one', () => {
		const save = find('POST', '/designs/{designId}/revisions')!;
		const names = save.params.map((p) => p.name);
		expect(names).toEqual(expect.arrayContaining(['baseRevision', 'params', 'params.teeth', 'params.od', 'designId']));
		expect(save.params.find((p) => p.name === 'params.teeth')?.required).toBe(true);
	});
});
