import { desc, eq } from 'drizzle-orm';
import type { Queryable } from './db';
import { activity, user } from './db/schema';

// The build's activity log. Written in the same transaction as the change it tells of, so the log
// never mentions a change that did not happen.

export type ActivityKind =
	'build' | 'engine' | 'design' | 'revision' | 'restore' | 'tdc' | 'tape' | 'photo' | 'reading' | 'cutting-package' | 'invitation';

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
