// Issue 20: the list statements use the indexes made for them. Each is EXPLAINed (the statement the
// code builds, with its parameters) on a workshop of 20,000 builds and a design of 5,000 revisions,
// seeded and ANALYZEd inside one transaction that is rolled back: nothing is left for other tests.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PoolClient } from 'pg';
import { connect } from '../../src/lib/server/db';
import { buildsPageQuery } from '../../src/lib/server/builds';
import { headRevisionQuery, revisionPageQuery } from '../../src/lib/server/designs';
import { writeBuildCursor, writeRevisionCursor } from '../../src/lib/schemas/build';

const database = connect(process.env.DATABASE_URL!);
let client: PoolClient;

const workshopId = crypto.randomUUID();
const buildId = crypto.randomUUID();
const designId = crypto.randomUUID();

beforeAll(async () => {
	client = await database.$client.connect();
	await client.query('begin');
	await client.query(`insert into workshop (id, slug, name) values ($1, $2, 'Plan shop')`, [workshopId, `plans-${workshopId}`]);
	await client.query(
		`insert into build (workshop_id, name, engine, created_at, updated_at)
		select $1, 'Plan build ' || g, (array['Honda CB750 four', 'Yamaha XS650 twin', 'BMW R80 boxer', 'Kawasaki Z1 four'])[1 + g % 4] || ' no. ' || g,
			now() - g * interval '1 minute', now() - (g % 5000) * interval '1 second'
		from generate_series(1, 20000) g`,
		[workshopId]
	);
	await client.query(`insert into build (id, workshop_id, name) values ($1, $2, 'Long history')`, [buildId, workshopId]);
	await client.query(`insert into wheel_design (id, build_id, name) values ($1, $2, 'Crank')`, [designId, buildId]);
	await client.query(
		`insert into wheel_revision (design_id, number, params, message) select $1, g, '{}'::jsonb, 'Step ' || g from generate_series(1, 5000) g`,
		[designId]
	);
	// Rows fresh from one transaction sit in the trigram indexes' GIN pending list, which makes a
	// bitmap scan look dear; autovacuum merges it in a live database, this does it now.
	await client.query(`select gin_clean_pending_list('build_name_trgm'::regclass), gin_clean_pending_list('build_engine_trgm'::regclass)`);
	// ANALYZE counts the rows this transaction inserted; its statistics roll back with it.
	await client.query('analyze build, wheel_revision');
}, 60_000);

afterAll(async () => {
	await client?.query('rollback');
	client?.release();
	await database.$client.end();
});

type PlanNode = { 'Node Type': string; 'Index Name'?: string; 'Relation Name'?: string; Plans?: PlanNode[] };

/** Each node of the plan as "Node Type on index", "Seq Scan on table" or the node type alone. */
async function planOf(query: { toSQL(): { sql: string; params: unknown[] } }): Promise<string[]> {
	const { sql, params } = query.toSQL();
	const { rows } = await client.query<{ 'QUERY PLAN': [{ Plan: PlanNode }] }>(`explain (format json) ${sql}`, params);
	const nodes: string[] = [];
	const walk = (n: PlanNode) => {
		const on = n['Index Name'] ?? n['Relation Name'];
		nodes.push(on ? `${n['Node Type']} on ${on}` : n['Node Type']);
		n.Plans?.forEach(walk);
	};
	walk(rows[0]!['QUERY PLAN'][0].Plan);
	return nodes;
}

const indexScan = (name: string) => new RegExp(`^(Index Scan|Index Only Scan|Index Scan Backward|Bitmap Index Scan) on ${name}$`);

describe('the list statements’ plans', () => {
	it('the default first page walks the (workshop, updated desc, id desc) index, no sort of every row', async () => {
		const plan = await planOf(buildsPageQuery(database, workshopId, { q: '', sort: 'updated', size: 20 }).query);
		expect(plan).toContainEqual(expect.stringMatching(indexScan('build_workshop_updated')));
		expect(plan).not.toContain('Sort');
		expect(plan, plan.join(' | ')).not.toContain('Seq Scan on build');
	});

	it('a deep page starts at its cursor inside the index (no offset)', async () => {
		const cursor = writeBuildCursor({ sort: 'updated', dir: 'desc', key: '2000-01-01T00:00:00.000000Z', id: crypto.randomUUID() });
		const plan = await planOf(buildsPageQuery(database, workshopId, { q: '', sort: 'updated', size: 20, cursor }).query);
		expect(plan).toContainEqual(expect.stringMatching(indexScan('build_workshop_updated')));
		expect(plan).not.toContain('Sort');
	});

	it('the created sort, either direction, walks its own index', async () => {
		for (const dir of ['asc', 'desc'] as const) {
			const plan = await planOf(buildsPageQuery(database, workshopId, { q: '', sort: 'created', dir, size: 20 }).query);
			expect(plan, dir).toContainEqual(expect.stringMatching(indexScan('build_workshop_created')));
			expect(plan, dir).not.toContain('Sort');
		}
	});

	it('a rare search goes through the trigram indexes on name and engine', async () => {
		const plan = await planOf(buildsPageQuery(database, workshopId, { q: 'no. 12345', sort: 'updated', size: 20 }).query);
		expect(plan, plan.join(' | ')).toContain('Bitmap Index Scan on build_name_trgm');
		expect(plan).toContain('Bitmap Index Scan on build_engine_trgm');
		expect(plan, plan.join(' | ')).not.toContain('Seq Scan on build');
	});

	it('the head revision and a page of revisions probe the unique (design, number) index', async () => {
		const head = await planOf(headRevisionQuery(database, designId));
		expect(head).toContainEqual(expect.stringMatching(indexScan('wheel_revision_design_number')));
		expect(head).not.toContain('Sort');
		const older = await planOf(revisionPageQuery(database, designId, { cursor: writeRevisionCursor(2500), size: 50 }));
		expect(older).toContainEqual(expect.stringMatching(indexScan('wheel_revision_design_number')));
		expect(older).not.toContain('Sort');
	});
});
