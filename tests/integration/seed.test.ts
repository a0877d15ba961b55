import { eq, sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { connect } from '../../src/lib/server/db';
import { build, member, user, workshop } from '../../src/lib/server/db/schema';
import { demoBuilds, demoUsers, demoWorkshop, seedDemo } from '../../scripts/seed';

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
		expect(again).toEqual({ workshopCreated: false, buildsCreated: 0, usersCreated: 0 });
		expect(await demoCounts()).toEqual({ workshops: 1, builds: demoBuilds.length });
	});
});

describe('demo users', () => {
	it('are members of the demo workshop at two different roles', async () => {
		const rows = await database
			.select({ email: user.email, role: member.role })
			.from(member)
			.innerJoin(user, eq(member.userId, user.id))
			.innerJoin(workshop, eq(member.workshopId, workshop.id))
			.where(eq(workshop.slug, demoWorkshop.slug));
		expect(rows.sort((a, b) => a.email.localeCompare(b.email))).toEqual(
			demoUsers.map((u) => ({ email: u.email, role: u.role })).sort((a, b) => a.email.localeCompare(b.email))
		);
	});
});

describe('demo designs and profiles', () => {
	it('are wheels the designer accepts and profiles the phasing check accepts, each once', async () => {
		const { checkWheel } = await import('../../src/lib/server/wheel-request');
		const { checkPhasing } = await import('../../src/lib/schemas/phasing');
		const { findTdc } = await import('../../src/lib/schemas/tdc');
		for (const demo of demoBuilds) {
			for (const r of demo.revisions) expect(checkWheel(r.params), `${demo.name}: ${r.message}`).toMatchObject({ ok: true });
			expect(checkPhasing(demo.engineProfile), demo.name).toMatchObject({ ok: true });
			// The stored TDC is half-way between the piston-stop marks (common practice): 16 BTDC and 13
			// ATDC are 29° apart, 14.5° each side: −16 + 14.5 = −1.5, 1.5° BTDC (by hand).
			if (demo.tdc)
				expect(findTdc(demo.tdc.params)).toMatchObject({ ok: true, value: { result: { tdcDeg: Number(demo.tdc.tdcDeg), spreadDeg: 29 } } });
		}
		const { rows } = await database.execute<{ n: number }>(
			sql`select count(*)::int as n from wheel_revision r join wheel_design d on d.id = r.design_id join build b on b.id = d.build_id join workshop w on w.id = b.workshop_id where w.slug = ${demoWorkshop.slug}`
		);
		expect(rows[0]!.n).toBe(demoBuilds.reduce((n, b) => n + b.revisions.length, 0));
	});
});
