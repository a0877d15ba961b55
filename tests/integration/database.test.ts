import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { eq, sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { connect } from '../../src/lib/server/db';
import { build, workshop } from '../../src/lib/server/db/schema';
import { migrationsFolder } from '../../scripts/db';

const database = connect(process.env.DATABASE_URL!);
afterAll(() => database.$client.end());

describe('PostgreSQL through Drizzle', () => {
	it('is a real PostgreSQL server', async () => {
		const { rows } = await database.execute<{ server_version_num: string }>(sql`show server_version_num`);
		expect(Number(rows[0]!.server_version_num)).toBeGreaterThanOrEqual(150000);
	});

	it('has applied every committed migration', async () => {
		const journal = JSON.parse(readFileSync(join(migrationsFolder, 'meta', '_journal.json'), 'utf8')) as { entries: unknown[] };
		const { rows } = await database.execute<{ n: number }>(sql`select count(*)::int as n from drizzle.__drizzle_migrations`);
		expect(rows[0]!.n).toBe(journal.entries.length);
	});

	it('writes a workshop with a build and reads them back', async () => {
		const slug = `it-${Date.now()}`;
		const [shop] = await database.insert(workshop).values({ slug, name: 'Integration bench' }).returning();
		await database.insert(build).values({ workshopId: shop!.id, name: 'Bench single', engine: '250 cc single' });

		const rows = await database
			.select({ shop: workshop.name, build: build.name, engine: build.engine })
			.from(build)
			.innerJoin(workshop, eq(build.workshopId, workshop.id))
			.where(eq(workshop.slug, slug));
		expect(rows).toEqual([{ shop: 'Integration bench', build: 'Bench single', engine: '250 cc single' }]);

		// Deleting the workshop takes its builds with it (ON DELETE CASCADE).
		await database.delete(workshop).where(eq(workshop.id, shop!.id));
		expect(await database.select().from(build).where(eq(build.workshopId, shop!.id))).toEqual([]);
	});

	it('refuses a second build of the same name in one workshop', async () => {
		const [shop] = await database
			.insert(workshop)
			.values({ slug: `dup-${Date.now()}`, name: 'Twice' })
			.returning();
		await database.insert(build).values({ workshopId: shop!.id, name: 'Same' });
		await expect(database.insert(build).values({ workshopId: shop!.id, name: 'Same' })).rejects.toThrow();
		await database.delete(workshop).where(eq(workshop.id, shop!.id));
	});
});
