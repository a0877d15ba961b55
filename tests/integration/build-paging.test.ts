// A build's lists are bounded and paged by cursor (issue 20): the build's page shows the newest 20
// of each, its API the newest 50, and the list routes walk the rest with `next`. The oracle is the
// seeded rows themselves, read back from the database and sorted here (newest first, then id,
// the order the brief asks for), never the app's own order.
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connect } from '../../src/lib/server/db';
import { activity, tdcRecord, wheelPhoto } from '../../src/lib/server/db/schema';
import { Client, freshEmail, signUp } from '../support/client';

const database = connect(process.env.DATABASE_URL!);
afterAll(() => database.$client.end());

const rowsEach = 130;
let owner: Client;
let stranger: Client;
let buildId: string;

/**
 * Times that make paging hard: runs of rows in the same microsecond (the id decides), rows a
 * microsecond apart within one millisecond (a cursor kept in milliseconds would skip or repeat them).
 */
function awkwardTimes(n: number): string[] {
	return Array.from({ length: n }, (_, i) => {
		const ms = 1_780_000_000_000 + Math.floor(i / 10) * 1000;
		const micro = i % 10 < 4 ? 0 : i % 10; // four rows share the microsecond, then one each
		return `${new Date(ms).toISOString().slice(0, 23)}${String(micro).padStart(3, '0')}Z`;
	});
}

interface Keyed {
	id: string;
	at: string;
}
/** Newest first, then the larger id: uuid order in PostgreSQL is the order of the lower-case hex text. */
const newestFirst = (rows: Keyed[]) =>
	[...rows].sort((a, b) => (a.at === b.at ? (a.id < b.id ? 1 : a.id > b.id ? -1 : 0) : a.at < b.at ? 1 : -1)).map((r) => r.id);

async function seeded(table: 'wheel_photo' | 'tdc_record' | 'activity'): Promise<Keyed[]> {
	const result = await database.execute<{ id: string; at: string }>(
		sql`select id::text as id, to_char(created_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US') as at from ${sql.identifier(table)} where build_id = ${buildId}`
	);
	return result.rows;
}

beforeAll(async () => {
	owner = await signUp('paging owner', freshEmail('paging'));
	stranger = await signUp('paging stranger', freshEmail('paging-stranger'));
	buildId = (await owner.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Many rows' })).body.id;
	const times = awkwardTimes(rowsEach);
	await database.insert(wheelPhoto).values(
		times.map((at, i) => ({
			buildId,
			name: `photo ${i}.jpg`,
			mime: 'image/jpeg',
			width: 10,
			height: 10,
			sizeBytes: 100,
			sha256: String(i).padStart(64, '0'),
			storageKey: `paging/${buildId}/${i}`,
			thumbnailKey: `paging/${buildId}/${i}.thumb`,
			createdAt: new Date(at),
			// The Date above keeps milliseconds; the microseconds are set below in SQL.
			photoReading: { at }
		}))
	);
	await database.execute(sql`update wheel_photo set created_at = (photo_reading->>'at')::timestamptz where build_id = ${buildId}`);
	await database
		.insert(tdcRecord)
		.values(times.map((at, i) => ({ buildId, label: at, params: { a: '10 BTDC', b: '10 ATDC' }, tdcDeg: String(i % 2) })));
	await database.execute(sql`update tdc_record set created_at = label::timestamptz where build_id = ${buildId}`);
	await database.insert(activity).values(times.map((at) => ({ buildId, actorId: null, kind: 'tdc', summary: at })));
	// The build's own "created" entry stays as it is, with its real (later) time.
	await database.execute(sql`update activity set created_at = summary::timestamptz where build_id = ${buildId} and summary like '20%'`);
});

type ListBody = Record<string, { id: string }[]> & { next: string | null };

async function walk(route: string, key: string, first: { ids: string[]; next: string | null }) {
	const ids = [...first.ids];
	let next = first.next;
	for (let pages = 0; next && pages < 20; pages++) {
		const res = await owner.json<ListBody>(`/api/v1/builds/${buildId}/${route}?cursor=${encodeURIComponent(next)}`);
		expect(res.status).toBe(200);
		const rows = res.body[key]!;
		expect(rows.length).toBeLessThanOrEqual(50);
		ids.push(...rows.map((r) => r.id));
		next = res.body.next;
	}
	expect(next).toBeNull();
	return ids;
}

describe('a build with 130 photos, TDC records and activity entries', () => {
	it('answers the newest 50 of each in GET /api/v1/builds/:id, and each list route walks the rest once each, in order', async () => {
		const { status, body } = await owner.json<Record<string, { id: string }[]> & { next: Record<string, string | null> }>(
			`/api/v1/builds/${buildId}`
		);
		expect(status).toBe(200);
		for (const [route, key, table] of [
			['photos', 'photos', 'wheel_photo'],
			['tdc-records', 'tdcRecords', 'tdc_record'],
			['activity', 'activity', 'activity']
		] as const) {
			const oracle = newestFirst(await seeded(table));
			expect(oracle.length).toBeGreaterThanOrEqual(rowsEach);
			expect(body[key]!.length).toBe(50);
			const ids = await walk(route, key, { ids: body[key]!.map((r) => r.id), next: body.next[key]! });
			expect(ids, key).toEqual(oracle);
		}
	});

	it('starts a list route at its newest without a cursor', async () => {
		const { body } = await owner.json<ListBody>(`/api/v1/builds/${buildId}/photos`);
		expect(body.photos!.map((p) => p.id)).toEqual(newestFirst(await seeded('wheel_photo')).slice(0, 50));
	});

	it.each(['photos', 'tdc-records', 'tapes', 'signal-checks', 'cutting-packages', 'activity'])(
		'refuses a cursor it did not give on %s with a 400 naming cursor',
		async (route) => {
			const forged = Buffer.from(JSON.stringify(['2026-02-31T00:00:00.000000Z', buildId])).toString('base64url');
			for (const bad of ['x', forged, '%00', 'A'.repeat(400)]) {
				const res = await owner.json<{ errors: Record<string, string>; refusals: { field: string }[] }>(
					`/api/v1/builds/${buildId}/${route}?cursor=${encodeURIComponent(bad)}`
				);
				expect(res.status, bad).toBe(400);
				expect(res.body.refusals[0]!.field).toBe('cursor');
				expect(res.body.errors.cursor).toMatch(/^cursor: /);
			}
		}
	);

	it('answers a stranger 404 on every list route, with or without a cursor', async () => {
		for (const route of ['photos', 'tdc-records', 'tapes', 'signal-checks', 'cutting-packages', 'activity']) {
			expect((await stranger.get(`/api/v1/builds/${buildId}/${route}`)).status, route).toBe(404);
			expect((await stranger.get(`/api/v1/builds/${buildId}/${route}?cursor=x`)).status, route).toBe(404);
		}
		expect((await new Client().get(`/api/v1/builds/${buildId}/activity`)).status).toBe(401);
	});

	it('shows the newest 20 on the page, and "Older photos" opens the next 20', async () => {
		const oracle = newestFirst(await seeded('wheel_photo'));
		const shown = (html: string) => [...html.matchAll(/\/builds\/[0-9a-f-]{36}\/photos\/([0-9a-f-]{36})/g)].map((m) => m[1]);
		const first = await (await owner.get(`/builds/${buildId}`)).text();
		expect([...new Set(shown(first))]).toEqual(oracle.slice(0, 20));
		const older = /<a[^>]*href="([^"]*)"[^>]*>Older photos<\/a>/.exec(first)?.[1]?.replaceAll('&amp;', '&');
		expect(older).toMatch(/\?photos=/);
		const second = await owner.get(older!);
		expect(second.status).toBe(200);
		const html = await second.text();
		expect([...new Set(shown(html))]).toEqual(oracle.slice(20, 40));
		expect(html).toContain('Newest photos');
		expect((await owner.get(`/builds/${buildId}?photos=nonsense`)).status).toBe(400);
	});
});
