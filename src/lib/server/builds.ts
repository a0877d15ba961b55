import { and, asc, desc, eq, ilike, or, sql } from 'drizzle-orm';
import type { PgColumn } from 'drizzle-orm/pg-core';
import { defaultDir, readBuildCursor, writeBuildCursor, type BuildQuery } from '$lib/schemas/build';
import { checkPhasing } from '$lib/schemas/phasing';
import type { Refusal } from '$lib/schemas/refusal';
import { phasing, type PhasingResult } from '$lib/trade/phasing';
import type { Database, Queryable } from './db';
import { logActivity, type ActivityKind } from './activity';
import { build, wheelDesign, type FlatParams } from './db/schema';

// Every query is scoped by the workshop the caller was allowed into (access.ts), so a build id
// from another workshop matches nothing: guessing ids finds no one else's data.

const likePattern = (q: string) => `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

const timeColumn = { updated: build.updatedAt, created: build.createdAt } as const;

/** A timestamp to microseconds in UTC: a JavaScript Date keeps only milliseconds, and a cursor must find its row exactly. */
const exactTime = (column: PgColumn) => sql<string>`to_char(${column} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"')`;

export type ListOptions = Pick<BuildQuery, 'q' | 'sort' | 'size' | 'dir' | 'cursor'>;

/**
 * One page of a workshop's builds, searched in name and engine, and the cursor of the next page
 * (null on the last). Keyset paging: the page starts after the cursor's row, found through the
 * index of the sort (schema.ts), so a deep page costs what the first does; one row more than the
 * page tells whether there is a next one, with no count of them all. Names are unique in a
 * workshop, so the name alone orders; times tie, so the id breaks ties in the same direction.
 */
export async function listBuilds(database: Queryable, workshopId: string, options: ListOptions = { q: '', sort: 'name', size: 100 }) {
	const { query, sort, dir, size } = buildsPageQuery(database, workshopId, options);
	const rows = await query;
	const more = rows.length > size;
	const shown = rows.slice(0, size);
	const last = shown.at(-1);
	const next = more && last ? writeBuildCursor({ sort, dir, key: last.key, id: last.id }) : null;
	return { builds: shown.map(({ key: _key, ...row }) => row), next, size, sort, dir };
}

/** The statement of one page (one row more than asked for), apart so a test can EXPLAIN it. */
export function buildsPageQuery(database: Queryable, workshopId: string, options: ListOptions) {
	const { sort, size } = options;
	const dir = options.dir ?? defaultDir(sort);
	const after = options.cursor === undefined ? null : readBuildCursor(options.cursor);
	if (after && (after.sort !== sort || after.dir !== dir)) throw new Error('listBuilds: a cursor of another sort (buildQuery refuses it)');
	const conditions = [eq(build.workshopId, workshopId)];
	if (options.q) conditions.push(or(ilike(build.name, likePattern(options.q)), ilike(build.engine, likePattern(options.q)))!);
	const past = dir === 'asc' ? sql`>` : sql`<`;
	let key;
	let order;
	if (sort === 'name') {
		key = build.name;
		if (after) conditions.push(sql`${build.name} ${past} ${after.key}`);
		order = [dir === 'asc' ? asc(build.name) : desc(build.name)];
	} else {
		const column = timeColumn[sort];
		key = exactTime(column);
		// A row comparison: the btree walks (time, id) as one key, so the page starts inside the index.
		if (after) conditions.push(sql`(${column}, ${build.id}) ${past} (${after.key}::timestamptz, ${after.id}::uuid)`);
		order = dir === 'asc' ? [asc(column), asc(build.id)] : [desc(column), desc(build.id)];
	}
	const designs = database.$count(wheelDesign, eq(wheelDesign.buildId, build.id));
	const query = database
		.select({ id: build.id, name: build.name, engine: build.engine, designs, createdAt: build.createdAt, updatedAt: build.updatedAt, key })
		.from(build)
		.where(and(...conditions))
		.orderBy(...order)
		.limit(size + 1);
	return { query, sort, dir, size };
}

export async function getBuild(database: Queryable, buildId: string) {
	const [row] = await database.select().from(build).where(eq(build.id, buildId));
	return row;
}

export type BuildWrite = { ok: true; id: string } | { ok: false; reason: 'name-taken' | 'not-found' };

export const isUniqueViolation = (err: unknown, constraint?: string) => {
	const cause = (err instanceof Error && err.cause ? err.cause : err) as { code?: string; constraint?: string };
	return cause?.code === '23505' && (!constraint || cause.constraint === constraint);
};

export async function createBuild(
	database: Database,
	workshopId: string,
	input: { name: string; engine: string },
	actorId: string
): Promise<BuildWrite> {
	try {
		return await database.transaction(async (tx) => {
			const [row] = await tx
				.insert(build)
				.values({ workshopId, ...input })
				.returning({ id: build.id });
			await logActivity(tx, { buildId: row!.id, actorId, kind: 'build', summary: `Build “${input.name}” created` });
			return { ok: true as const, id: row!.id };
		});
	} catch (err) {
		if (isUniqueViolation(err)) return { ok: false, reason: 'name-taken' };
		throw err;
	}
}

export type BuildChange = { name?: string; engine?: string; notes?: string };

/**
 * Changes a build's name, engine or notes, with its activity entry in the same transaction: the
 * one path for the Builds page's rename and `PATCH /api/v1/builds/:id` alike.
 */
export function changeBuild(
	database: Database,
	workshopId: string,
	buildId: string,
	change: BuildChange,
	actorId: string
): Promise<BuildWrite> {
	const fields = Object.keys(change);
	const summary =
		fields.length === 1 && change.name !== undefined ? `Build renamed to “${change.name}”` : `Build details changed (${fields.join(', ')})`;
	return writeBuild(database, workshopId, buildId, change, { actorId, kind: 'build', summary });
}

export type EngineProfileWrite =
	| { ok: true; params: FlatParams; layout: string; phasing: PhasingResult }
	| { ok: false; reason: 'invalid'; refusals: Refusal[] }
	| { ok: false; reason: 'not-found' };

/**
 * Stores the build's engine profile and sensor set-up: the phasing check's parameters (the same
 * names as `GET /api/v1/phasing`), checked the same way, blank ones left out.
 */
export async function saveEngineProfile(
	database: Database,
	workshopId: string,
	buildId: string,
	given: FlatParams,
	actorId: string
): Promise<EngineProfileWrite> {
	const parsed = checkPhasing(given);
	if (!parsed.ok) return { ok: false, reason: 'invalid', refusals: parsed.refusals };
	const params = Object.fromEntries(Object.entries(given).filter(([, v]) => v.trim() !== ''));
	const result = phasing(parsed.value.input);
	const summary = `Engine profile: ${parsed.value.layoutLabel}; first-tooth offset ${result.firstToothOffsetDeg}° BTDC`;
	const written = await writeBuild(database, workshopId, buildId, { engineProfile: params }, { actorId, kind: 'engine', summary });
	if (!written.ok) return { ok: false, reason: 'not-found' };
	return { ok: true, params, layout: parsed.value.layoutLabel, phasing: result };
}

/** The one update of a build's row, with its activity entry, in one transaction. */
async function writeBuild(
	database: Database,
	workshopId: string,
	buildId: string,
	change: BuildChange & { engineProfile?: FlatParams },
	log: { actorId: string; kind: ActivityKind; summary: string }
): Promise<BuildWrite> {
	try {
		return await database.transaction(async (tx) => {
			const rows = await tx
				.update(build)
				.set({ ...change, updatedAt: sql`now()` })
				.where(and(eq(build.id, buildId), eq(build.workshopId, workshopId)))
				.returning({ id: build.id });
			if (!rows[0]) return { ok: false as const, reason: 'not-found' as const };
			await logActivity(tx, { buildId, actorId: log.actorId, kind: log.kind, summary: log.summary });
			return { ok: true as const, id: rows[0].id };
		});
	} catch (err) {
		if (isUniqueViolation(err)) return { ok: false, reason: 'name-taken' };
		throw err;
	}
}

/** Marks a build as changed (a new revision, record or photo), for the list's "updated" order. */
export async function touchBuild(database: Queryable, buildId: string) {
	await database
		.update(build)
		.set({ updatedAt: sql`now()` })
		.where(eq(build.id, buildId));
}

// Deleting a build is deleteBuild() in build-overview.ts, beside the photos it removes with it.
