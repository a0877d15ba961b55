import { describe, expect, it } from 'vitest';
import { cursorParam, decodeCursor, encodeCursor, pageOf } from './keyset';

const id = '0b7c2f5e-3a41-4d6e-9f10-2b3c4d5e6f70';

describe('cursor', () => {
	it('reads back what it wrote, to the microsecond', () => {
		const cursor = { at: '2026-12-02T20:22:57.123456Z', id };
		expect(decodeCursor(encodeCursor(cursor))).toEqual(cursor);
	});

	it('is base64url of a JSON array of the time and the id (checked with Node’s own decoder)', () => {
		const text = encodeCursor({ at: '2026-12-02T20:22:57.000001Z', id });
		expect(text).toMatch(/^[A-Za-z0-9_-]+$/);
		expect(JSON.parse(Buffer.from(text, 'base64').toString('utf8'))).toEqual(['2026-12-02T20:22:57.000001Z', id]);
	});

	// Hostile or stale input: each must come back null (a 400 naming the field), never reach SQL.
	const b64 = (text: string) => Buffer.from(JSON.stringify(text.split('|')), 'utf8').toString('base64url');
	it.each([
		['empty', ''],
		['not base64url', 'abc+/='],
		['not JSON', Buffer.from('2026-12-02T20:22:57.123456Z|x', 'utf8').toString('base64url')],
		['no separator', b64('2026-12-02T20:22:57.123456Z')],
		['three parts', b64(`2026-12-02T20:22:57.123456Z|${id}|x`)],
		['milliseconds only', b64(`2026-12-02T20:22:57.123Z|${id}`)],
		['February 31', b64(`2026-02-31T10:00:00.000000Z|${id}`)],
		['hour 25', b64(`2026-02-03T25:00:00.000000Z|${id}`)],
		['not a uuid', b64('2026-12-02T20:22:57.123456Z|1; drop table build')],
		['upper-case uuid', b64(`2026-12-02T20:22:57.123456Z|${id.toUpperCase()}`)],
		['far too long', 'A'.repeat(500)]
	])('refuses %s', (_, text) => {
		expect(decodeCursor(text)).toBeNull();
	});

	it('names the field it was read from', () => {
		expect(cursorParam('nope', 'photos')).toEqual({ ok: false, refusal: { field: 'photos', message: expect.any(String) } });
		expect(cursorParam(null)).toEqual({ ok: true });
		expect(cursorParam('')).toEqual({ ok: true });
	});
});

describe('pageOf', () => {
	const rows = (n: number) =>
		Array.from({ length: n }, (_, i) => ({ id: `${i}`, cursorAt: `2026-12-02T00:00:${String(59 - i).padStart(2, '0')}.000000Z`, v: i }));

	it('answers limit rows and a cursor at the last one when a row more came back', () => {
		const page = pageOf(rows(4), 3);
		expect(page.items).toEqual([
			{ id: '0', v: 0 },
			{ id: '1', v: 1 },
			{ id: '2', v: 2 }
		]);
		expect(decodeCursor(page.next!)).toBeNull(); // ids here are not uuids: the cursor is still what was given
		expect(JSON.parse(Buffer.from(page.next!, 'base64url').toString())).toEqual(['2026-12-02T00:00:57.000000Z', '2']);
	});

	it('has no next page when no extra row came back', () => {
		expect(pageOf(rows(3), 3).next).toBeNull();
		expect(pageOf([], 3)).toEqual({ items: [], next: null });
	});
});
