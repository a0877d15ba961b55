import { describe, expect, it } from 'vitest';
import { Recent } from './recent';

// Least-recently-used eviction (common practice for caches).
describe('recent files', () => {
	it('keeps at most its limit and lets the least recently used go first', () => {
		const r = new Recent<string>(2);
		r.set('a', 'A');
		r.set('b', 'B');
		expect(r.get('a')).toBe('A'); // a is now the most recent
		r.set('c', 'C');
		expect(r.size).toBe(2);
		expect(r.get('b')).toBeUndefined();
		expect(r.get('a')).toBe('A');
		expect(r.get('c')).toBe('C');
	});

	it('replaces a value set again under the same key, and forgets a deleted one', () => {
		const r = new Recent<number>(3);
		r.set('k', 1);
		r.set('k', 2);
		expect(r.size).toBe(1);
		expect(r.get('k')).toBe(2);
		r.delete('k');
		expect(r.get('k')).toBeUndefined();
	});
});
