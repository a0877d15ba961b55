import { describe, expect, it } from 'vitest';
import { gapSpanDeg, gapsOf, pitchDeg, teethOf, type Pattern } from './pattern';

describe('tooth patterns', () => {
	// Seed document (fact of the trade): a 24-2 wheel has a 15° pitch and 22 teeth.
	it('24-2: 15° pitch, 22 teeth', () => {
		const p: Pattern = { kind: 'missing', teeth: 24, missing: 2 };
		expect(pitchDeg(24)).toBe(15);
		expect(teethOf(p, 0.5)).toHaveLength(22);
	});

	// Common practice: 36-1 -> 10°, 60-2 -> 6°.
	it.each([
		[36, 1, 10, 35],
		[60, 2, 6, 58],
		[12, 1, 30, 11]
	])('%i-%i: pitch %i°, %i teeth', (n, m, pitch, present) => {
		const teeth = teethOf({ kind: 'missing', teeth: n, missing: m }, 0.5);
		expect(pitchDeg(n)).toBe(pitch);
		expect(teeth).toHaveLength(present);
		// Tooth k after the gap leads at k·p (geometry).
		teeth.forEach((t, k) => expect(t.leadDeg).toBeCloseTo(k * pitch, 9));
	});

	it('the gap spans (M + 1)·p minus one tooth width', () => {
		const duty = 0.4;
		const teeth = teethOf({ kind: 'missing', teeth: 60, missing: 2 }, duty);
		const last = teeth.at(-1)!;
		expect(360 - last.trailDeg).toBeCloseTo(3 * 6 - duty * 6, 9);
	});

	it('two gaps 180° apart (36-1-1 as a custom pattern)', () => {
		const p: Pattern = { kind: 'custom', teeth: 36, missingPositions: [17, 35] };
		expect(teethOf(p, 0.5)).toHaveLength(34);
		expect(gapsOf(p)).toEqual([
			{ first: 17, count: 1 },
			{ first: 35, count: 1 }
		]);
	});

	it('cam-sync wheels: one tooth; N+1 with the extra tooth half-way between two', () => {
		expect(teethOf({ kind: 'single', teeth: 36 }, 0.5)).toEqual([{ position: 0, leadDeg: 0, trailDeg: 5 }]);
		const plusOne = teethOf({ kind: 'extra', teeth: 4, extraAfter: 0 }, 0.25);
		expect(plusOne.map((t) => t.leadDeg)).toEqual([0, 45, 90, 180, 270]);
	});

	// Worked by hand from design.md "Trade math" (geometry): the gap is (M + 1)·p less one tooth width d·p.
	it.each([
		// 36-1, duty 0.5: p = 10°, (1 + 1 − 0.5)·10 = 15°.
		[36, 1, 0.5, 15],
		// 60-2, duty 0.5: p = 6°, (2 + 1 − 0.5)·6 = 15°.
		[60, 2, 0.5, 15],
		// 12-3, duty 0.3: p = 30°, (3 + 1 − 0.3)·30 = 111°.
		[12, 3, 0.3, 111],
		// 24-1, duty 0.7: p = 15°, (1 + 1 − 0.7)·15 = 19.5°.
		[24, 1, 0.7, 19.5]
	])('the gap of %i teeth, %i missing, duty %f spans %f°', (n, m, duty, span) => {
		expect(gapSpanDeg(n, m, duty)).toBeCloseTo(span, 9);
	});

	it('agrees with the drawn teeth: the gap is the space from the last tooth back round to the first', () => {
		const teeth = teethOf({ kind: 'missing', teeth: 36, missing: 2 }, 0.45);
		expect(gapSpanDeg(36, 2, 0.45)).toBeCloseTo(360 - teeth.at(-1)!.trailDeg, 9);
	});
});
