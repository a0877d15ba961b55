import { sql, type AnyColumn, type SQL } from 'drizzle-orm';
import { decodeCursor as decodeParts, encodeCursor as encodeParts } from '$lib/schemas/cursor';
import { refusal, type Refusal } from '$lib/schemas/refusal';

// Keyset paging for a build's lists (newest first by created_at, then id): a page ends where the
// next one starts, so a row added or removed meanwhile never shifts a page, and a deep page costs
// what the first does (an index probe on (build_id, created_at desc, id desc), no OFFSET).
//
// The cursor carries the last row's time as PostgreSQL wrote it, to the microsecond: a JavaScript
// Date keeps milliseconds only, and rows saved in the same millisecond would be skipped or repeated.

export interface Cursor {
	/** The row's created_at in UTC, six fraction digits: `2026-12-02T20:22:57.123456Z`. */
	at: string;
	id: string;
}

export interface Page<T> {
	items: T[];
	/** Opaque; gives the next (older) page, or null when this one is the last. */
	next: string | null;
}

export interface PageAsk {
	cursor?: Cursor;
	limit: number;
}

const stamp = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{6}Z$/;
const uuid = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

/** One cursor form for every list (src/lib/schemas/cursor.ts): here its parts are the time and the id. */
export function encodeCursor(cursor: Cursor): string {
	return encodeParts([cursor.at, cursor.id]);
}

/** The cursor in `text`, or null for anything this code did not write (never thrown: hostile input is normal). */
export function decodeCursor(text: string): Cursor | null {
	if (text.length > 120) return null;
	const parts = decodeParts(text, 2);
	if (!parts) return null;
	const [at, id] = parts as [string, string];
	if (!stamp.test(at) || !uuid.test(id)) return null;
	// A well-formed but impossible date (February 31) must not reach PostgreSQL, which would refuse it with a 500.
	const date = new Date(at);
	if (Number.isNaN(date.getTime()) || date.toISOString().slice(0, 23) !== at.slice(0, 23)) return null;
	return { at, id };
}

/** Reads the optional cursor parameter `field`: the cursor, nothing, or a refusal naming the field. */
export function cursorParam(value: string | null, field = 'cursor'): { ok: true; cursor?: Cursor } | { ok: false; refusal: Refusal } {
	if (value === null || value === '') return { ok: true };
	const cursor = decodeCursor(value);
	if (!cursor) return { ok: false, refusal: refusal(field, 'not a cursor this list gave; start again without it') };
	return { ok: true, cursor };
}

/** The column's time as the cursor keeps it (UTC, microseconds). */
export const cursorAt = (column: AnyColumn) => sql<string>`to_char(${column} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"')`;

/** Rows after the cursor in newest-first order; one row comparison, which the (…, created_at desc, id desc) index serves. */
export const olderThan = (at: AnyColumn, id: AnyColumn, cursor: Cursor | undefined): SQL | undefined =>
	cursor ? sql`(${at}, ${id}) < (${cursor.at}::timestamptz, ${cursor.id}::uuid)` : undefined;

/**
 * A page from rows fetched with `limit + 1`: the extra row only says there is a next page (no
 * count). Each row's `cursorAt` column is dropped from what is answered.
 */
export function pageOf<T extends { id: string; cursorAt: string }>(rows: T[], limit: number): Page<Omit<T, 'cursorAt'>> {
	const kept = rows.slice(0, limit);
	const last = kept[kept.length - 1];
	const next = rows.length > limit && last ? encodeCursor({ at: last.cursorAt, id: last.id }) : null;
	return { items: kept.map(({ cursorAt: _, ...row }) => row), next };
}
