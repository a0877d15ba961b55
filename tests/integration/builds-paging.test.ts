// Issue 20: the builds list and a design's history paged by keyset cursors, against the real
// database and built server. The oracle is the rows as the test inserted them, sorted here by the
// rule the API documents (the sort column, then the id, in the same direction): never the code under test.
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connect } from '../../src/lib/server/db';
import { signUp, freshEmail, type Client } from '../support/client';

const database = connect(process.env.DATABASE_URL!);
afterAll(() => database.$client.end());

type Row = { id: string; name: string; created: string; updated: string };
type Page = { builds: { id: string; name: string }[]; next: string | null };
type Refused = { code: string; errors: Record<string, string>; refusals: { field: string; message: string }[] };

const wheel = { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', thickness: '3', bore: '20' };

/** Every page from the first, following `next`, with the query given. */
async function walk(client: Client, query: string): Promise<{ ids: string[]; pages: number }> {
	const ids: string[] = [];
	let cursor: string | null = null;
	let pages = 0;
	do {
		const res: { status: number; body: Page } = await client.json<Page>(`/api/v1/builds?${query}${cursor ? `&cursor=${cursor}` : ''}`);
		expect(res.status).toBe(200);
		ids.push(...res.body.builds.map((b) => b.id));
		cursor = res.body.next;
		pages++;
		expect(pages).toBeLessThan(50);
	} while (cursor);
	return { ids, pages };
}

const byKey = (key: 'created' | 'updated' | 'name', dir: 'asc' | 'desc') => (x: Row, y: Row) => {
	// Microsecond timestamps as fixed-width ISO text and ids as lower-case hex order the way PostgreSQL's timestamptz and uuid do.
	const order = x[key] < y[key] ? -1 : x[key] > y[key] ? 1 : key === 'name' ? 0 : x.id < y.id ? -1 : x.id > y.id ? 1 : 0;
	return dir === 'asc' ? order : -order;
};

describe('the builds list, keyset paged', () => {
	let client: Client;
	let rows: Row[] = [];
	let workshopId: string;

	beforeAll(async () => {
		client = await signUp('Keyset owner', freshEmail('keyset'));
		workshopId = (await client.json<{ workshop: { id: string } }>('/api/v1/builds')).body.workshop.id;
		// 120 builds whose times tie in groups of up to 8 (microseconds given, as PostgreSQL keeps
		// them): the id must break the ties, and a millisecond-rounded cursor would skip rows.
		const inserted = await database.execute<Row>(sql`
			insert into build (workshop_id, name, engine, created_at, updated_at)
			select ${workshopId}::uuid, 'Paging ' || lpad(g::text, 3, '0'), case when g % 10 = 0 then 'Findable flathead ' || g else 'Single' end,
				timestamptz '2026-01-01 00:00:00.000001+00' + ((g % 15) * interval '1 minute') + interval '0.000123 second',
				timestamptz '2026-06-01 00:00:00.654321+00' + ((g % 17) * interval '1 second')
			from generate_series(1, 120) g
			returning id::text, name,
				to_char(created_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US') as created,
				to_char(updated_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US') as updated`);
		rows = inserted.rows;
		expect(rows).toHaveLength(120);
	});

	for (const [sort, dir, key] of [
		['updated', 'desc', 'updated'],
		['updated', 'asc', 'updated'],
		['created', 'desc', 'created'],
		['created', 'asc', 'created'],
		['name', 'asc', 'name'],
		['name', 'desc', 'name']
	] as const) {
		it(`walks every page of sort=${sort}&dir=${dir}: each build once, in order`, async () => {
			const { ids, pages } = await walk(client, `sort=${sort}&dir=${dir}&size=25`);
			expect(pages).toBe(5);
			expect(ids).toEqual([...rows].sort(byKey(key, dir)).map((r) => r.id));
		});
	}

	it('pages a search the same way, through name and engine', async () => {
		const { ids, pages } = await walk(client, 'q=findable&size=5');
		expect(pages).toBe(3);
		const expected = rows.filter((r) => Number(r.name.slice(-3)) % 10 === 0);
		expect(ids).toEqual([...expected].sort(byKey('updated', 'desc')).map((r) => r.id));
		const byName = await client.json<Page>('/api/v1/builds?q=paging%20117');
		expect(byName.body.builds.map((b) => b.name)).toEqual(['Paging 117']);
	});

	it('answers no next on an exact last page (one row more was asked for, none came)', async () => {
		const first = await client.json<Page>('/api/v1/builds?size=60');
		const second = await client.json<Page>(`/api/v1/builds?size=60&cursor=${first.body.next}`);
		expect(second.body.builds).toHaveLength(60);
		expect(second.body.next).toBeNull();
	});

	it('refuses a bad cursor with 400 naming cursor, never a 500', async () => {
		const good = (await client.json<Page>('/api/v1/builds?size=5')).body.next!;
		const forged = (parts: unknown) => Buffer.from(JSON.stringify(parts)).toString('base64url');
		for (const cursor of [
			'not-a-cursor!',
			'%00',
			'x'.repeat(700),
			good.slice(0, -3),
			forged(['updated', 'desc', 'yesterday', rows[0]!.id]),
			forged(['updated', 'desc', '2026-13-45T99:99:99.000000Z', rows[0]!.id]),
			forged(['updated', 'desc', '2026-06-01T00:00:00.654321Z', "1' or '1'='1"]),
			forged(['colour', 'desc', '2026-06-01T00:00:00.654321Z', rows[0]!.id]),
			forged({ sort: 'updated' })
		]) {
			const res = await client.json<Refused>(`/api/v1/builds?cursor=${encodeURIComponent(cursor)}`);
			expect(res.status, cursor).toBe(400);
			expect(res.body.errors.cursor).toMatch(/^cursor: /);
			expect(res.body.refusals.map((r) => r.field)).toEqual(['cursor']);
		}
		// A cursor of the default sort (updated, newest first) used under another sort or direction.
		for (const other of ['sort=name', 'sort=updated&dir=asc', 'sort=created']) {
			const res = await client.json<Refused>(`/api/v1/builds?${other}&cursor=${good}`);
			expect(res.status, other).toBe(400);
			expect(res.body.errors.cursor).toMatch(/another sort or direction/);
		}
	});

	it('the page gets a plain "More builds" link with the cursor, and ignores a bad one', async () => {
		const html = await (await client.get('/builds?sort=name')).text();
		const href = /href="([^"]*cursor=[^"]*)"[^>]*>More builds/.exec(html)?.[1]?.replace(/&amp;/g, '&');
		expect(href).toMatch(/^\/builds\?sort=name&cursor=[A-Za-z0-9_-]+$/);
		const next = await (await client.get(href!)).text();
		// Names sort as zero-padded numbers: page two of twenty starts at Paging 021.
		expect(next).toMatch(/>\s*Paging 021\s*</);
		expect(next).not.toMatch(/>\s*Paging 020\s*</);
		const bad = await client.get('/builds?cursor=garbage');
		expect(bad.status).toBe(200);
	});
});

describe('a design’s revisions, keyset paged', () => {
	let client: Client;
	let designId: string;
	let buildId: string;

	beforeAll(async () => {
		client = await signUp('Revisions owner', freshEmail('rev-paging'));
		buildId = (await client.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Long history' })).body.id;
		const design = await client.send<{ id: string }>('POST', `/api/v1/builds/${buildId}/designs`, { name: 'Crank', params: wheel });
		designId = design.body.id;
		// 119 more revisions written straight in (a save each through the API would only be slower).
		await database.execute(sql`
			insert into wheel_revision (design_id, number, params, message)
			select ${designId}::uuid, g, ${JSON.stringify(wheel)}::jsonb, case when g % 40 = 0 then 'Bore opened to 25' else 'Step ' || g end
			from generate_series(2, 120) g`);
	});

	it('answers the newest 50 with the head number, then older pages by cursor, each revision once', async () => {
		type Design = { headRevision: number; revisions: { number: number }[]; next: string | null };
		const seen: number[] = [];
		let cursor: string | null = null;
		let first: Design | undefined;
		do {
			const res: { status: number; body: Design } = await client.json<Design>(
				`/api/v1/designs/${designId}${cursor ? `?cursor=${cursor}` : ''}`
			);
			expect(res.status).toBe(200);
			first ??= res.body;
			expect(res.body.headRevision).toBe(120);
			seen.push(...res.body.revisions.map((r) => r.number));
			cursor = res.body.next;
		} while (cursor);
		expect(first!.revisions).toHaveLength(50);
		expect(seen).toEqual(Array.from({ length: 120 }, (_, i) => 120 - i));
		const list = await client.json<{ revisions: { number: number }[]; next: string | null }>(
			`/api/v1/designs/${designId}/revisions?q=bore`
		);
		expect(list.body).toEqual({
			revisions: [
				expect.objectContaining({ number: 120 }),
				expect.objectContaining({ number: 80 }),
				expect.objectContaining({ number: 40 })
			],
			next: null
		});
		const byNumber = await client.json<{ revisions: { number: number }[] }>(`/api/v1/designs/${designId}/revisions?q=7`);
		expect(byNumber.body.revisions.map((r) => r.number)).toContain(7);
	});

	it('the build’s designs carry the head revision (the 120 inserted)', async () => {
		const res = await client.json<{ designs: { id: string; headRevision: number }[] }>(`/api/v1/builds/${buildId}/designs`);
		expect(res.body.designs).toEqual([expect.objectContaining({ id: designId, headRevision: 120 })]);
	});

	it('refuses a bad revision cursor with 400 naming cursor', async () => {
		for (const cursor of [
			'zzz',
			Buffer.from('["0"]').toString('base64url'),
			Buffer.from('["-4"]').toString('base64url'),
			Buffer.from('[5]').toString('base64url')
		]) {
			const res = await client.json<Refused>(`/api/v1/designs/${designId}?cursor=${cursor}`);
			expect(res.status, cursor).toBe(400);
			expect(res.body.refusals.map((r) => r.field)).toEqual(['cursor']);
		}
	});

	it('the history page shows 50 revisions, "Older revisions", and compares any two chosen by number', async () => {
		const path = `/builds/${buildId}/designs/${designId}`;
		const html = await (await client.get(`${path}?a=3&b=117`)).text();
		expect(html.match(/data-testid="revision"/g)).toHaveLength(50);
		expect(html).not.toContain('<select');
		expect(html).toMatch(/rel="next"[^>]*>Older revisions|>Older revisions/);
		// Revision 3 is far off the first page, yet compared: its drawing's caption says so.
		expect(html).toContain('A, revision 3');
		expect(html).toContain('B, revision 117');
		const missing = await (await client.get(`${path}?a=500`)).text();
		expect(missing).toContain('There is no revision 500: the newest is 120.');
	});
});
