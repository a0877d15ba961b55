// The big shop of issue 20, seeded into the bench's database with set-based SQL (INSERT ... SELECT
// generate_series: row-by-row inserts took minutes) and removed again after the measurements.
// Only columns that exist on main are named, so columns and indexes added since do not stop it.
import { sql } from 'drizzle-orm';
import type { PoolClient } from 'pg';
import type { Database } from '../../src/lib/server/db';

export const scaleSize = {
	builds: 100_000,
	revisions: 1_000_000,
	/** On one design (the history page and GET /api/v1/designs/:id). */
	revisionsOnOne: 5_000,
	activity: 1_000_000,
	/** On one build. */
	activityOnOne: 50_000,
	photos: 50_000,
	tdcRecords: 20_000,
	/** Photos and TDC records on the one build measured for them. */
	onBigBuild: 1_000,
	/** Builds whose name holds the search word. */
	searchMatches: 10
} as const;

/** A word no other build name holds; ten builds carry it. */
export const searchWord = 'Quillfeather';

export interface ScaleShop {
	workshopId: string;
	/** 1,000 photos and 1,000 TDC records. */
	bigBuildId: string;
	/** 50,000 activity rows. */
	busyBuildId: string;
	/** The design with 5,000 revisions, and its build. */
	longDesign: { buildId: string; designId: string };
	/** Any of the ordinary builds. */
	typicalBuildId: string;
}

/**
 * Seeds the shop and makes `userId` its owner. Build 1 is the big build, 2 carries the long design,
 * 3 the busy activity log; the rest share the remaining rows evenly (about 10 revisions each).
 */
export async function seedScale(database: Database, userId: string, log: (line: string) => void = () => undefined): Promise<ScaleShop> {
	const s = scaleSize;
	// Three sessions: the largest inserts run side by side (each is bound by its per-row index and
	// foreign-key work, which one core does). The bench's rows need no flush to disk per commit.
	const clients = await Promise.all([1, 2, 3].map(() => database.$client.connect()));
	const [a, b, c] = clients as [PoolClient, PoolClient, PoolClient];
	const run = async (client: PoolClient, label: string, text: string) => {
		const started = performance.now();
		const res = await client.query(text);
		log(`${label}: ${res.rowCount ?? 0} rows in ${((performance.now() - started) / 1000).toFixed(1)} s`);
	};
	try {
		await Promise.all(clients.map((client) => client.query('set synchronous_commit = off')));
		const { rows } = await a.query<{ id: string }>(
			`insert into workshop (slug, name) values ('bench-scale-' || substr(md5(random()::text), 1, 8), 'Bench big shop') returning id`
		);
		const w = rows[0]!.id;
		await a.query(`insert into member (workshop_id, user_id, role) values ($1, $2, 'owner')`, [w, userId]);
		// Names sort as numbers; ten of them hold the search word.
		await run(
			a,
			'builds',
			`insert into build (workshop_id, name, engine, notes, created_at, updated_at)
			 select '${w}', 'Bench ' || lpad(i::text, 6, '0') || case when i % ${Math.floor(s.builds / s.searchMatches)} = 7 then ' ${searchWord}' else '' end,
			        (array['Single 500 cc', 'Twin 650 cc, 360°', 'Inline four 1000 cc', 'V-twin 1200 cc', 'Kart 100 cc two-stroke'])[1 + i % 5],
			        '', now() - make_interval(mins => i), now() - make_interval(secs => i * 7)
			 from generate_series(1, ${s.builds}) i`
		);
		// Each build's number (n = 1 … builds), for spreading the other rows; read by all three sessions.
		await a.query('drop table if exists bench_scale_n');
		await a.query(
			`create unlogged table bench_scale_n as select id, row_number() over (order by name) as n from build where workshop_id = '${w}'`
		);
		await a.query('create index on bench_scale_n (n)');
		await a.query('analyze bench_scale_n');
		// Designs: one per build from 2 on (build 2's is the long one).
		await run(a, 'designs', `insert into wheel_design (build_id, name) select id, 'Crank wheel' from bench_scale_n where n >= 2`);
		// Sixty parameter sets, made once and picked by number (building one per row cost more).
		const params = `(array(select jsonb_build_object('units', 'mm', 'teeth', '36', 'missing', '1', 'od', (90 + k)::text, 'depth', '5',
			'bore', '22', 'thickness', '3', 'material', 'steel') from generate_series(0, 59) k))`;
		const ordinary = s.builds - 2;
		const perDesign = Math.floor((s.revisions - s.revisionsOnOne) / ordinary);
		const extra = s.revisions - s.revisionsOnOne - perDesign * ordinary;
		const rest = s.builds - 3;
		await Promise.all([
			(async () => {
				await run(
					a,
					'revisions (long design)',
					`insert into wheel_revision (design_id, number, params, message, author_id, created_at)
					 select d.id, r, ${params}[1 + r % 60], 'Bench revision ' || r, '${userId}', now() - make_interval(mins => ${s.revisionsOnOne} - r)
					 from wheel_design d join bench_scale_n b on b.id = d.build_id and b.n = 2, generate_series(1, ${s.revisionsOnOne}) r`
				);
				await run(
					a,
					'revisions (others)',
					`insert into wheel_revision (design_id, number, params, message, author_id, created_at)
					 select d.id, r, ${params}[1 + (b.n + r) % 60], 'Bench revision ' || r, '${userId}', now() - make_interval(hours => r)
					 from wheel_design d join bench_scale_n b on b.id = d.build_id and b.n >= 3,
					      generate_series(1, ${perDesign} + case when b.n - 3 < ${extra} then 1 else 0 end) r`
				);
			})(),
			(async () => {
				await run(
					b,
					'activity (busy build)',
					`insert into activity (build_id, actor_id, kind, summary, created_at)
					 select b.id, '${userId}', 'revision', 'Bench entry ' || i, now() - make_interval(secs => i)
					 from bench_scale_n b, generate_series(1, ${s.activityOnOne}) i where b.n = 3`
				);
				await run(
					b,
					'activity (others)',
					`insert into activity (build_id, actor_id, kind, summary, created_at)
					 select b.id, '${userId}', 'revision', 'Bench entry ' || i, now() - make_interval(mins => i)
					 from generate_series(1, ${s.activity - s.activityOnOne}) i join bench_scale_n b on b.n = 4 + i % ${rest}`
				);
			})(),
			(async () => {
				// Photo rows only: the bench reads pages and JSON, never the images, so no object is stored.
				const photo = `'wheel-' || i || '.jpg', 'image/jpeg', 4000, 3000, 2500000, md5(i::text), 'bench-scale/' || gen_random_uuid(),
					'bench-scale/t-' || gen_random_uuid(), '${userId}'`;
				const into =
					'insert into wheel_photo (build_id, name, mime, width, height, size_bytes, sha256, storage_key, thumbnail_key, uploaded_by)';
				// Each list: its share on the big build (n = 1), the rest spread over the others.
				const spread = async (what: string, insert: string, values: string, total: number) => {
					await run(
						c,
						`${what} (big build)`,
						`${insert} select b.id, ${values} from bench_scale_n b, generate_series(1, ${s.onBigBuild}) i where b.n = 1`
					);
					await run(
						c,
						`${what} (others)`,
						`${insert} select b.id, ${values} from generate_series(1, ${total - s.onBigBuild}) i join bench_scale_n b on b.n = 4 + i % ${rest}`
					);
				};
				await spread('photos', into, photo, s.photos);
				const tdc = `'Piston stop ' || i, jsonb_build_object('a', '16 BTDC', 'b', '13 ATDC', 'scale', 'signed'), '-1.5', '${userId}'`;
				await spread('TDC records', 'insert into tdc_record (build_id, label, params, tdc_deg, author_id)', tdc, s.tdcRecords);
			})()
		]);
		// Fresh statistics, as autovacuum would have them in a shop that grew over years.
		await run(a, 'analyze', 'analyze build, wheel_design, wheel_revision, activity, wheel_photo, tdc_record');
		const ids = await a.query<{ n: string; id: string; design: string | null }>(
			`select b.n, b.id, d.id as design from bench_scale_n b left join wheel_design d on d.build_id = b.id where b.n in (1, 2, 3, 5000)`
		);
		await a.query('drop table bench_scale_n');
		const by = (n: number) => ids.rows.find((r) => Number(r.n) === n)!;
		return {
			workshopId: w,
			bigBuildId: by(1).id,
			longDesign: { buildId: by(2).id, designId: by(2).design! },
			busyBuildId: by(3).id,
			typicalBuildId: by(5000).id
		};
	} finally {
		for (const client of clients) client.release();
	}
}

/** Removes the shop: its children first, in bulk (the cascade deletes row by row). */
export async function removeScale(database: Database, workshopId: string) {
	const builds = sql`(select id from build where workshop_id = ${workshopId})`;
	await database.transaction(async (tx) => {
		await tx.execute(sql`delete from wheel_revision where design_id in (select id from wheel_design where build_id in ${builds})`);
		for (const table of ['activity', 'wheel_photo', 'tdc_record', 'wheel_design', 'degree_tape', 'signal_check', 'cutting_package'])
			await tx.execute(sql`delete from ${sql.identifier(table)} where build_id in ${builds}`);
		await tx.execute(sql`delete from build where workshop_id = ${workshopId}`);
		await tx.execute(sql`delete from workshop where id = ${workshopId}`);
	});
}
