import { and, desc, eq } from 'drizzle-orm';
import { buildSteps } from '$lib/build-steps';
import type { Database, Queryable } from './db';
import { build as buildTable, cuttingPackage, user, wheelDesign, wheelRevision } from './db/schema';
import { latestActivity, listActivity } from './activity';
import { getBuild, type BuildWrite } from './builds';
import { designsOf } from './designs';
import { photoKeysOf, photosOf } from './photos/store';
import { deleteObject } from './storage';
import { tapesOf, tdcRecordsOf } from './records';
import { signalChecksOf } from './signal-checks';

// Everything a build holds: read whole for its page and `GET /api/v1/builds/:id`, removed whole.

export async function cuttingPackagesOf(database: Queryable, buildId: string) {
	return database
		.select({
			id: cuttingPackage.id,
			designId: cuttingPackage.designId,
			revision: cuttingPackage.revision,
			sentTo: cuttingPackage.sentTo,
			details: cuttingPackage.details,
			sentBy: user.email,
			createdAt: cuttingPackage.createdAt
		})
		.from(cuttingPackage)
		.leftJoin(user, eq(user.id, cuttingPackage.sentBy))
		.where(eq(cuttingPackage.buildId, buildId))
		.orderBy(desc(cuttingPackage.createdAt));
}

/** The newest revision of each of the build's designs, with its parameters: the wheel each tool is opened with. */
export async function headRevisionsOf(database: Queryable, buildId: string) {
	return database
		.selectDistinctOn([wheelRevision.designId], {
			designId: wheelRevision.designId,
			number: wheelRevision.number,
			params: wheelRevision.params,
			createdAt: wheelRevision.createdAt
		})
		.from(wheelRevision)
		.innerJoin(wheelDesign, eq(wheelDesign.id, wheelRevision.designId))
		.where(eq(wheelDesign.buildId, buildId))
		.orderBy(wheelRevision.designId, desc(wheelRevision.number));
}

export async function buildOverview(database: Queryable, buildId: string) {
	const [build, designs, headRevisions, tdcRecords, tapes, photos, cuttingPackages, activity, latest, signalChecks] = await Promise.all([
		getBuild(database, buildId),
		designsOf(database, buildId),
		headRevisionsOf(database, buildId),
		tdcRecordsOf(database, buildId),
		tapesOf(database, buildId),
		photosOf(database, buildId),
		cuttingPackagesOf(database, buildId),
		listActivity(database, buildId),
		latestActivity(database, buildId, ['engine', 'build-sheet']),
		signalChecksOf(database, buildId)
	]);
	if (!build) return undefined;
	const steps = buildSteps({ build, designs, headRevisions, cuttingPackages, tdcRecords, tapes, latestActivity: latest });
	return { build, steps, designs, headRevisions, tdcRecords, tapes, photos, cuttingPackages, activity, signalChecks };
}
export type BuildOverview = NonNullable<Awaited<ReturnType<typeof buildOverview>>>;

/**
 * Removes the build with everything in it, its photos' files in the object store too: the one way
 * a build is deleted, from the Builds page and from `DELETE /api/v1/builds/:id` alike. The rows go
 * first, in one transaction (the cascade takes the activity log with them, so there is no entry to
 * write); a file that then fails to go is an orphan in the bucket, never a row without its file.
 */
export async function deleteBuild(database: Database, workshopId: string, buildId: string): Promise<BuildWrite> {
	const removed = await database.transaction(async (tx) => {
		const keys = await photoKeysOf(tx, buildId);
		const rows = await tx
			.delete(buildTable)
			.where(and(eq(buildTable.id, buildId), eq(buildTable.workshopId, workshopId)))
			.returning({ id: buildTable.id });
		return rows[0] && { id: rows[0].id, keys };
	});
	if (!removed) return { ok: false, reason: 'not-found' };
	await Promise.allSettled(removed.keys.map((key) => deleteObject(key)));
	return { ok: true, id: removed.id };
}
