// Faults: PostgreSQL stopped and started again while requests run, and saves that fail half-way.
// This file stops the cluster every other test uses, so vite.config.ts gives it a project of its
// own ("faults") that Vitest runs alone, after the integration and end-to-end files.
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import sharp from 'sharp';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connect } from '../../src/lib/server/db';
import { listKeys } from '../../src/lib/server/storage';
import { unavailablePagePolicy } from '../../src/lib/server/unavailable';
import { appUrl, Client, freshEmail, signUp } from '../support/client';

const root = join(import.meta.dirname, '..', '..');
const database = connect(process.env.DATABASE_URL!);

const wheel = { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', thickness: '3', bore: '20' };

/**
 * Stops or starts the private cluster with scripts/postgres.ts, in a child process: pg_ctl waits
 * synchronously there, while this process keeps sending requests and reading their answers.
 */
function cluster(action: 'stop' | 'start'): Promise<void> {
	const code = [
		"import { clusterDir, serverBin, start, stop } from './scripts/postgres.ts';",
		'const { bin } = serverBin();',
		`${action === 'stop' ? 'stop' : 'await start'}(bin, clusterDir());`
	].join('\n');
	return new Promise((resolve, reject) => {
		const child = spawn(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', code], {
			cwd: root,
			stdio: ['ignore', 'inherit', 'inherit']
		});
		child.once('error', reject);
		child.once('exit', (status) => (status === 0 ? resolve() : reject(new Error(`PostgreSQL ${action} exited with ${status}`))));
	});
}

async function databaseAnswers(): Promise<boolean> {
	try {
		await database.execute(sql`select 1`);
		return true;
	} catch {
		return false;
	}
}

// Whatever happens above, the cluster must be running when this file ends: `npm test` stops it
// at the very end and other runs may share it.
afterAll(async () => {
	if (!(await databaseAnswers())) await cluster('start').catch(() => undefined);
	await database.$client.end();
});

type Probe = { method: 'GET' | 'POST'; path: string; kind: 'api' | 'page' | 'action'; body?: () => unknown };
type Answer = { probe: Probe; status: number; ms: number; headers: Headers; text: string; at: number };

/**
 * Sends one request as `client` the way its kind would come: API calls ask for JSON, pages for
 * HTML, form actions as `enhance` posts them. A request that gets no answer in 10 s counts as hung
 * (status 0): well past the pool's 3 s connection timeout, so only a real hang reaches it.
 */
async function send(client: Client, probe: Probe): Promise<Answer> {
	const cookie = [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
	const headers: Record<string, string> = { cookie, origin: new URL(appUrl).origin };
	let body: string | undefined;
	if (probe.kind === 'api') headers.accept = 'application/json';
	if (probe.kind === 'page') headers.accept = 'text/html,application/xhtml+xml';
	if (probe.kind === 'api' && probe.body) {
		headers['content-type'] = 'application/json';
		body = JSON.stringify(probe.body());
	}
	if (probe.kind === 'action') {
		Object.assign(headers, {
			accept: 'application/json',
			'x-sveltekit-action': 'true',
			'content-type': 'application/x-www-form-urlencoded'
		});
		body = new URLSearchParams(probe.body!() as Record<string, string>).toString();
	}
	const started = performance.now();
	try {
		const res = await fetch(new URL(probe.path, appUrl), {
			method: probe.method,
			headers,
			body,
			redirect: 'manual',
			signal: AbortSignal.timeout(10_000)
		});
		const text = await res.text();
		return { probe, status: res.status, ms: performance.now() - started, headers: res.headers, text, at: Date.now() };
	} catch {
		return { probe, status: 0, ms: performance.now() - started, headers: new Headers(), text: '', at: Date.now() };
	}
}

const label = (a: Answer) =>
	`${a.probe.method} ${a.probe.path} (${a.probe.kind}) → ${a.status}${a.status >= 500 ? `: ${a.text.slice(0, 200)}` : ''}`;

/** What a 503 must carry (RFC 9110 §15.6.4 503 Service Unavailable, §10.2.3 Retry-After as delay-seconds). */
function expectUnavailable(a: Answer) {
	expect(a.status, label(a)).toBe(503);
	expect(a.headers.get('retry-after'), label(a)).toMatch(/^[1-9]\d*$/);
	if (a.probe.kind === 'page') {
		expect(a.headers.get('content-type')).toMatch(/^text\/html/);
		expect(a.text).toContain('<h1>Briefly unavailable</h1>');
		expect(a.text).toMatch(/try again in a few seconds/i);
		// Its own policy, which lets its inline style through (the e2e accessibility test renders it).
		expect(a.headers.get('content-security-policy')).toBe(unavailablePagePolicy);
	} else if (a.probe.kind === 'action') {
		expect(JSON.parse(a.text)).toMatchObject({ type: 'error', error: { code: 'unavailable', message: expect.stringMatching(/database/) } });
	} else {
		expect(a.headers.get('content-type')).toMatch(/^application\/json/);
		const body = JSON.parse(a.text) as Record<string, unknown>;
		if (a.probe.path === '/api/health') expect(body).toMatchObject({ status: 'unavailable', database: { state: 'down' } });
		else expect(body).toEqual({ message: expect.stringMatching(/database/), code: 'unavailable' });
	}
}

async function owner(label: string) {
	const client = await signUp(`${label} owner`, freshEmail(label));
	const workshopId = (await client.json<{ workshop: { id: string } }>('/api/v1/builds')).body.workshop.id;
	const build = await client.send<{ id: string }>('POST', '/api/v1/builds', { name: `${label} bench` });
	expect(build.status).toBe(201);
	const design = await client.send<{ id: string }>('POST', `/api/v1/builds/${build.body.id}/designs`, {
		name: 'Crank wheel',
		params: wheel,
		message: 'as drawn'
	});
	expect(design.status).toBe(201);
	return { client, workshopId, buildId: build.body.id, designId: design.body.id };
}

describe('PostgreSQL stopped and started while requests run', () => {
	let me: Awaited<ReturnType<typeof owner>>;
	let probes: Probe[];
	let head = 1;
	let saved = 0;
	/** Follows the newest revision from each save's answer: 201 gives the new one, 409 the head. */
	const follow = (a: Answer) => {
		if (a.probe.kind !== 'api' || !a.probe.body) return;
		if (a.status === 201) {
			saved++;
			head = Math.max(head, (JSON.parse(a.text) as { revision: { number: number } }).revision.number);
		}
		if (a.status === 409) head = Math.max(head, (JSON.parse(a.text) as { head: { number: number } }).head.number);
	};
	beforeAll(async () => {
		me = await owner('outage');
		// Saves from the newest base each time; two callers may still race for one base (409).
		const nextSave = () => ({ baseRevision: head, params: { ...wheel, od: String(100 + head) }, message: 'during the outage' });
		probes = [
			{ method: 'GET', path: '/api/health', kind: 'api' },
			{ method: 'GET', path: '/api/v1/builds', kind: 'api' },
			{ method: 'GET', path: `/api/v1/builds/${me.buildId}`, kind: 'api' },
			{ method: 'GET', path: `/api/v1/designs/${me.designId}`, kind: 'api' },
			{ method: 'POST', path: `/api/v1/designs/${me.designId}/revisions`, kind: 'api', body: nextSave },
			{ method: 'GET', path: '/', kind: 'page' },
			{ method: 'GET', path: '/builds', kind: 'page' },
			{ method: 'GET', path: `/builds/${me.buildId}`, kind: 'page' },
			{ method: 'GET', path: `/builds/${me.buildId}/designs/${me.designId}`, kind: 'page' },
			{ method: 'GET', path: '/wheel', kind: 'page' },
			{
				method: 'POST',
				path: '/builds?/create',
				kind: 'action',
				body: () => ({ name: `Outage build ${Date.now()}-${Math.random()}`, engine: '' })
			}
		];
	});

	it('answers every request, with 503 and Retry-After while the database is away, and recovers without a restart', async () => {
		// Before: everything answers normally.
		for (const probe of probes.filter((p) => p.method === 'GET')) {
			const a = await send(me.client, probe);
			expect(a.status, label(a)).toBe(200);
		}

		// Load from a few parallel callers for the whole outage: before, during and after.
		const answers: Answer[] = [];
		let running = true;
		const callers = Array.from({ length: 4 }, async (_, c) => {
			for (let i = c; running; i++) {
				const a = await send(me.client, probes[i % probes.length]!);
				follow(a);
				answers.push(a);
			}
		});
		const stopAt = Date.now();
		try {
			await new Promise((r) => setTimeout(r, 500));
			await cluster('stop');
			expect(await databaseAnswers()).toBe(false);

			// While it is down, every kind of request gets the 503 it should.
			for (const probe of probes) expectUnavailable(await send(me.client, probe));
			await new Promise((r) => setTimeout(r, 2_000));
		} finally {
			await cluster('start');
		}
		const startedAt = Date.now();

		// The pool drops its dead connections and opens new ones by itself: health and every page
		// come back without the app being restarted.
		let healthy: Answer | undefined;
		for (let i = 0; i < 60 && healthy?.status !== 200; i++) {
			healthy = await send(me.client, probes[0]!);
			if (healthy.status !== 200) await new Promise((r) => setTimeout(r, 500));
		}
		expect(healthy!.status, 'health after the restart').toBe(200);
		await new Promise((r) => setTimeout(r, 1_000));
		running = false;
		await Promise.all(callers);

		const hung = answers.filter((a) => a.status === 0);
		expect(hung.map(label), 'requests that got no answer in 10 s').toEqual([]);
		const faults = answers.filter((a) => a.status >= 500 && a.status !== 503);
		expect(faults.map(label), 'answers other than 503 among the 5xx').toEqual([]);
		const unavailable = answers.filter((a) => a.status === 503);
		expect(unavailable.length, 'the load saw the outage').toBeGreaterThan(0);
		for (const a of unavailable) expectUnavailable(a);
		// Anything else is what the request would get with the database up.
		const expected = { api: [200, 201, 409], page: [200], action: [200] } as const;
		for (const a of answers.filter((a) => a.status !== 503))
			expect(expected[a.probe.kind] as readonly number[], label(a)).toContain(a.status);
		const after = answers.filter((a) => a.at > startedAt + 500 && a.status !== 503);
		expect(after.length, 'normal answers after the restart').toBeGreaterThan(0);
		console.log(
			`outage: ${answers.length} requests over ${((Date.now() - stopAt) / 1000).toFixed(1)} s, ${unavailable.length} answered 503, slowest ${Math.round(Math.max(...answers.map((a) => a.ms)))} ms`
		);

		// After: every request kind answers normally again.
		head = (await me.client.json<{ revisions: { number: number }[] }>(`/api/v1/designs/${me.designId}`)).body.revisions[0]!.number;
		for (const probe of probes) {
			const a = await send(me.client, probe);
			expect(a.status, label(a)).toBe(probe.kind === 'api' && probe.method === 'POST' ? 201 : 200);
			follow(a);
		}

		// A save caught by the stop either landed whole or not at all: the revision numbers run
		// 1..n without a gap, and each later revision has its one log entry. (A commit whose
		// answer was lost with the connection lands whole yet reads as 503, hence "at least".)
		const revisions = await database.execute<{ number: number }>(
			sql`select number from wheel_revision where design_id = ${me.designId} order by number`
		);
		const numbers = revisions.rows.map((r) => r.number);
		expect(numbers).toEqual(Array.from({ length: numbers.length }, (_, i) => i + 1));
		expect(numbers.length).toBeGreaterThanOrEqual(saved + 1);
		const logged = await database.execute<{ n: number }>(
			sql`select count(*)::int as n from activity where build_id = ${me.buildId} and kind = 'revision'`
		);
		expect(logged.rows[0]!.n).toBe(numbers.length - 1);
	});
});

// A trigger, made and dropped by this test, that refuses an insert whose text carries the marker:
// it fails a save at its last step, after the rows before it were written in the same transaction.
const marker = 'REFUSE-THIS-WRITE';

async function refuseInsertsInto(table: 'activity' | 'wheel_photo', column: 'summary' | 'name') {
	await database.execute(
		sql.raw(`create or replace function pw_fault_refuse() returns trigger language plpgsql as $$
			begin
				if new.${column} like '%${marker}%' then raise exception 'write refused by the fault test'; end if;
				return new;
			end $$`)
	);
	await database.execute(
		sql.raw(`create trigger pw_fault_refuse before insert on ${table} for each row execute function pw_fault_refuse()`)
	);
	return async () => {
		await database.execute(sql.raw(`drop trigger if exists pw_fault_refuse on ${table}`));
		await database.execute(sql.raw('drop function if exists pw_fault_refuse()'));
	};
}

describe('a save that fails half-way leaves nothing half-saved', () => {
	let me: Awaited<ReturnType<typeof owner>>;
	beforeAll(async () => {
		me = await owner('half-way');
	});

	const state = async () => {
		const revisions = await database.execute<{ number: number }>(
			sql`select number from wheel_revision where design_id = ${me.designId} order by number`
		);
		const logs = await database.execute<{ summary: string }>(
			sql`select summary from activity where build_id = ${me.buildId} order by summary`
		);
		const design = await database.execute<{ updated: string }>(
			sql`select updated_at::text as updated from wheel_design where id = ${me.designId}`
		);
		const build = await database.execute<{ updated: string }>(sql`select updated_at::text as updated from build where id = ${me.buildId}`);
		const photos = await database.execute<{ n: number }>(sql`select count(*)::int as n from wheel_photo where build_id = ${me.buildId}`);
		return {
			revisions: revisions.rows.map((r) => r.number),
			logs: logs.rows.map((r) => r.summary),
			designUpdated: design.rows[0]!.updated,
			buildUpdated: build.rows[0]!.updated,
			photos: photos.rows[0]!.n,
			objects: await listKeys(`photos/${me.workshopId}/${me.buildId}/`)
		};
	};

	it('a revision whose log entry is refused: no revision, no log entry, no changed updated_at', async () => {
		const before = await state();
		const undo = await refuseInsertsInto('activity', 'summary');
		try {
			const res = await me.client.send<{ message: string }>('POST', `/api/v1/designs/${me.designId}/revisions`, {
				baseRevision: 1,
				params: { ...wheel, od: '140' },
				message: marker
			});
			// A fault inside the server, not a refusal of the input, and not an outage either.
			expect(res.status).toBe(500);
		} finally {
			await undo();
		}
		expect(await state()).toEqual(before);
		// The number the failed save would have taken is still free.
		const retry = await me.client.send<{ revision: { number: number } }>('POST', `/api/v1/designs/${me.designId}/revisions`, {
			baseRevision: 1,
			params: { ...wheel, od: '140' },
			message: 'second try'
		});
		expect(retry).toMatchObject({ status: 201, body: { revision: { number: 2 } } });
		const after = await state();
		expect(after.revisions).toEqual([1, 2]);
		expect(after.logs.filter((l) => !l.includes('second try'))).toEqual(before.logs);
		expect(after.logs.filter((l) => l.includes('second try'))).toHaveLength(1);
		expect(after.designUpdated).not.toBe(before.designUpdated);
	});

	it('a photo whose row is refused: no row, no log entry, no objects left in the store', async () => {
		const before = await state();
		expect(before.objects).toEqual([]);
		const png = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#777777' } })
			.png()
			.toBuffer();
		const form = () => {
			const f = new FormData();
			f.append('file', new Blob([new Uint8Array(png)], { type: 'image/png' }), `${marker}.png`);
			return f;
		};
		const undo = await refuseInsertsInto('wheel_photo', 'name');
		try {
			const res = await me.client.send('POST', `/api/v1/builds/${me.buildId}/photos`, form());
			expect(res.status).toBe(500);
		} finally {
			await undo();
		}
		expect(await state()).toEqual(before);
		// The same upload without the trigger stores the photo and its thumbnail: two objects, so
		// the empty listing above was the clean-up, not an upload that never reached the store.
		const ok = await me.client.send('POST', `/api/v1/builds/${me.buildId}/photos`, form());
		expect(ok.status).toBe(201);
		const after = await state();
		expect([after.photos, after.objects.length]).toEqual([1, 2]);
	});
});
