import { and, desc, eq, sql } from 'drizzle-orm';
import { buildSteps } from '$lib/build-steps';
import type { Database, Queryable } from './db';
import { build as buildTable, wheelDesign, wheelRevision } from './db/schema';
import { latestActivity } from './activity';
import {
	activityPage,
	cuttingPackagePage,
	packagesForSteps,
	photoPage,
	signalCheckPage,
	tapePage,
	tdcRecordPage,
	type BuildList
} from './build-lists';
import { getBuild, type BuildWrite } from './builds';
import { designsOf } from './designs';
import type { Cursor } from './keyset';
import { photoKeysOf } from './photos/store';
import { deleteObject } from './storage';

// What a build holds: each list a page at a time for its page and `GET /api/v1/builds/:id`
// (build-lists.ts), and removed whole.

/**
 * The newest revision of each of the build's designs, with its parameters: the wheel each tool is
 * opened with. One index probe per design on wheel_revision (design_id, number), however many
 * revisions a design has.
 */
export async function headRevisionsOf(database: Queryable, buildId: string) {
	const head = database
		.select({ number: wheelRevision.number, params: wheelRevision.params, createdAt: wheelRevision.createdAt })
		.from(wheelRevision)
		.where(eq(wheelRevision.designId, wheelDesign.id))
		.orderBy(desc(wheelRevision.number))
		.limit(1)
		.as('head');
	return database
		.select({ designId: wheelDesign.id, number: head.number, params: head.params, createdAt: head.createdAt })
		.from(wheelDesign)
		.innerJoinLateral(head, sql`true`)
		.where(eq(wheelDesign.buildId, buildId))
		.orderBy(wheelDesign.id);
}

/**
 * A build with the newest page of each of its lists (and a `next` cursor for each): its page and
 * `GET /api/v1/builds/:id`. `cursors` starts a list further down; the steps still read the newest
 * rows, so paging a list never changes them.
 */
export async function buildOverview(database: Queryable, buildId: string, options: OverviewOptions) {
	const ask = (list: BuildList) => ({ cursor: options.cursors?.[list], limit: options.limit });
	const newest = (list: BuildList) => (options.cursors?.[list] ? { limit: 1 } : undefined);
	const tdcNewest = newest('tdcRecords');
	const tapeNewest = newest('tapes');
	const [
		build,
		designs,
		headRevisions,
		tdcRecords,
		tapes,
		photos,
		cuttingPackages,
		activity,
		latest,
		signalChecks,
		sent,
		firstTdc,
		firstTape
	] = await Promise.all([
		getBuild(database, buildId),
		designsOf(database, buildId),
		headRevisionsOf(database, buildId),
		tdcRecordPage(database, buildId, ask('tdcRecords')),
		tapePage(database, buildId, ask('tapes')),
		photoPage(database, buildId, ask('photos')),
		cuttingPackagePage(database, buildId, ask('cuttingPackages')),
		activityPage(database, buildId, ask('activity')),
		latestActivity(database, buildId, ['engine', 'build-sheet']),
		signalCheckPage(database, buildId, ask('signalChecks')),
		packagesForSteps(database, buildId),
		tdcNewest && tdcRecordPage(database, buildId, tdcNewest),
		tapeNewest && tapePage(database, buildId, tapeNewest)
	]);
	if (!build) return undefined;
	const steps = buildSteps({
		build,
		designs,
		headRevisions,
		cuttingPackages: sent,
		tdcRecords: (firstTdc ?? tdcRecords).items,
		tapes: (firstTape ?? tapes).items,
		latestActivity: latest
	});
	const next: Record<BuildList, string | null> = {
		photos: photos.next,
		tdcRecords: tdcRecords.next,
		tapes: tapes.next,
		signalChecks: signalChecks.next,
		cuttingPackages: cuttingPackages.next,
		activity: activity.next
	};
	return {
		build,
		steps,
		designs,
		headRevisions,
		tdcRecords: tdcRecords.items,
		tapes: tapes.items,
		photos: photos.items,
		cuttingPackages: cuttingPackages.items,
		activity: activity.items,
		signalChecks: signalChecks.items,
		next
	};
}

export interface OverviewOptions {
	/** Rows per list (pageSize.page or pageSize.api). */
	limit: number;
	/** Where a list starts, when not at its newest. */
	cursors?: Partial<Record<BuildList, Cursor>>;
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
