import { describe, expect, it } from 'vitest';
import { refusals } from './checks';
import { labelShape, missingCharacters } from './label';
import { exampleSpec } from '$support/example-spec';
import { drawWheel, placeLabel } from './wheel';

const range = (lo: number, hi: number) => Array.from({ length: hi - lo + 1 }, (_, i) => String.fromCodePoint(lo + i)).join('');

describe('the etched label', () => {
	it('has outlines for printable ASCII and Latin-1 (U+0020–U+007E, U+00A0–U+00FF)', () => {
		expect(missingCharacters(range(0x20, 0x7e) + range(0xa0, 0xff))).toEqual([]);
	});

	it('names each character the font lacks once, in order', () => {
		expect(missingCharacters('a日b本日')).toEqual(['日', '本']);
		const [r] = refusals(exampleSpec({ label: 'crank ☃' }), 'mm');
		expect(r).toEqual({
			field: 'label',
			message: 'label: the etching font has no “☃” (U+2603); use letters, digits and signs of Latin scripts'
		});
	});

	it('a space is as wide as the font says, and letters do not overlap: "II" is two I widths and a gap', () => {
		const one = labelShape('I')!;
		const two = labelShape('II')!;
		expect(two.halfWidth).toBeGreaterThan(2 * one.halfWidth);
		expect(labelShape(' ')).toBeNull();
	});

	it('sits in the web, clear of the bore and tooth roots by 1 mm, cap height 4 mm on a roomy wheel', () => {
		const spec = exampleSpec({ label: 'crank 36-1' });
		const l = drawWheel(spec).label!;
		expect(l.heightMm).toBe(4);
		for (const c of l.corners) {
			expect(Math.hypot(c.x, c.y)).toBeLessThanOrEqual(45 - 1);
			expect(Math.hypot(c.x, c.y)).toBeGreaterThanOrEqual(10 + 1);
		}
	});

	it('is refused, not dropped, when it has no room', () => {
		const spec = exampleSpec({ odMm: 30, depthMm: 3, boreMm: 10, label: 'a label far too long for this' });
		expect(placeLabel(spec)).toBeNull();
		expect(refusals(spec, 'mm').map((r) => r.field)).toContain('label');
	});
});
