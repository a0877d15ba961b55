import { and, desc, eq, inArray } from 'drizzle-orm';
import type { Queryable } from './db';
import { activity, user } from './db/schema';

// The build's activity log. Written in the same transaction as the change it tells of, so the log
// never mentions a change that did not happen.

export type ActivityKind =
	| 'build'
	| 'engine'
	| 'design'
	| 'revision'
	| 'restore'
	| 'tdc'
	| 'tape'
	| 'photo'
	| 'reading'
	| 'cutting-package'
	| 'invitation'
	| 'build-sheet'
	| 'signal';

export async function logActivity(
	database: Queryable,
	entry: { buildId: string; actorId: string | null; kind: ActivityKind; summary: string }
) {
	await database.insert(activity).values(entry);
}

export async function listActivity(database: Queryable, buildId: string, limit = 50) {
	return database
		.select({ id: activity.id, kind: activity.kind, summary: activity.summary, createdAt: activity.createdAt, actor: user.email })
		.from(activity)
		.leftJoin(user, eq(user.id, activity.actorId))
		.where(eq(activity.buildId, buildId))
		.orderBy(desc(activity.createdAt), desc(activity.id))
		.limit(limit);
}

/**
 * The newest entry of each of `kinds`, whatever the length of the log: the build's steps read when
 * the engine profile was last saved and the build sheet last issued (src/lib/build-steps.ts).
 */
export async function latestActivity(database: Queryable, buildId: string, kinds: readonly ActivityKind[]) {
	return database
		.selectDistinctOn([activity.kind], { kind: activity.kind, summary: activity.summary, createdAt: activity.createdAt })
		.from(activity)
		.where(and(eq(activity.buildId, buildId), inArray(activity.kind, [...kinds])))
		.orderBy(activity.kind, desc(activity.createdAt), desc(activity.id));
}
