import { describe, expect, it } from 'vitest';
import { parseLength, toMm } from './units';

describe('lengths as people write them', () => {
	it.each([
		['3 1/2', 3.5],
		['3-1/2', 3.5],
		['7/8', 0.875],
		['76.2', 76.2],
		['1,5', 1.5],
		[' 12 ', 12]
	])('%s -> %d', (text, value) => expect(parseLength(text)).toBe(value));

	it.each(['', 'abc', '3/0', '1 2', '--1'])('refuses %j', (text) => expect(parseLength(text)).toBeNaN());

	it('converts inches exactly (1 in = 25.4 mm by definition)', () => {
		expect(toMm(3, 'in')).toBeCloseTo(76.2, 12);
	});
});
