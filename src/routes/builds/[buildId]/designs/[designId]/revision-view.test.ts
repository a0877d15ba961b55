import { describe, expect, it } from 'vitest';
import { historyHref } from './revision-view';

describe('history page addresses', () => {
	it('leaves the defaults out', () => {
		expect(historyHref('/builds/x/designs/y', { q: '', cursor: null, a: null, b: null })).toBe('/builds/x/designs/y');
	});

	it('keeps search, page and the compared pair, escaped as a query (WHATWG URL form encoding)', () => {
		const href = historyHref('/d', { q: 'bore 25 & keyway', cursor: 'WyI1MCJd', a: 3, b: 4812 });
		const url = new URL(href, 'http://x');
		expect(url.searchParams.get('q')).toBe('bore 25 & keyway');
		expect(url.searchParams.get('cursor')).toBe('WyI1MCJd');
		expect([url.searchParams.get('a'), url.searchParams.get('b')]).toEqual(['3', '4812']);
	});
});
