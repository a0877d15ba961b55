// Builds, wheel designs and revisions through the JSON API, against the real database.
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connect } from '../../src/lib/server/db';
import { wheelRevision } from '../../src/lib/server/db/schema';
import { Client, freshEmail, mailTo, signUp } from '../support/client';

const database = connect(process.env.DATABASE_URL!);
afterAll(() => database.$client.end());

const wheel = { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', thickness: '3', bore: '20' };

type Revision = { number: number; params: Record<string, string>; message: string; restoredFrom: number | null; author: string | null };

async function owner(label: string) {
	const email = freshEmail(label);
	const client = await signUp(`${label} owner`, email);
	const { body } = await client.json<{ workshop: { id: string } }>('/api/v1/builds');
	return { client, email, workshopId: body.workshop.id };
}

async function newBuild(client: Client, name: string, engine = '') {
	const res = await client.send<{ id: string }>('POST', '/api/v1/builds', { name, engine });
	expect(res.status).toBe(201);
	return res.body.id;
}

async function newDesign(client: Client, buildId: string, name = 'Crank wheel') {
	const res = await client.send<{ id: string; revision: number }>('POST', `/api/v1/builds/${buildId}/designs`, {
		name,
		params: wheel,
		message: 'as drawn'
	});
	expect(res).toMatchObject({ status: 201, body: { revision: 1 } });
	return res.body.id;
}

describe('the builds list from the API', () => {
	let me: Awaited<ReturnType<typeof owner>>;
	beforeAll(async () => {
		me = await owner('list');
		for (const [name, engine] of [
			['Alder 250 single', '250 cc two-stroke'],
			['Birch twin', '650 parallel twin, 360°'],
			['Cedar kart', '125 cc kart'],
			['Damson V-twin', '45° V-twin'],
			['Elm 500', '500 cc single']
		])
			await newBuild(me.client, name!, engine);
	});

	it('searches name and engine, case-insensitively', async () => {
		const { body } = await me.client.json<{ builds: { name: string }[]; next: string | null }>('/api/v1/builds?q=TWIN');
		expect(body.builds.map((b) => b.name).sort()).toEqual(['Birch twin', 'Damson V-twin']);
		expect(body.next).toBeNull();
		// A LIKE wildcard typed by the user is taken literally.
		const wild = await me.client.json<{ builds: unknown[] }>('/api/v1/builds?q=%25');
		expect(wild.body.builds).toEqual([]);
	});

	// Issue 20: keyset pages with a cursor replace page numbers and the total.
	it('sorts and pages with the cursor of the page before, no total; page= is ignored', async () => {
		type Page = { builds: { name: string }[]; next: string | null; total?: number };
		const first = await me.client.json<Page>('/api/v1/builds?sort=name&dir=desc&size=2');
		expect(first.body.builds.map((b) => b.name)).toEqual(['Elm 500', 'Damson V-twin']);
		expect(first.body.total).toBeUndefined();
		const second = await me.client.json<Page>(`/api/v1/builds?sort=name&dir=desc&size=2&cursor=${first.body.next}`);
		expect(second.body.builds.map((b) => b.name)).toEqual(['Cedar kart', 'Birch twin']);
		const third = await me.client.json<Page>(`/api/v1/builds?sort=name&dir=desc&size=2&cursor=${second.body.next}`);
		expect(third.body).toMatchObject({ builds: [{ name: 'Alder 250 single' }], next: null });
		const paged = await me.client.json<Page>('/api/v1/builds?sort=name&size=2&page=3');
		expect(paged.body.builds.map((b) => b.name)).toEqual(['Alder 250 single', 'Birch twin']);
	});

	it('refuses a bad query naming the parameter and its range', async () => {
		const res = await me.client.json<{ errors: Record<string, string> }>('/api/v1/builds?size=1000&sort=colour');
		expect(res.status).toBe(400);
		expect(res.body.errors.size).toMatch(/^size: a whole number from 1 to 100/);
		expect(res.body.errors.sort).toMatch(/^sort: one of name, updated, created/);
	});

	it('creates builds, refusing a taken name with 409 and a blank one with 400', async () => {
		const taken = await me.client.send<{ errors: Record<string, string> }>('POST', '/api/v1/builds', { name: 'Cedar kart' });
		expect(taken.status).toBe(409);
		expect(taken.body.errors.name).toMatch(/^name:/);
		const blank = await me.client.send<{ errors: Record<string, string> }>('POST', '/api/v1/builds', { name: '  ' });
		expect(blank.status).toBe(400);
		expect(blank.body.errors.name).toMatch(/^name: 1 to 120 characters/);
		const notJson = await me.client.send<{ errors: Record<string, string> }>('POST', '/api/v1/builds', 'not json');
		expect(notJson.status).toBe(400);
	});
});

describe('wheel design revisions', () => {
	let me: Awaited<ReturnType<typeof owner>>;
	let designId: string;
	beforeAll(async () => {
		me = await owner('rev');
		designId = await newDesign(me.client, await newBuild(me.client, 'Revision bench'));
	});

	it('saves a revision on the newest base and refuses a stale base with 409, writing nothing', async () => {
		const second = await me.client.send<{ revision: Revision }>('POST', `/api/v1/designs/${designId}/revisions`, {
			baseRevision: 1,
			params: { ...wheel, teeth: '60', missing: '2' },
			message: '60-2 for the new ECU'
		});
		expect(second.status).toBe(201);
		expect(second.body.revision).toMatchObject({
			number: 2,
			message: '60-2 for the new ECU',
			author: me.email,
			params: { teeth: '60', missing: '2' }
		});

		const stale = await me.client.send<{ code: string; head: Revision; yours: { params: Record<string, string> } }>(
			'POST',
			`/api/v1/designs/${designId}/revisions`,
			{ baseRevision: 1, params: { ...wheel, od: '110' } }
		);
		expect(stale.status).toBe(409);
		expect(stale.body.code).toBe('stale');
		expect(stale.body.head.number).toBe(2);
		expect(stale.body.yours.params.od).toBe('110');
		const { body } = await me.client.json<{ revisions: Revision[] }>(`/api/v1/designs/${designId}`);
		expect(body.revisions.map((r) => r.number)).toEqual([2, 1]);
	});

	it('refuses a wheel the designer would refuse, naming the parameter', async () => {
		const res = await me.client.send<{ errors: Record<string, string> }>('POST', `/api/v1/designs/${designId}/revisions`, {
			baseRevision: 2,
			params: { ...wheel, teeth: '0' }
		});
		expect(res.status).toBe(400);
		expect(res.body.errors['params.teeth']).toMatch(/^teeth: /);
		const missing = await me.client.send<{ errors: Record<string, string> }>('POST', `/api/v1/designs/${designId}/revisions`, {
			params: wheel
		});
		expect(missing.body.errors.baseRevision).toMatch(/^baseRevision:/);
	});

	it('lets exactly one of many simultaneous saves from the same base land', async () => {
		const saves = await Promise.all(
			Array.from({ length: 12 }, (_, i) =>
				me.client.send('POST', `/api/v1/designs/${designId}/revisions`, { baseRevision: 2, params: { ...wheel, od: String(101 + i) } })
			)
		);
		expect(saves.filter((s) => s.status === 201)).toHaveLength(1);
		expect(saves.filter((s) => s.status === 409)).toHaveLength(11);
		const { rows } = await database.execute<{ number: number }>(
			sql`select number from wheel_revision where design_id = ${designId} order by number`
		);
		expect(rows.map((r) => r.number)).toEqual([1, 2, 3]);
	});

	it('keeps revision numbers unique and revisions unchangeable in the database itself', async () => {
		await expect(database.insert(wheelRevision).values({ designId, number: 2, params: wheel })).rejects.toMatchObject({
			cause: { code: '23505', constraint: 'wheel_revision_design_number' }
		});
		await expect(
			database.execute(sql`update wheel_revision set message = 'rewritten' where design_id = ${designId}`)
		).rejects.toMatchObject({ cause: { code: 'P0001' } });
	});

	it('compares two revisions parameter by parameter, in the designer’s order, by label and in words', async () => {
		const { status, body } = await me.client.json<{ changes: { name: string; from: string; to: string }[] }>(
			`/api/v1/designs/${designId}/compare?a=1&b=2`
		);
		expect(status).toBe(200);
		// The labels as the designer's form shows them; counts carry no unit.
		expect(body.changes).toEqual([
			{ name: 'teeth', from: '36', to: '60', label: 'Teeth', fromWords: '36', toWords: '60' },
			{ name: 'missing', from: '1', to: '2', label: 'Missing', fromWords: '1', toWords: '2' }
		]);
		const bad = await me.client.json<{ errors: Record<string, string> }>(`/api/v1/designs/${designId}/compare?a=1&b=x`);
		expect(bad.status).toBe(400);
		expect(bad.body.errors.b).toMatch(/^b: a whole number/);
	});

	it('restores an old revision as a new one, leaving history as it was', async () => {
		const res = await me.client.send<{ revision: Revision }>('POST', `/api/v1/designs/${designId}/restore`, {
			revision: 1,
			baseRevision: 3
		});
		expect(res.status).toBe(201);
		expect(res.body.revision).toMatchObject({ number: 4, restoredFrom: 1, params: wheel, message: 'Restores revision 1' });
		const stale = await me.client.send('POST', `/api/v1/designs/${designId}/restore`, { revision: 2, baseRevision: 3 });
		expect(stale.status).toBe(409);
	});

	it('exports a saved revision with its number in the file name', async () => {
		const res = await me.client.get(`/api/v1/designs/${designId}/revisions/2/wheel.dxf`);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-disposition')).toContain('wheel-60-2-100mm-r2.dxf');
		// $INSUNITS 4 = millimetres (DXF reference).
		expect(await res.text()).toMatch(/\$INSUNITS\s+70\s+4/);
		expect((await me.client.get(`/api/v1/designs/${designId}/revisions/9/wheel.dxf`)).status).toBe(404);
		expect((await me.client.get(`/api/v1/designs/${designId}/revisions/2/wheel.exe`)).status).toBe(404);
	});
});

describe('engine profile and records on a build', () => {
	let me: Awaited<ReturnType<typeof owner>>;
	let buildId: string;
	beforeAll(async () => {
		me = await owner('rec');
		buildId = await newBuild(me.client, 'Records bench');
	});

	it('stores the engine profile checked as the phasing check checks it', async () => {
		const params = { teeth: '36', missing: '1', toothAtTdc: '9', layout: 'twin-270', rpm: '9000' };
		const res = await me.client.send<{ phasing: { firstToothOffsetDeg: number } }>('PUT', `/api/v1/builds/${buildId}/engine`, { params });
		expect(res.status).toBe(200);
		// 36-1, tooth 9 at TDC: 9 × 10° = 90° BTDC (geometry, common practice).
		expect(res.body.phasing.firstToothOffsetDeg).toBe(90);
		const bad = await me.client.send<{ errors: Record<string, string> }>('PUT', `/api/v1/builds/${buildId}/engine`, {
			params: { ...params, rpm: '90000' }
		});
		expect(bad.status).toBe(400);
		expect(bad.body.errors.rpm).toMatch(/^rpm: a whole number from 100 to 30000/);
		const { body } = await me.client.json<{ build: { engineProfile: Record<string, string> } }>(`/api/v1/builds/${buildId}`);
		expect(body.build.engineProfile).toEqual(params);
	});

	it('saves TDC records with the TDC found from the marks, and refuses bad marks by field', async () => {
		// Piston-stop marks 29° apart: TDC half-way (common practice).
		const ok = await me.client.send('POST', `/api/v1/builds/${buildId}/tdc-records`, { label: 'cold', params: { a: '-14', b: '15' } });
		expect(ok.status).toBe(201);
		const bad = await me.client.send<{ errors: Record<string, string> }>('POST', `/api/v1/builds/${buildId}/tdc-records`, {
			params: { a: '400', b: '15' }
		});
		expect(bad.status).toBe(400);
		// A plain number past 180 can only be on a 0–360 wheel, and 400 is past its end.
		expect(bad.body.errors['params.a']).toMatch(/^a: a reading from 0 to 360 \(10 = 10 ATDC, 350 = 10 BTDC\)/);
		const tape = await me.client.send('POST', `/api/v1/builds/${buildId}/tapes`, {
			label: 'pulley',
			params: { units: 'mm', diameter: '120' }
		});
		expect(tape.status).toBe(201);
		const { body } = await me.client.json<{
			tdcRecords: { tdcDeg: string; label: string }[];
			tapes: unknown[];
			activity: { kind: string; summary: string }[];
		}>(`/api/v1/builds/${buildId}`);
		expect(body.tdcRecords).toMatchObject([{ label: 'cold', tdcDeg: '0.5' }]);
		expect(body.tapes).toHaveLength(1);
		expect(body.activity.map((a) => a.kind)).toEqual(expect.arrayContaining(['build', 'engine', 'tdc', 'tape']));
	});
});

describe('a cutting package', () => {
	it('e-mails the DXF and the spec of a revision to the fabricator, and logs it', async () => {
		const me = await owner('cut');
		const buildId = await newBuild(me.client, 'Cutting bench');
		const designId = await newDesign(me.client, buildId);
		const to = freshEmail('fabricator');
		const res = await me.client.send<{ files: string[]; revision: number }>('POST', `/api/v1/builds/${buildId}/cutting-packages`, {
			designId,
			to,
			quantity: 2,
			notes: 'Deburr, no paint'
		});
		expect(res.status).toBe(201);
		expect(res.body.files).toEqual(['wheel-36-1-100mm-r1.dxf', 'cutting-spec-36-1-100mm-r1.pdf']);
		const mail = await mailTo(to, 'Cutting order');
		expect(mail.text).toContain('Quantity: 2');
		const list = (await (await fetch(`${process.env.MAILBOX_URL}/messages?to=${encodeURIComponent(to)}`)).json()) as {
			attachments: { filename: string; contentType: string; size: number }[];
		}[];
		expect(list[0]!.attachments.map((a) => a.filename)).toEqual(res.body.files);
		expect(list[0]!.attachments.every((a) => a.size > 500)).toBe(true);
		const { body } = await me.client.json<{ activity: { summary: string }[]; cuttingPackages: { sentTo: string }[] }>(
			`/api/v1/builds/${buildId}`
		);
		expect(body.cuttingPackages).toMatchObject([{ sentTo: to }]);
		expect(body.activity[0]!.summary).toContain(`sent to ${to}`);

		const bad = await me.client.send<{ errors: Record<string, string> }>('POST', `/api/v1/builds/${buildId}/cutting-packages`, {
			designId,
			to: 'not an address',
			quantity: 0
		});
		expect(bad.status).toBe(400);
		expect(Object.keys(bad.body.errors).sort()).toEqual(['quantity', 'to']);
	});
});

describe('access to builds, designs and revisions by role', () => {
	let shop: Awaited<ReturnType<typeof owner>>;
	let stranger: Awaited<ReturnType<typeof owner>>;
	let viewer: Client;
	let editor: Client;
	let buildId: string;
	let designId: string;

	async function invite(role: 'viewer' | 'editor') {
		const email = freshEmail(role);
		expect(await shop.client.action('/workshop', 'invite', { email, role })).toMatchObject({ type: 'success' });
		const mail = await mailTo(email, 'Invitation');
		const client = await signUp(role, email);
		expect(await client.action(new URL(mail.link).pathname, '', {})).toMatchObject({ type: 'redirect' });
		return client;
	}

	beforeAll(async () => {
		shop = await owner('acl');
		stranger = await owner('acl-other');
		buildId = await newBuild(shop.client, 'Access bench');
		designId = await newDesign(shop.client, buildId);
		viewer = await invite('viewer');
		editor = await invite('editor');
	});

	it('lets a viewer read but not write', async () => {
		expect((await viewer.json(`/api/v1/builds/${buildId}`)).status).toBe(200);
		expect((await viewer.json(`/api/v1/designs/${designId}`)).status).toBe(200);
		expect((await viewer.get(`/api/v1/designs/${designId}/revisions/1/wheel.svg`)).status).toBe(200);
		const save = await viewer.send<{ message: string }>('POST', `/api/v1/designs/${designId}/revisions`, {
			baseRevision: 1,
			params: wheel
		});
		expect(save.status).toBe(403);
		expect(save.body.message).toMatch(/viewer; this needs editor/);
		expect((await viewer.send('PUT', `/api/v1/builds/${buildId}/engine`, { params: { teeth: '36', toothAtTdc: '9' } })).status).toBe(403);
		expect((await viewer.send('DELETE', `/api/v1/builds/${buildId}`)).status).toBe(403);
	});

	it('lets an editor write', async () => {
		const save = await editor.send('POST', `/api/v1/designs/${designId}/revisions`, {
			baseRevision: 1,
			params: { ...wheel, od: '120' },
			message: 'bigger'
		});
		expect(save.status).toBe(201);
	});

	it('answers 404 to another workshop’s owner, for real and for guessed ids alike, and 401 when signed out', async () => {
		const paths = [
			`/api/v1/builds/${buildId}`,
			`/api/v1/designs/${designId}`,
			`/api/v1/designs/${designId}/revisions/1`,
			`/api/v1/designs/${designId}/revisions/1/wheel.dxf`,
			`/api/v1/designs/${designId}/compare?a=1&b=2`,
			`/api/v1/builds/${crypto.randomUUID()}`,
			'/api/v1/builds/not-a-uuid'
		];
		for (const path of paths) expect((await stranger.client.get(path)).status, path).toBe(404);
		expect((await stranger.client.send('POST', `/api/v1/designs/${designId}/revisions`, { baseRevision: 2, params: wheel })).status).toBe(
			404
		);
		expect((await stranger.client.send('DELETE', `/api/v1/builds/${buildId}`)).status).toBe(404);
		const anonymous = new Client();
		for (const path of paths.slice(0, 4)) expect((await anonymous.get(path)).status, path).toBe(401);
		// Nothing of the stranger's reached the build.
		const { rows } = await database.execute<{ n: number }>(
			sql`select count(*)::int as n from wheel_revision where design_id = ${designId}`
		);
		expect(rows[0]!.n).toBe(2);
	});
});

describe('the build sheet of a saved build', () => {
	it('puts the engine profile, the saved revision and the newest TDC record on one page (read back with pdftotext)', async () => {
		const { execFileSync } = await import('node:child_process');
		const { mkdtempSync, writeFileSync } = await import('node:fs');
		const { join } = await import('node:path');
		const { tmpdir } = await import('node:os');
		const me = await owner('sheet');
		const buildId = await newBuild(me.client, 'Sheet bench 650');
		const early = await me.client.get(`/api/v1/builds/${buildId}/build-sheet.pdf`);
		expect(early.status).toBe(422);
		expect((await early.json()).message).toMatch(/^engineProfile: /);
		await me.client.send('PUT', `/api/v1/builds/${buildId}/engine`, {
			params: { teeth: '36', missing: '1', toothAtTdc: '9', layout: 'twin-270' }
		});
		const designId = await newDesign(me.client, buildId, 'Timing-side wheel');
		await me.client.send('POST', `/api/v1/designs/${designId}/revisions`, { baseRevision: 1, params: { ...wheel, od: '120' } });
		await me.client.send('POST', `/api/v1/builds/${buildId}/tdc-records`, { params: { a: '-14', b: '15' } });
		const res = await me.client.get(`/api/v1/builds/${buildId}/build-sheet.pdf`);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-disposition')).toContain('build-sheet-sheet-bench-650-r2.pdf');
		const file = join(mkdtempSync(join(tmpdir(), 'sheet-')), 'sheet.pdf');
		writeFileSync(file, Buffer.from(await res.arrayBuffer()));
		const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
		expect(text).toContain('Sheet bench 650');
		expect(text).toContain('Wheel revision 2 of “Timing-side wheel”');
		// 36-1 with tooth 9 at TDC: 90° BTDC (geometry, common practice); a 270° twin fires at 270/450.
		expect(text).toMatch(/90\s*°\s*BTDC/);
		expect(text).toMatch(/270.{0,3}450/);
		expect(text).toMatch(/120(\.0+)?\s*mm/);
		expect(text).toContain('0.5');
	});
});
