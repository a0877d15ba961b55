import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import type { AnyPgColumn } from 'drizzle-orm/pg-core';
import type { Queryable } from './db';
import { activity, cuttingPackage, degreeTape, signalCheck, tdcRecord, user, wheelPhoto, wheelRevision } from './db/schema';
import { cursorAt, olderThan, pageOf, type Page, type PageAsk } from './keyset';
import { photoColumns } from './photos/store';

// A build's lists one page at a time, newest first: what its page and `GET /api/v1/builds/:id`
// show, and what the list routes (`…/photos?cursor=`, `…/activity?cursor=`, …) page through.
// Every query filters on build_id and orders by (created_at desc, id desc), the order of the
// indexes on each table, and asks one row more than it answers to know whether there is a next page.

/** The columns every build list pages by. */
interface Listed {
	buildId: AnyPgColumn;
	createdAt: AnyPgColumn;
	id: AnyPgColumn;
}

/** The build's rows after the cursor; with newestFirst, the order of each list's index. */
const onPage = (t: Listed, buildId: string, ask: PageAsk) => and(eq(t.buildId, buildId), olderThan(t.createdAt, t.id, ask.cursor));
const newestFirst = (t: Listed) => [desc(t.createdAt), desc(t.id)] as const;

/** Rows per page: the page shows fewer than the API answers, since each row there is a card. */
export const pageSize = { page: 20, api: 50 } as const;

export type BuildList = 'photos' | 'tdcRecords' | 'tapes' | 'signalChecks' | 'cuttingPackages' | 'activity';
export const buildLists: readonly BuildList[] = ['photos', 'tdcRecords', 'tapes', 'signalChecks', 'cuttingPackages', 'activity'];

export async function photoPage(database: Queryable, buildId: string, ask: PageAsk) {
	const rows = await database
		.select({ ...photoColumns, cursorAt: cursorAt(wheelPhoto.createdAt) })
		.from(wheelPhoto)
		.leftJoin(user, eq(user.id, wheelPhoto.uploadedBy))
		.where(onPage(wheelPhoto, buildId, ask))
		.orderBy(...newestFirst(wheelPhoto))
		.limit(ask.limit + 1);
	return pageOf(rows, ask.limit);
}

export async function tdcRecordPage(database: Queryable, buildId: string, ask: PageAsk) {
	const rows = await database
		.select({
			id: tdcRecord.id,
			label: tdcRecord.label,
			params: tdcRecord.params,
			tdcDeg: tdcRecord.tdcDeg,
			author: user.email,
			createdAt: tdcRecord.createdAt,
			cursorAt: cursorAt(tdcRecord.createdAt)
		})
		.from(tdcRecord)
		.leftJoin(user, eq(user.id, tdcRecord.authorId))
		.where(onPage(tdcRecord, buildId, ask))
		.orderBy(...newestFirst(tdcRecord))
		.limit(ask.limit + 1);
	return pageOf(rows, ask.limit);
}

export async function tapePage(database: Queryable, buildId: string, ask: PageAsk) {
	const rows = await database
		.select({
			id: degreeTape.id,
			label: degreeTape.label,
			params: degreeTape.params,
			author: user.email,
			createdAt: degreeTape.createdAt,
			cursorAt: cursorAt(degreeTape.createdAt)
		})
		.from(degreeTape)
		.leftJoin(user, eq(user.id, degreeTape.authorId))
		.where(onPage(degreeTape, buildId, ask))
		.orderBy(...newestFirst(degreeTape))
		.limit(ask.limit + 1);
	return pageOf(rows, ask.limit);
}

export async function signalCheckPage(database: Queryable, buildId: string, ask: PageAsk) {
	const rows = await database
		.select({
			id: signalCheck.id,
			label: signalCheck.label,
			params: signalCheck.params,
			cases: signalCheck.cases,
			author: user.email,
			createdAt: signalCheck.createdAt,
			cursorAt: cursorAt(signalCheck.createdAt)
		})
		.from(signalCheck)
		.leftJoin(user, eq(user.id, signalCheck.authorId))
		.where(onPage(signalCheck, buildId, ask))
		.orderBy(...newestFirst(signalCheck))
		.limit(ask.limit + 1);
	return pageOf(rows, ask.limit);
}

export async function cuttingPackagePage(database: Queryable, buildId: string, ask: PageAsk) {
	const rows = await database
		.select({
			id: cuttingPackage.id,
			designId: cuttingPackage.designId,
			revision: cuttingPackage.revision,
			sentTo: cuttingPackage.sentTo,
			details: cuttingPackage.details,
			sentBy: user.email,
			createdAt: cuttingPackage.createdAt,
			cursorAt: cursorAt(cuttingPackage.createdAt)
		})
		.from(cuttingPackage)
		.leftJoin(user, eq(user.id, cuttingPackage.sentBy))
		.where(onPage(cuttingPackage, buildId, ask))
		.orderBy(...newestFirst(cuttingPackage))
		.limit(ask.limit + 1);
	return pageOf(rows, ask.limit);
}

export async function activityPage(database: Queryable, buildId: string, ask: PageAsk) {
	const rows = await database
		.select({
			id: activity.id,
			kind: activity.kind,
			summary: activity.summary,
			createdAt: activity.createdAt,
			actor: user.email,
			cursorAt: cursorAt(activity.createdAt)
		})
		.from(activity)
		.leftJoin(user, eq(user.id, activity.actorId))
		.where(onPage(activity, buildId, ask))
		.orderBy(...newestFirst(activity))
		.limit(ask.limit + 1);
	return pageOf(rows, ask.limit);
}

/**
 * What the build's steps need of its cutting packages, whatever their number: for each design,
 * one package sent at its head revision if there is one, else its newest (src/lib/build-steps.ts
 * reads only those two facts). The head is an index probe on wheel_revision (design_id, number).
 */
export async function packagesForSteps(database: Queryable, buildId: string) {
	const head = sql<number>`(select max(${wheelRevision.number}) from ${wheelRevision} where ${wheelRevision.designId} = ${cuttingPackage.designId})`;
	return database
		.selectDistinctOn([cuttingPackage.designId], {
			designId: cuttingPackage.designId,
			revision: cuttingPackage.revision,
			createdAt: cuttingPackage.createdAt
		})
		.from(cuttingPackage)
		.where(eq(cuttingPackage.buildId, buildId))
		.orderBy(cuttingPackage.designId, sql`(${cuttingPackage.revision} = ${head}) desc`, desc(cuttingPackage.createdAt));
}

export const listPage: Record<BuildList, (database: Queryable, buildId: string, ask: PageAsk) => Promise<Page<unknown>>> = {
	photos: photoPage,
	tdcRecords: tdcRecordPage,
	tapes: tapePage,
	signalChecks: signalCheckPage,
	cuttingPackages: cuttingPackagePage,
	activity: activityPage
};

/** The photos just stored, by id, as the list shows them (an upload answers only its own). */
export async function photosById(database: Queryable, buildId: string, ids: string[]) {
	if (ids.length === 0) return [];
	return database
		.select(photoColumns)
		.from(wheelPhoto)
		.leftJoin(user, eq(user.id, wheelPhoto.uploadedBy))
		.where(and(eq(wheelPhoto.buildId, buildId), inArray(wheelPhoto.id, ids)))
		.orderBy(desc(wheelPhoto.createdAt), desc(wheelPhoto.id));
}
