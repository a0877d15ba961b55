// The thread through a build from the API: each saved thing turns its step done (the rules are in
// src/lib/build-steps.ts), the build-sheet download is logged and read back as the sheet issued,
// and a new wheel revision marks what depended on the old one stale, saying what changed.
import { describe, expect, it } from 'vitest';
import { freshEmail, signUp, type Client } from '../support/client';

type Step = { id: string; state: 'todo' | 'done' | 'stale'; changes: string[]; href: string | null; detail: string };
type Overview = { steps: Step[]; activity: { kind: string; summary: string }[] };

const wheel = { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', thickness: '3', bore: '20' };

async function overview(client: Client, buildId: string) {
	const { status, body } = await client.json<Overview>(`/api/v1/builds/${buildId}`);
	expect(status).toBe(200);
	return body;
}
const states = (o: Overview) => Object.fromEntries(o.steps.map((s) => [s.id, s.state]));
const step = (o: Overview, id: string) => o.steps.find((s) => s.id === id)!;

describe('a build’s steps from the API', () => {
	it('turn done as the build fills, log the build sheet as issued, and go stale with a new revision', async () => {
		const client = await signUp('Thread owner', freshEmail('thread'));
		const created = await client.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Thread bench 350', engine: 'single' });
		expect(created.status).toBe(201);
		const buildId = created.body.id;

		const fresh = await overview(client, buildId);
		expect(fresh.steps.map((s) => s.id)).toEqual(['engine', 'wheel', 'cutting', 'tdc', 'tape', 'phasing', 'sheet']);
		expect(new Set(fresh.steps.map((s) => s.state))).toEqual(new Set(['todo']));

		const profile = { layout: 'single-4', stroke: '4', teeth: '36', missing: '1', toothAtTdc: '9' };
		expect((await client.send('PUT', `/api/v1/builds/${buildId}/engine`, { params: profile })).status).toBe(200);
		const design = await client.send<{ id: string }>('POST', `/api/v1/builds/${buildId}/designs`, {
			name: 'Crank wheel',
			params: wheel,
			message: 'as drawn'
		});
		expect(design.status).toBe(201);
		const tdc = await client.send('POST', `/api/v1/builds/${buildId}/tdc-records`, { params: { a: '-14', b: '15', scale: 'signed' } });
		expect(tdc.status).toBe(201);
		const tape = await client.send('POST', `/api/v1/builds/${buildId}/tapes`, { params: { units: 'mm', diameter: '150' } });
		expect(tape.status).toBe(201);

		const filled = await overview(client, buildId);
		expect(states(filled)).toEqual({
			engine: 'done',
			wheel: 'done',
			cutting: 'todo',
			tdc: 'done',
			tape: 'done',
			phasing: 'done',
			sheet: 'todo'
		});
		const sheetHref = step(filled, 'sheet').href!;
		expect(sheetHref).toBe(`/api/v1/builds/${buildId}/build-sheet.pdf?design=${design.body.id}`);

		// The download itself is what issues the sheet: logged, then read back as done.
		const pdf = await client.get(sheetHref);
		expect(pdf.status).toBe(200);
		expect(pdf.headers.get('content-type')).toContain('application/pdf');
		await pdf.arrayBuffer();
		const issued = await overview(client, buildId);
		expect(step(issued, 'sheet').state).toBe('done');
		const entry = issued.activity.find((a) => a.kind === 'build-sheet');
		expect(entry?.summary).toBe('Build sheet issued, wheel revision 1 of “Crank wheel”');
		expect(step(issued, 'sheet').detail).toBe(entry?.summary);

		// A refused sheet (a design not in the build) issues nothing.
		const refused = await client.get(`/api/v1/builds/${buildId}/build-sheet.pdf?design=00000000-0000-4000-8000-000000000000`);
		expect(refused.status).toBe(404);
		await refused.arrayBuffer();
		const logged = (await overview(client, buildId)).activity.filter((a) => a.kind === 'build-sheet');
		expect(logged).toHaveLength(1);

		// A 24-2 revision: phasing and the sheet are stale, saying what changed; TDC and the tape stay done.
		const revised = await client.send('POST', `/api/v1/designs/${design.body.id}/revisions`, {
			baseRevision: 1,
			params: { ...wheel, teeth: '24', missing: '2' }
		});
		expect(revised.status).toBe(201);
		const after = await overview(client, buildId);
		expect(states(after)).toMatchObject({ wheel: 'done', tdc: 'done', tape: 'done', phasing: 'stale', sheet: 'stale' });
		expect(step(after, 'phasing').changes).toEqual(['teeth 36 → 24', 'missing 1 → 2']);
		expect(step(after, 'sheet').changes).toEqual(['wheel revision 2 saved']);
		const phasingQuery = new URL(step(after, 'phasing').href!, 'http://x').searchParams;
		expect([phasingQuery.get('teeth'), phasingQuery.get('missing'), phasingQuery.get('build')]).toEqual(['24', '2', buildId]);
	});
});
