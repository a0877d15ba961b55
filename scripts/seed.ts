// The demo: an invented small shop with three conversions under way. Safe to run any number of
// times; rows are matched by their natural keys (workshop slug, build name) and never doubled.
import { hash } from '@node-rs/argon2';
import { eq, inArray, sql } from 'drizzle-orm';
import { connect, type Database } from '../src/lib/server/db';
import {
	activity,
	build,
	member,
	tdcRecord,
	user,
	wheelDesign,
	wheelRevision,
	workshop,
	type FlatParams
} from '../src/lib/server/db/schema';

export const demoWorkshop = { slug: 'demo', name: 'Marrow Street Motor Works (demo)' };

export const demoBuilds = [
	{
		name: 'Trail single 500',
		engine: 'Air-cooled 500 cc single, 4-stroke, kick start. Wheel on the crank, Hall-effect sensor.',
		notes: 'Points plate and carburettor come off. Wasted spark: the coil fires every turn.',
		engineProfile: { teeth: '36', missing: '1', toothAtTdc: '9', layout: 'single-4', rpm: '7000', cranking: '250', sensor: 'hall' },
		design: 'Crank wheel',
		revisions: [
			{
				params: {
					units: 'mm',
					teeth: '36',
					missing: '1',
					od: '110',
					depth: '5',
					bore: '22',
					thickness: '3',
					material: 'steel',
					rpm: '7000'
				},
				message: 'First cut, from the points-cam diameter'
			},
			{
				params: {
					units: 'mm',
					teeth: '36',
					missing: '1',
					od: '110',
					depth: '5',
					bore: '22',
					keyway: 'din6885',
					shaft: '22',
					thickness: '3',
					material: 'steel',
					rpm: '7000',
					tipRadius: '0.5'
				},
				message: 'Keyway for the 22 mm stub, tip radius for the laser'
			}
		],
		tdc: { label: 'Piston stop, cold', params: { a: '16 BTDC', b: '13 ATDC', scale: 'signed' }, tdcDeg: '-1.5' }
	},
	{
		name: 'Roadster twin 650, 360° crank',
		engine: '650 cc parallel twin, 4-stroke, both pistons rise together; fires every 360° of crank.',
		notes: 'Wheel behind the alternator rotor; keep the gap clear of the idle timing window.',
		engineProfile: { teeth: '36', missing: '1', toothAtTdc: '6', layout: 'twin-360', rpm: '7500', sensor: 'hall' },
		design: 'Alternator-side wheel',
		revisions: [
			{
				params: {
					units: 'in',
					teeth: '36',
					missing: '1',
					od: '4 1/2',
					depth: '3/16',
					bore: '1',
					thickness: '1/8',
					material: 'steel',
					rpm: '7500'
				},
				message: 'Sized to the rotor face'
			}
		],
		tdc: null
	},
	{
		name: 'Club kart 100 two-stroke',
		engine: '100 cc piston-port single, 2-stroke, rev limit 16 000 rpm. Wheel behind the clutch.',
		notes: 'Check the sensor frequency at the rev limit before choosing the tooth count.',
		engineProfile: { teeth: '12', missing: '1', toothAtTdc: '2', layout: 'single-2', rpm: '16000', sensor: 'vr' },
		design: 'Clutch-side wheel',
		revisions: [
			{
				params: {
					units: 'mm',
					teeth: '12',
					missing: '1',
					od: '80',
					depth: '6',
					bore: '17',
					thickness: '2',
					material: 'aluminium',
					rpm: '16000'
				},
				message: 'Twelve teeth keep a VR sensor happy at 16 000 rpm'
			}
		],
		tdc: null
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
			.values(
				demoBuilds.map((b) => ({
					name: b.name,
					engine: b.engine,
					notes: b.notes,
					engineProfile: b.engineProfile as FlatParams,
					workshopId: shop.id
				}))
			)
			.onConflictDoNothing({ target: [build.workshopId, build.name] })
			.returning({ id: build.id, name: build.name });
		const users = await tx
			.insert(user)
			.values(
				demoUsers.map((u, i) => ({
					name: u.name,
					email: u.email,
					passwordHash: hashes[i]!,
					emailVerified: new Date(),
					passwordConfirmedAt: new Date()
				}))
			)
			.onConflictDoNothing({ target: user.email })
			.returning({ id: user.id });
		// Demo users seeded before addresses and passwords were confirmed count as confirmed too.
		await tx
			.update(user)
			.set({
				emailVerified: sql`coalesce(${user.emailVerified}, now())`,
				passwordConfirmedAt: sql`coalesce(${user.passwordConfirmedAt}, now())`
			})
			.where(
				inArray(
					user.email,
					demoUsers.map((u) => u.email)
				)
			);
		const ids = await tx
			.select({ id: user.id, email: user.email })
			.from(user)
			.where(
				inArray(
					user.email,
					demoUsers.map((u) => u.email)
				)
			);
		await tx
			.insert(member)
			.values(ids.map((u) => ({ workshopId: shop.id, userId: u.id, role: demoUsers.find((d) => d.email === u.email)!.role })))
			.onConflictDoNothing();
		// Only builds made by this run get their designs, records and log: a second run adds nothing.
		const author = ids.find((u) => u.email === demoUsers[0].email)?.id ?? null;
		for (const made of builds) {
			const demo = demoBuilds.find((b) => b.name === made.name)!;
			const [design] = await tx.insert(wheelDesign).values({ buildId: made.id, name: demo.design }).returning({ id: wheelDesign.id });
			await tx.insert(wheelRevision).values(
				demo.revisions.map((r, i) => ({
					designId: design!.id,
					number: i + 1,
					params: r.params as FlatParams,
					message: r.message,
					authorId: author
				}))
			);
			if (demo.tdc)
				await tx
					.insert(tdcRecord)
					.values({ buildId: made.id, label: demo.tdc.label, params: demo.tdc.params, tdcDeg: demo.tdc.tdcDeg, authorId: author });
			await tx.insert(activity).values([
				{ buildId: made.id, actorId: author, kind: 'build', summary: `Build “${demo.name}” created (demo)` },
				...demo.revisions.map((r, i) => ({
					buildId: made.id,
					actorId: author,
					kind: i ? 'revision' : 'design',
					summary: `“${demo.design}” revision ${i + 1}: ${r.message}`
				}))
			]);
		}
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
