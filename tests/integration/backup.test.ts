// npm run db:backup / db:restore round-trip the demo data (pg_dump / pg_restore, PostgreSQL's own tools).
import { execFile } from 'node:child_process';
import { mkdtempSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { ensureDatabase } from '../../scripts/postgres';
import { connect, type Database } from '../../src/lib/server/db';

const run = promisify(execFile);
const root = join(import.meta.dirname, '..', '..');
const source = connect(process.env.DATABASE_URL!);
const copyUrl = Object.assign(new URL(process.env.DATABASE_URL!), { pathname: '/phasewright_restore_check' }).toString();
let copy: Database | undefined;
afterAll(async () => {
	await source.$client.end();
	await copy?.$client.end();
});

/** The demo workshop as rows: builds, designs, revisions with their parameters, records, members. */
async function demo(database: Database) {
	const { rows } = await database.execute(sql`
		select b.name, b.engine_profile, d.name as design, r.number, r.params, r.message,
			(select count(*)::int from tdc_record t where t.build_id = b.id) as tdc_records,
			(select count(*)::int from member m where m.workshop_id = w.id) as members
		from workshop w join build b on b.workshop_id = w.id
		join wheel_design d on d.build_id = b.id join wheel_revision r on r.design_id = d.id
		where w.slug = 'demo' order by b.name, d.name, r.number`);
	return rows;
}

const script = (name: string, args: string[], url: string) =>
	run(process.execPath, ['--import', 'tsx', join(root, 'scripts', `${name}.ts`), ...args], {
		cwd: root,
		env: { ...process.env, DATABASE_URL: url }
	});

describe('database backups', () => {
	it('round-trips the demo data through db:backup and db:restore into another database', async () => {
		const file = join(mkdtempSync(join(tmpdir(), 'pw-backup-')), 'demo.dump');
		const out = await script('db-backup', [file], process.env.DATABASE_URL!);
		expect(out.stdout).toContain(`backup written: ${file}`);
		expect(statSync(file).size).toBeGreaterThan(1000);

		await ensureDatabase('phasewright_restore_check', { fresh: true });
		await script('db-restore', [file], copyUrl);
		copy = connect(copyUrl);
		const before = await demo(source);
		expect(before.length).toBeGreaterThan(0);
		expect(await demo(copy)).toEqual(before);
		// The restored copy is a working database: its migrations are recorded, its rules still hold.
		const { rows } = await copy.execute<{ n: number }>(sql`select count(*)::int as n from drizzle.__drizzle_migrations`);
		expect(rows[0]!.n).toBeGreaterThanOrEqual(4);
		await expect(copy.execute(sql`update wheel_revision set message = 'x'`)).rejects.toMatchObject({ cause: { code: 'P0001' } });
	});

	it('restores over a changed database, bringing back what the backup held', async () => {
		const file = join(mkdtempSync(join(tmpdir(), 'pw-backup-')), 'again.dump');
		await script('db-backup', [file], copyUrl);
		copy ??= connect(copyUrl);
		const held = await demo(copy);
		await copy.execute(sql`delete from build`);
		expect(await demo(copy)).toEqual([]);
		await script('db-restore', [file], copyUrl);
		expect(await demo(copy)).toEqual(held);
	});

	it('refuses to restore a file that is not there, saying how to name one', async () => {
		await expect(script('db-restore', ['/nonexistent/backup.dump'], copyUrl)).rejects.toMatchObject({
			code: 2,
			stderr: expect.stringContaining('No such backup file')
		});
	});
});
