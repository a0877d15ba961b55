import { and, desc, eq, ilike, lt, or, sql } from 'drizzle-orm';
import { readRevisionCursor, writeRevisionCursor } from '$lib/schemas/build';
import type { Database, Queryable } from './db';
import { user, wheelDesign, wheelRevision, type FlatParams } from './db/schema';
import { refusalsUnder, type Refusal } from '$lib/schemas/refusal';
import { logActivity } from './activity';
import { isUniqueViolation, touchBuild } from './builds';
import { checkWheel } from './wheel-request';

// Wheel designs and their revisions. A revision is written once and never changed (a database
// trigger refuses updates); a save names the revision it started from, and the unique
// (design, number) constraint lets exactly one save per base land, whatever the timing.

export const revisionColumns = {
	number: wheelRevision.number,
	params: wheelRevision.params,
	message: wheelRevision.message,
	restoredFrom: wheelRevision.restoredFrom,
	author: user.email,
	createdAt: wheelRevision.createdAt
};

export type Revision = {
	number: number;
	params: FlatParams;
	message: string;
	restoredFrom: number | null;
	author: string | null;
	createdAt: Date;
};

/**
 * A design's newest revision number as one probe of the unique (design, number) index, read
 * backwards: a design with thousands of revisions costs what one with a single revision does.
 */
// Written out with an alias: Drizzle leaves columns unqualified in a one-table select, where
// "id" inside the subquery would be the revision's own.
const headProbe = sql<
	number | null
>`(select r.number from ${wheelRevision} r where r.design_id = ${wheelDesign}.id order by r.number desc limit 1)`;

export async function designsOf(database: Queryable, buildId: string) {
	return database
		.select({
			id: wheelDesign.id,
			name: wheelDesign.name,
			headRevision: headProbe,
			createdAt: wheelDesign.createdAt,
			updatedAt: wheelDesign.updatedAt
		})
		.from(wheelDesign)
		.where(eq(wheelDesign.buildId, buildId))
		.orderBy(wheelDesign.name);
}

/** The newest revision's number (0 for a design with none, which createDesign never leaves). */
export async function headRevisionOf(database: Queryable, designId: string): Promise<number> {
	const [row] = await headRevisionQuery(database, designId);
	return row?.number ?? 0;
}

/** The head probe's statement, apart so a test can EXPLAIN it. */
export const headRevisionQuery = (database: Queryable, designId: string) =>
	database
		.select({ number: wheelRevision.number })
		.from(wheelRevision)
		.where(eq(wheelRevision.designId, designId))
		.orderBy(desc(wheelRevision.number))
		.limit(1);

export async function getDesign(database: Queryable, designId: string) {
	const [row] = await database.select().from(wheelDesign).where(eq(wheelDesign.id, designId));
	return row;
}

/** How many revisions a page of the history holds (the API's and the history page's). */
export const revisionPageSize = 50;

const likePattern = (q: string) => `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

/**
 * A page of a design's revisions, newest first: those below the cursor's number, and the cursor of
 * the page after (null on the last). Keyset paging down the unique (design, number) index; one row
 * more than the page tells whether there is another. `q` finds a revision by its number or by words
 * of its message; a design's revisions are few enough (thousands) that the index range is filtered.
 */
export async function revisionPage(
	database: Queryable,
	designId: string,
	options: { cursor?: string; q?: string; size?: number } = {}
): Promise<{ revisions: Revision[]; next: string | null }> {
	const size = options.size ?? revisionPageSize;
	const rows = await revisionPageQuery(database, designId, { ...options, size });
	const revisions = rows.slice(0, size);
	const last = revisions.at(-1);
	return { revisions, next: rows.length > size && last ? writeRevisionCursor(last.number) : null };
}

/** One page's statement (one row more than `size`), apart so a test can EXPLAIN it. */
export function revisionPageQuery(database: Queryable, designId: string, options: { cursor?: string; q?: string; size: number }) {
	const below = options.cursor === undefined ? null : readRevisionCursor(options.cursor);
	const conditions = [eq(wheelRevision.designId, designId)];
	if (below !== null) conditions.push(lt(wheelRevision.number, below));
	const q = options.q?.trim() ?? '';
	if (q) {
		const asNumber = /^\d{1,7}$/.test(q) ? Number(q) : null;
		const byMessage = ilike(wheelRevision.message, likePattern(q));
		conditions.push(asNumber === null ? byMessage : or(eq(wheelRevision.number, asNumber), byMessage)!);
	}
	return database
		.select(revisionColumns)
		.from(wheelRevision)
		.leftJoin(user, eq(user.id, wheelRevision.authorId))
		.where(and(...conditions))
		.orderBy(desc(wheelRevision.number))
		.limit(options.size + 1);
}

/** One revision, or the newest when `number` is not given. */
export async function revisionOf(database: Queryable, designId: string, number?: number): Promise<Revision | undefined> {
	const where =
		number === undefined
			? eq(wheelRevision.designId, designId)
			: and(eq(wheelRevision.designId, designId), eq(wheelRevision.number, number));
	const [row] = await database
		.select(revisionColumns)
		.from(wheelRevision)
		.leftJoin(user, eq(user.id, wheelRevision.authorId))
		.where(where)
		.orderBy(desc(wheelRevision.number))
		.limit(1);
	return row;
}

type Invalid = { ok: false; reason: 'invalid'; refusals: Refusal[] };

/**
 * The wheel check every revision passes before it is written, whether created, saved or restored:
 * the designer's own (parseWheel, then the summary's geometry checks), so a saved revision always
 * opens and exports again. The one place it is called for designs: switch it here.
 */
export function checkDesignParams(params: FlatParams): { ok: true; params: FlatParams } | Invalid {
	const wheel = checkWheel(params);
	return wheel.ok ? { ok: true, params: wheel.params } : { ok: false, reason: 'invalid', refusals: refusalsUnder('params', wheel.errors) };
}

export type CreateDesign = { ok: true; designId: string } | { ok: false; reason: 'name-taken' } | Invalid;

/** A new design with its revision 1, checked as every revision is. */
export async function createDesign(
	database: Database,
	buildId: string,
	input: { name: string; params: FlatParams; message: string },
	authorId: string
): Promise<CreateDesign> {
	const checked = checkDesignParams(input.params);
	if (!checked.ok) return checked;
	try {
		return await database.transaction(async (tx) => {
			const [design] = await tx.insert(wheelDesign).values({ buildId, name: input.name }).returning({ id: wheelDesign.id });
			await tx
				.insert(wheelRevision)
				.values({ designId: design!.id, number: 1, params: checked.params, message: input.message || 'First revision', authorId });
			await logActivity(tx, { buildId, actorId: authorId, kind: 'design', summary: `New wheel design “${input.name}”, revision 1` });
			await touchBuild(tx, buildId);
			return { ok: true as const, designId: design!.id };
		});
	} catch (err) {
		if (isUniqueViolation(err, 'wheel_design_build_name')) return { ok: false, reason: 'name-taken' };
		throw err;
	}
}

type DesignRef = { id: string; name: string; buildId: string };

/** `params` are the parameters as checked (the wheel's own names only): what a stale save would have written. */
export type SaveResult = { ok: true; revision: Revision } | { ok: false; reason: 'stale'; head: Revision; params: FlatParams } | Invalid;

/**
 * Saves `params` as the revision after `baseRevision`, once they pass the wheel check. Refused as
 * stale when the design has moved on since that base; the answer then carries the newest revision
 * so the caller can choose.
 */
export async function saveRevision(
	database: Database,
	design: DesignRef,
	input: { baseRevision: number; params: FlatParams; message: string },
	authorId: string
): Promise<SaveResult> {
	const checked = checkDesignParams(input.params);
	if (!checked.ok) return checked;
	return writeRevision(database, design, { ...input, params: checked.params }, authorId);
}

export type RestoreResult = SaveResult | { ok: false; reason: 'not-found' };

/**
 * Restoring never rewrites history: the old revision's parameters become a new revision on top of
 * `baseRevision`. They pass today's wheel check first, as any save does; a revision saved under
 * looser rules is refused by field rather than written again.
 */
export async function restoreRevision(
	database: Database,
	design: DesignRef,
	input: { revision: number; baseRevision: number; message?: string },
	authorId: string
): Promise<RestoreResult> {
	const old = await revisionOf(database, design.id, input.revision);
	if (!old) return { ok: false, reason: 'not-found' };
	const checked = checkDesignParams(old.params);
	if (!checked.ok) return checked;
	const message = input.message ?? `Restores revision ${old.number}`;
	return writeRevision(
		database,
		design,
		{ baseRevision: input.baseRevision, params: checked.params, message, restoredFrom: old.number },
		authorId
	);
}

/** The one insert of a revision, with its activity entry, in one transaction; `params` already checked. */
async function writeRevision(
	database: Database,
	design: DesignRef,
	input: { baseRevision: number; params: FlatParams; message: string; restoredFrom?: number },
	authorId: string
): Promise<SaveResult> {
	const number = input.baseRevision + 1;
	try {
		await database.transaction(async (tx) => {
			const head = await revisionOf(tx, design.id);
			if (!head || head.number !== input.baseRevision) throw new Stale();
			await tx.insert(wheelRevision).values({
				designId: design.id,
				number,
				params: input.params,
				message: input.message,
				restoredFrom: input.restoredFrom ?? null,
				authorId
			});
			await tx.update(wheelDesign).set({ updatedAt: new Date() }).where(eq(wheelDesign.id, design.id));
			const summary = input.restoredFrom
				? `“${design.name}” revision ${number} restores revision ${input.restoredFrom}`
				: `“${design.name}” revision ${number}${input.message ? `: ${input.message}` : ''}`;
			await logActivity(tx, { buildId: design.buildId, actorId: authorId, kind: input.restoredFrom ? 'restore' : 'revision', summary });
			await touchBuild(tx, design.buildId);
		});
	} catch (err) {
		// Another save from the same base got there first: its insert holds the number.
		if (!(err instanceof Stale) && !isUniqueViolation(err, 'wheel_revision_design_number')) throw err;
		return { ok: false, reason: 'stale', head: (await revisionOf(database, design.id))!, params: input.params };
	}
	return { ok: true, revision: (await revisionOf(database, design.id, number))! };
}

class Stale extends Error {}
