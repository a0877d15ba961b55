import { describe, expect, it } from 'vitest';
import { ansiSlot, dinSlot, fraction, woodruffSlot } from './keys';

// The rows are from memory of the standards' tables (see keys.ts); these checks pin them.
describe('hub keyways', () => {
	it('DIN 6885-1: a 20 mm shaft takes a 6 x 6 key, hub depth t2 2.8 mm', () => {
		expect(dinSlot(20)).toMatchObject({ widthMm: 6, depthMm: 2.8 });
	});

	it('DIN 6885-1: range ends belong to the lower row ("over 17 up to 22")', () => {
		expect(dinSlot(22)?.widthMm).toBe(6);
		expect(dinSlot(22.01)?.widthMm).toBe(8);
		expect(dinSlot(5)).toBeUndefined();
	});

	it('ANSI B17.1: a 1 in shaft takes a 1/4 in square key, hub keyseat 1/8 in deep', () => {
		const slot = ansiSlot(1)!;
		expect(slot.widthMm).toBeCloseTo(6.35, 9);
		expect(slot.depthMm).toBeCloseTo(3.175, 9);
	});

	it('ANSI B17.2 numbering: No. 404 is 1/8 x 1/2 in; No. 1210 is 3/8 x 1 1/4 in', () => {
		expect(woodruffSlot('404')!.widthMm).toBeCloseTo(3.175, 9);
		expect(woodruffSlot('404')!.source).toContain('1/8 x 1/2 in');
		expect(woodruffSlot('1210')!.source).toContain('3/8 x 1 1/4 in');
		expect(woodruffSlot('12')).toBeUndefined();
		expect(woodruffSlot('2002')).toBeUndefined(); // wider than it is round: no such key
	});

	it('writes inch fractions the way a machinist reads them', () => {
		expect(fraction(0.1875)).toBe('3/16');
		expect(fraction(1.25)).toBe('1 1/4');
		expect(fraction(2)).toBe('2');
	});
});
