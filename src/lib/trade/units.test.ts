import { describe, expect, it } from 'vitest';
import { lengthIn, parseLength, parseLengthWithUnit, toMm } from './units';

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

// Expected values typed from arithmetic: 1 in = 25.4 mm exactly (international inch, 1959); 1 cm = 10 mm.
describe('lengths written with their unit', () => {
	it.each([
		['20 mm', 'in', 20],
		['20mm', 'in', 20],
		['3/4 in', 'mm', 19.05],
		['3/4"', 'mm', 19.05],
		['3/4\u201d', 'mm', 19.05], // a phone keyboard's curly closing quote
		['3/4\u2033', 'mm', 19.05], // the double prime sign
		["3/4''", 'mm', 19.05],
		['1 1/2in', 'mm', 38.1],
		['1 1/2 inches', 'mm', 38.1],
		['1 inch', 'mm', 25.4],
		['2 in.', 'mm', 50.8],
		['19.05mm', 'in', 19.05],
		['19,05 mm', 'in', 19.05],
		['2 cm', 'in', 20],
		['2 CM', 'mm', 20],
		['20', 'mm', 20],
		['0.75', 'in', 19.05],
		['3-1/2', 'in', 88.9]
	] as const)('%j on a %s form is %d mm', (text, units, mm) => {
		const read = parseLengthWithUnit(text, units);
		expect(read.ok).toBe(true);
		if (read.ok) expect(read.mm).toBeCloseTo(mm, 9);
	});

	it('converts into the form’s units: 19.05mm on an inch form is 0.75 in, 0.75 in on a mm form is 19.05 mm', () => {
		expect(lengthIn('19.05mm', 'in')).toBeCloseTo(0.75, 12);
		expect(lengthIn('0.75 in', 'mm')).toBeCloseTo(19.05, 12);
		expect(lengthIn('20mm', 'in')).toBeCloseTo(20 / 25.4, 12);
	});

	it('says which unit was written, or none', () => {
		expect(parseLengthWithUnit('3/4"', 'mm')).toMatchObject({ unit: 'in' });
		expect(parseLengthWithUnit('3/4', 'mm')).toMatchObject({ unit: null });
	});

	it.each([
		['mm 20', 'units go after the number'],
		['in 3/4', 'units go after the number'],
		['" 3/4', 'units go after the number'],
		['abc', 'not a number'],
		['', 'not a number'],
		['mm', 'not a number'],
		['x20', 'not a number'],
		['20 mm 5', 'not a number'],
		['1 2 mm', 'not a number'],
		['20 furlongs', 'unknown unit: use mm or in'],
		['20 m', 'unknown unit: use mm or in'],
		['20ft', 'unknown unit: use mm or in'],
		['3/0 in', 'a fraction over 0 is no number']
	])('refuses %j: %s', (text, why) => expect(parseLengthWithUnit(text, 'mm')).toEqual({ ok: false, why }));
});
