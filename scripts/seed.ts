// The demo: an invented small shop with three conversions under way. Safe to run any number of
// times; rows are matched by their natural keys (workshop slug, build name) and never doubled.
import { hash } from '@node-rs/argon2';
import { eq, inArray } from 'drizzle-orm';
import { connect, type Database } from '../src/lib/server/db';
import { build, member, user, workshop } from '../src/lib/server/db/schema';

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

/** For local use only (README lists them); the seed never runs in production. */
export const demoUsers = [
	{ name: 'Ines Okafor', email: 'owner@marrow-street.test', password: 'demo-owner-2026', role: 'owner' },
	{ name: 'Tom Reyes', email: 'viewer@marrow-street.test', password: 'demo-viewer-2026', role: 'viewer' }
] as const;

export async function seedDemo(database: Database) {
	const hashes = await Promise.all(demoUsers.map((u) => hash(u.password)));
	return database.transaction(async (tx) => {
		const inserted = await tx.insert(workshop).values(demoWorkshop).onConflictDoNothing({ target: workshop.slug }).returning();
		const [shop] = inserted.length ? inserted : await tx.select().from(workshop).where(eq(workshop.slug, demoWorkshop.slug));
		if (!shop) throw new Error('demo workshop vanished during the seed');
		const builds = await tx
			.insert(build)
			.values(demoBuilds.map((b) => ({ ...b, workshopId: shop.id })))
			.onConflictDoNothing({ target: [build.workshopId, build.name] })
			.returning({ id: build.id });
		const users = await tx
			.insert(user)
			.values(demoUsers.map((u, i) => ({ name: u.name, email: u.email, passwordHash: hashes[i]!, emailVerified: new Date() })))
			.onConflictDoNothing({ target: user.email })
			.returning({ id: user.id });
		const ids = await tx.select({ id: user.id, email: user.email }).from(user).where(inArray(user.email, demoUsers.map((u) => u.email)));
		await tx
			.insert(member)
			.values(ids.map((u) => ({ workshopId: shop.id, userId: u.id, role: demoUsers.find((d) => d.email === u.email)!.role })))
			.onConflictDoNothing();
		return { workshopCreated: inserted.length > 0, buildsCreated: builds.length, usersCreated: users.length };
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
