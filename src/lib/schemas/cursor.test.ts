import { describe, expect, it } from 'vitest';
import { decodeCursor, encodeCursor } from './cursor';

describe('paging cursor', () => {
	it('reads back what it wrote, names in any script included', () => {
		const parts = ['name', 'asc', 'Zündapp “KS 601” 🏍', '0b6f2c1e-8a0e-4c55-9f55-6f0f1b2a3c4d'];
		const cursor = encodeCursor(parts);
		// RFC 4648 §5: the URL- and filename-safe alphabet, padding left off.
		expect(cursor).toMatch(/^[A-Za-z0-9_-]+$/);
		expect(decodeCursor(cursor, 4)).toEqual(parts);
	});

	it('matches base64url as Node writes it (RFC 4648 §5)', () => {
		const parts = ['updated', 'desc', '2026-12-02T20:00:00.123456Z', 'x'];
		expect(encodeCursor(parts)).toBe(Buffer.from(JSON.stringify(parts)).toString('base64url'));
	});

	it('refuses what it did not write', () => {
		expect(decodeCursor('', 2)).toBeNull();
		expect(decodeCursor('not a cursor!', 2)).toBeNull();
		expect(decodeCursor(Buffer.from('{"a":1}').toString('base64url'), 2)).toBeNull();
		expect(decodeCursor(Buffer.from('[1,2]').toString('base64url'), 2)).toBeNull();
		expect(decodeCursor(Buffer.from('["a"]').toString('base64url'), 2)).toBeNull();
		expect(decodeCursor(Buffer.from([0xff, 0xfe]).toString('base64url'), 2)).toBeNull();
		expect(decodeCursor(encodeCursor(['a', 'b']), 2)).toEqual(['a', 'b']);
	});
});
