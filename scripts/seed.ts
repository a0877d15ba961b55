// The demo: an invented small shop with three conversions under way. Safe to run any number of
// times; rows are matched by their natural keys (workshop slug, build name) and never doubled.
import { eq } from 'drizzle-orm';
import { connect, type Database } from '../src/lib/server/db';
import { build, workshop } from '../src/lib/server/db/schema';

export const demoWorkshop = { slug: 'demo', name: 'Marrow Street Motor Works (demo)' };

export const demoBuilds = [
	{
		name: 'Trail single 500',
		engine: 'Air-cooled 500 cc single, 4-stroke, kick start. Wheel on the crank, Hall-effect sensor.',
		notes: 'Points plate and carburettor come off. Wasted spark: the coil fires every turn.'
	},
	{
		name: 'Roadster twin 650, 360° crank',
		engine: '650 cc parallel twin, 4-stroke, both pistons rise together; fires every 360° of crank.',
		notes: 'Wheel behind the alternator rotor; keep the gap clear of the idle timing window.'
	},
	{
		name: 'Club kart 100 two-stroke',
		engine: '100 cc piston-port single, 2-stroke, rev limit 16 000 rpm. Wheel behind the clutch.',
		notes: 'Check the sensor frequency at the rev limit before choosing the tooth count.'
	}
] as const;

export async function seedDemo(database: Database) {
	return database.transaction(async (tx) => {
		const inserted = await tx.insert(workshop).values(demoWorkshop).onConflictDoNothing({ target: workshop.slug }).returning();
		const [shop] = inserted.length ? inserted : await tx.select().from(workshop).where(eq(workshop.slug, demoWorkshop.slug));
		if (!shop) throw new Error('demo workshop vanished during the seed');
		const builds = await tx
			.insert(build)
			.values(demoBuilds.map((b) => ({ ...b, workshopId: shop.id })))
			.onConflictDoNothing({ target: [build.workshopId, build.name] })
			.returning({ id: build.id });
		return { workshopCreated: inserted.length > 0, buildsCreated: builds.length };
	});
}

if (import.meta.filename === process.argv[1]) {
	if (process.env.NODE_ENV === 'production') {
		console.error('The demo seed does not run in production.');
		process.exit(2);
	}
	const database = connect(process.env.DATABASE_URL ?? '');
	const result = await seedDemo(database);
	await database.$client.end();
	console.log(result);
}
