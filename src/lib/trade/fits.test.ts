import { describe, expect, it } from 'vitest';
import { boreFit } from './fits';

describe('the bore fit', () => {
	// ISO 286-1 IT7 (from memory, as every fits table reprints it): 18–30 mm 21 µm, 6–10 mm 15 µm, 30–50 mm 25 µm.
	it('is H7 with IT7 over the nominal size, by the size range "over … up to and including"', () => {
		expect(boreFit(20)).toMatchObject({ fit: 'H7', upperMm: 0.021, lowerMm: 0 });
		expect(boreFit(30)).toMatchObject({ upperMm: 0.021 });
		expect(boreFit(30.5)).toMatchObject({ upperMm: 0.025 });
		expect(boreFit(8)).toMatchObject({ upperMm: 0.015 });
	});
	it('has none for no bore or past the table', () => {
		expect(boreFit(0)).toBeNull();
		expect(boreFit(501)).toBeNull();
	});
});
