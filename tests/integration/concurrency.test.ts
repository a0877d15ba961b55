// Many people saving one wheel design at the same moment, through the API against the real
// database: exactly one save lands per base revision, the rest get 409 with the newest revision,
// and no revision number is doubled or lost.
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connect } from '../../src/lib/server/db';
import { Client, freshEmail, signUp } from '../support/client';

const database = connect(process.env.DATABASE_URL!);
afterAll(() => database.$client.end());

const wheel = { units: 'mm', teeth: '60', missing: '2', od: '120', depth: '5', thickness: '3', bore: '20' };

type Saved = {
	status: number;
	body: { revision?: { number: number; params: Record<string, string> }; head?: { number: number }; code?: string };
};

async function setUp(label: string) {
	const client = await signUp(`${label} owner`, freshEmail(label));
	const build = await client.send<{ id: string }>('POST', '/api/v1/builds', { name: `${label} bench` });
	expect(build.status).toBe(201);
	const design = await client.send<{ id: string }>('POST', `/api/v1/builds/${build.body.id}/designs`, {
		name: 'Crank wheel',
		params: wheel,
		message: 'as drawn'
	});
	expect(design.status).toBe(201);
	return { client, buildId: build.body.id, designId: design.body.id };
}

const save = (client: Client, designId: string, baseRevision: number, params: Record<string, string>, message = '') =>
	client.send<Saved['body']>('POST', `/api/v1/designs/${designId}/revisions`, { baseRevision, params, message });

async function stored(designId: string) {
	const { rows } = await database.execute<{ number: number; params: Record<string, string> }>(
		sql`select number, params from wheel_revision where design_id = ${designId} order by number`
	);
	return rows;
}

describe('simultaneous saves of one wheel design', () => {
	let me: Awaited<ReturnType<typeof setUp>>;
	beforeAll(async () => {
		me = await setUp('concurrent');
	});

	it('lets exactly one of 50 saves from the same base land; the other 49 get 409 and the head', async () => {
		// Each save carries its own outside diameter, so the stored one says which request won.
		const params = Array.from({ length: 50 }, (_, i) => ({ ...wheel, od: String(121 + i) }));
		const answers = await Promise.all(params.map((p, i) => save(me.client, me.designId, 1, p, `caller ${i}`)));
		const won = answers.flatMap((a, i) => (a.status === 201 ? [i] : []));
		expect(
			answers.map((a) => a.status).filter((s) => s !== 201 && s !== 409),
			'answers other than 201 and 409'
		).toEqual([]);
		expect(won).toHaveLength(1);
		expect(answers.filter((a) => a.status === 409)).toHaveLength(49);
		for (const a of answers.filter((a) => a.status === 409)) expect(a.body).toMatchObject({ code: 'stale', head: { number: 2 } });
		const rows = await stored(me.designId);
		expect(rows.map((r) => r.number)).toEqual([1, 2]);
		expect(rows[1]!.params).toEqual(params[won[0]!]);
		expect(answers[won[0]!]!.body.revision).toMatchObject({ number: 2, params: params[won[0]!] });
	});

	it('keeps numbers 1..n with no doubles or gaps over rounds of racing saves, each from the newest base its caller saw', async () => {
		const start = (await stored(me.designId)).length;
		const callers = 10;
		const attempts = 8;
		const wins = new Map<number, Record<string, string>>();
		const statuses: number[] = [];
		let unique = 0;
		await Promise.all(
			Array.from({ length: callers }, async (_, c) => {
				let base = start;
				for (let k = 0; k < attempts; k++) {
					const params = { ...wheel, od: (130 + ++unique / 10).toFixed(1), label: `caller ${c} try ${k}` };
					const a = await save(me.client, me.designId, base, params);
					statuses.push(a.status);
					if (a.status === 201) {
						const number = a.body.revision!.number;
						expect(wins.has(number), `revision ${number} answered 201 twice`).toBe(false);
						wins.set(number, params);
						base = number;
					} else if (a.status === 409) {
						// The refusal names the newest revision: the next try starts from there.
						expect(a.body.head!.number).toBeGreaterThan(base);
						base = a.body.head!.number;
					}
				}
			})
		);
		expect(
			statuses.filter((s) => s !== 201 && s !== 409),
			'answers other than 201 and 409'
		).toEqual([]);
		expect(statuses).toHaveLength(callers * attempts);
		const rows = await stored(me.designId);
		const numbers = rows.map((r) => r.number);
		// 1..n: nothing doubled (the unique constraint) and nothing lost (no gap).
		expect(numbers).toEqual(Array.from({ length: numbers.length }, (_, i) => i + 1));
		// Every revision after the start is one that a caller was told it saved, with its params.
		expect(numbers.length - start).toBe(wins.size);
		expect(wins.size).toBeGreaterThanOrEqual(attempts);
		for (const row of rows.slice(start)) expect(row.params, `revision ${row.number}`).toEqual(wins.get(row.number));
		// And each landed save wrote its one log entry (same transaction).
		const { rows: logged } = await database.execute<{ n: number }>(
			sql`select count(*)::int as n from activity where build_id = ${me.buildId} and kind = 'revision'`
		);
		expect(logged[0]!.n).toBe(numbers.length - 1);
		console.log(
			`racing saves: ${statuses.length} tries by ${callers} callers, ${wins.size} landed, ${statuses.filter((s) => s === 409).length} answered 409`
		);
	});
});
