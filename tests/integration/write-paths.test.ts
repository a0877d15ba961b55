// One write path per operation: the Builds page's form actions and the JSON API change a build the
// same way (issue 15). Each test names the drift it guards against; the expected values come from
// what the other path already did, never from the service under test.
import sharp from 'sharp';
import { sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { connect } from '../../src/lib/server/db';
import { wheelRevision } from '../../src/lib/server/db/schema';
import { listKeys } from '../../src/lib/server/storage';
import { freshEmail, signUp, type Client } from '../support/client';

const database = connect(process.env.DATABASE_URL!);
afterAll(() => database.$client.end());

const wheel = { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', thickness: '3', bore: '20' };

type Activity = { kind: string; summary: string };
type Overview = { build: { name: string }; activity: Activity[] };

async function owner(label: string) {
	const client = await signUp(`${label} owner`, freshEmail(label));
	const { body } = await client.json<{ workshop: { id: string } }>('/api/v1/builds');
	return { client, workshopId: body.workshop.id };
}

async function newBuild(client: Client, name: string) {
	const res = await client.send<{ id: string }>('POST', '/api/v1/builds', { name });
	expect(res.status).toBe(201);
	return res.body.id;
}

const overview = async (client: Client, buildId: string) => (await client.json<Overview>(`/api/v1/builds/${buildId}`)).body;

describe('renaming a build', () => {
	it('from the Builds page writes an activity entry, as PATCH /api/v1/builds/:id does', async () => {
		const me = await owner('rename-log');
		const byPage = await newBuild(me.client, 'Renamed by the page');
		const byApi = await newBuild(me.client, 'Renamed by the API');
		const before = (await overview(me.client, byPage)).activity.length;

		expect(await me.client.action('/builds', 'rename', { buildId: byPage, name: 'Page name, new' })).toMatchObject({ type: 'success' });
		expect((await me.client.send('PATCH', `/api/v1/builds/${byApi}`, { name: 'API name, new' })).status).toBe(200);

		const page = await overview(me.client, byPage);
		const api = await overview(me.client, byApi);
		expect(page.build.name).toBe('Page name, new');
		// One new entry each, of the same kind, each naming the new name.
		expect(page.activity).toHaveLength(before + 1);
		expect(page.activity[0]).toMatchObject({ kind: 'build', summary: expect.stringContaining('Page name, new') });
		expect(api.activity[0]).toMatchObject({ kind: 'build', summary: expect.stringContaining('API name, new') });
	});

	it('refused (the name is taken) changes nothing and logs nothing, from either path', async () => {
		const me = await owner('rename-taken');
		const first = await newBuild(me.client, 'First build');
		await newBuild(me.client, 'Second build');
		const before = await overview(me.client, first);

		const page = await me.client.action('/builds', 'rename', { buildId: first, name: 'Second build' });
		expect(page).toMatchObject({ type: 'failure', status: 409 });
		expect((await me.client.send('PATCH', `/api/v1/builds/${first}`, { name: 'Second build' })).status).toBe(409);

		const after = await overview(me.client, first);
		expect(after.build.name).toBe('First build');
		expect(after.activity).toEqual(before.activity);
	});
});

describe('restoring a revision', () => {
	it('runs the wheel check a save runs, refusing with a 400 naming the fields and writing nothing', async () => {
		const me = await owner('restore-check');
		const buildId = await newBuild(me.client, 'Restore bench');
		const created = await me.client.send<{ id: string }>('POST', `/api/v1/builds/${buildId}/designs`, {
			name: 'Crank wheel',
			params: wheel
		});
		expect(created.status).toBe(201);
		const designId = created.body.id;
		// A revision written under looser rules than today's (straight into the table: the API would refuse it).
		await database
			.insert(wheelRevision)
			.values({ designId, number: 2, params: { ...wheel, teeth: '0' }, message: 'saved before the check' });

		// The same parameters as a save are refused, naming the field (the oracle: the save path's own answer).
		const save = await me.client.send<{ errors: Record<string, string> }>('POST', `/api/v1/designs/${designId}/revisions`, {
			baseRevision: 2,
			params: { ...wheel, teeth: '0' }
		});
		expect(save.status).toBe(400);
		const before = await overview(me.client, buildId);

		const restore = await me.client.send<{ errors: Record<string, string>; refusals: { field: string; message: string }[] }>(
			'POST',
			`/api/v1/designs/${designId}/restore`,
			{
				revision: 2,
				baseRevision: 2
			}
		);
		expect(restore.status).toBe(400);
		expect(restore.body.errors['params.teeth']).toBe(save.body.errors['params.teeth']);
		expect(restore.body.refusals.map((r) => r.field)).toContain('params.teeth');

		const { rows } = await database.execute<{ number: number }>(
			sql`select number from wheel_revision where design_id = ${designId} order by number`
		);
		expect(rows.map((r) => r.number)).toEqual([1, 2]);
		expect((await overview(me.client, buildId)).activity).toEqual(before.activity);

		// Revision 1 passes the check and is restored as revision 3.
		const good = await me.client.send<{ revision: { number: number; restoredFrom: number } }>(
			'POST',
			`/api/v1/designs/${designId}/restore`,
			{ revision: 1, baseRevision: 2 }
		);
		expect(good.status).toBe(201);
		expect(good.body.revision).toMatchObject({ number: 3, restoredFrom: 1 });
	});
});

describe('deleting a build', () => {
	it('from the Builds page removes its photo rows and their stored objects, as DELETE /api/v1/builds/:id does', async () => {
		const me = await owner('delete-paths');
		const png = await sharp({ create: { width: 40, height: 30, channels: 3, background: '#668844' } })
			.png()
			.toBuffer();
		const withPhoto = async (name: string) => {
			const buildId = await newBuild(me.client, name);
			const form = new FormData();
			form.append('file', new Blob([new Uint8Array(png)], { type: 'image/png' }), 'wheel.png');
			expect((await me.client.send('POST', `/api/v1/builds/${buildId}/photos`, form)).status).toBe(201);
			return buildId;
		};
		const byPage = await withPhoto('Deleted from the list');
		const byApi = await withPhoto('Deleted through the API');
		const objects = (buildId: string) => listKeys(`photos/${me.workshopId}/${buildId}/`);
		const photoRows = async (buildId: string) =>
			(await database.execute<{ n: number }>(sql`select count(*)::int as n from wheel_photo where build_id = ${buildId}`)).rows[0]!.n;
		// The photo and its thumbnail (photos/store.ts writes both).
		expect(await objects(byPage)).toHaveLength(2);

		expect(await me.client.action('/builds', 'delete', { buildId: byPage })).toMatchObject({ type: 'success' });
		expect((await me.client.send('DELETE', `/api/v1/builds/${byApi}`)).status).toBe(204);
		for (const buildId of [byPage, byApi]) {
			expect(await objects(buildId)).toEqual([]);
			expect(await photoRows(buildId)).toBe(0);
			expect((await me.client.json(`/api/v1/builds/${buildId}`)).status).toBe(404);
		}
		// Deleting again: nothing there, from either path.
		expect(await me.client.action('/builds', 'delete', { buildId: byPage })).toMatchObject({ type: 'failure', status: 404 });
	}, 60_000);
});

describe('removing a record', () => {
	it('moves the build up the "updated" sort, as saving one does', async () => {
		const me = await owner('record-delete');
		const buildId = await newBuild(me.client, 'Record removed');
		const updatedAt = async () =>
			(await database.execute<{ t: string }>(sql`select updated_at::text as t from build where id = ${buildId}`)).rows[0]!.t;
		const saved = await me.client.send<{ id: string }>('POST', `/api/v1/builds/${buildId}/tdc-records`, {
			params: { a: '20 BTDC', b: '30 ATDC' }
		});
		expect(saved.status).toBe(201);
		const afterSave = await updatedAt();

		expect((await me.client.send('DELETE', `/api/v1/builds/${buildId}/tdc-records/${saved.body.id}`)).status).toBe(204);
		// Timestamps as PostgreSQL prints them sort as text within one time zone.
		expect((await updatedAt()) > afterSave).toBe(true);
	});
});
