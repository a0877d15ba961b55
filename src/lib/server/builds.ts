import { and, asc, eq } from 'drizzle-orm';
import type { Queryable } from './db';
import { build } from './db/schema';

// Every query is scoped by the workshop the caller was allowed into (access.ts), so a build id
// from another workshop matches nothing: guessing ids finds no one else's data.

export async function listBuilds(database: Queryable, workshopId: string) {
	return database
		.select({ id: build.id, name: build.name, engine: build.engine, createdAt: build.createdAt, updatedAt: build.updatedAt })
		.from(build)
		.where(eq(build.workshopId, workshopId))
		.orderBy(asc(build.name));
}

export type BuildWrite = { ok: true; id: string } | { ok: false; reason: 'name-taken' | 'not-found' };

const isUniqueViolation = (err: unknown) => {
	const cause = err instanceof Error && err.cause ? err.cause : err;
	return (cause as { code?: string })?.code === '23505';
};

export async function createBuild(database: Queryable, workshopId: string, input: { name: string; engine: string }): Promise<BuildWrite> {
	try {
		const [row] = await database.insert(build).values({ workshopId, ...input }).returning({ id: build.id });
		return { ok: true, id: row!.id };
	} catch (err) {
		if (isUniqueViolation(err)) return { ok: false, reason: 'name-taken' };
		throw err;
	}
}

export async function renameBuild(database: Queryable, workshopId: string, buildId: string, name: string): Promise<BuildWrite> {
	try {
		const rows = await database
			.update(build)
			.set({ name })
			.where(and(eq(build.id, buildId), eq(build.workshopId, workshopId)))
			.returning({ id: build.id });
		return rows[0] ? { ok: true, id: rows[0].id } : { ok: false, reason: 'not-found' };
	} catch (err) {
		if (isUniqueViolation(err)) return { ok: false, reason: 'name-taken' };
		throw err;
	}
}

export async function deleteBuild(database: Queryable, workshopId: string, buildId: string): Promise<BuildWrite> {
	const rows = await database
		.delete(build)
		.where(and(eq(build.id, buildId), eq(build.workshopId, workshopId)))
		.returning({ id: build.id });
	return rows[0] ? { ok: true, id: rows[0].id } : { ok: false, reason: 'not-found' };
}
