import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { contourPath, pathNumber } from './svg';
import { exampleSpec } from '$support/example-spec';
import { cutContours, drawWheel } from './wheel';

describe('numbers in path data', () => {
	// The reference is JavaScript's own number-to-text (ECMA-262 Number::toString, the shortest
	// decimal that reads back as the same double) of the value rounded to four decimals.
	const reference = (v: number) => String(Math.round(v * 1e4) / 1e4 || 0);

	it('read as ECMAScript writes the value rounded to four decimals, over the whole drawing range', () => {
		fc.assert(
			fc.property(fc.double({ min: -1e7, max: 1e7, noNaN: true }), (v) => pathNumber(v) === reference(v)),
			{ numRuns: 20_000 }
		);
		// On the ten-thousandths grid and half-way between its points, where rounding is decided.
		fc.assert(
			fc.property(
				fc.integer({ min: -2e8, max: 2e8 }),
				(q) => pathNumber(q / 1e4) === reference(q / 1e4) && pathNumber((q + 0.5) / 1e4) === reference((q + 0.5) / 1e4)
			)
		);
	});

	it('round half up, drop trailing zeros, never write -0 or an exponent (worked by hand)', () => {
		expect(pathNumber(0.00005)).toBe('0.0001');
		expect(pathNumber(-0.00005)).toBe('0');
		expect(pathNumber(-0.00004)).toBe('0');
		expect(pathNumber(-0)).toBe('0');
		expect(pathNumber(1e-7)).toBe('0');
		expect(pathNumber(12.5)).toBe('12.5');
		expect(pathNumber(-3.14159)).toBe('-3.1416');
		expect(pathNumber(60.00004)).toBe('60');
		expect(pathNumber(0.0203)).toBe('0.0203');
		expect(pathNumber(1999.99995)).toBe('2000');
	});
});

describe('the drawing of a spec', () => {
	it('is made once per spec object and equals a fresh one drawn from a copy', () => {
		const spec = exampleSpec({ tipRadiusMm: 0.4, rootRadiusMm: 0.6, label: 'crank' });
		const first = drawWheel(spec);
		expect(drawWheel(spec)).toBe(first);
		const again = drawWheel({ ...spec });
		expect(again).not.toBe(first);
		expect(again).toEqual(first);
		expect(cutContours(again).map((c) => contourPath(c))).toEqual(cutContours(first).map((c) => contourPath(c)));
	});
});
