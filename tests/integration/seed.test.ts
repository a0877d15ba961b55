import { eq, sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { connect } from '../../src/lib/server/db';
import { build, workshop } from '../../src/lib/server/db/schema';
import { demoBuilds, demoWorkshop, seedDemo } from '../../scripts/seed';

const database = connect(process.env.DATABASE_URL!);
afterAll(() => database.$client.end());

async function demoCounts() {
	const [row] = await database
		.select({ workshops: sql<number>`count(distinct ${workshop.id})::int`, builds: sql<number>`count(${build.id})::int` })
		.from(workshop)
		.leftJoin(build, eq(build.workshopId, workshop.id))
		.where(eq(workshop.slug, demoWorkshop.slug));
	return row;
}

describe('demo seed', () => {
	it('is in the test database after set-up (npm test seeds it like npm start)', async () => {
		expect(await demoCounts()).toEqual({ workshops: 1, builds: demoBuilds.length });
	});

	it('can run again without failing or doubling anything', async () => {
		const again = await seedDemo(database);
		expect(again).toEqual({ workshopCreated: false, buildsCreated: 0 });
		expect(await demoCounts()).toEqual({ workshops: 1, builds: demoBuilds.length });
	});
});
