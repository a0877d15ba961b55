import { describe, expect, it } from 'vitest';
import { spreadFromRim, tdcFromMarks } from './tdc';

describe('TDC from two piston-stop marks', () => {
	// Seed document (fact of the trade): two marks 29° apart put TDC 14.5° from each.
	it('29° apart: TDC 14.5° from each mark', () => {
		expect(tdcFromMarks(-10, 19, 'signed')).toEqual({ ok: true, result: { tdcDeg: 4.5, spreadDeg: 29, halfSpreadDeg: 14.5 } });
	});

	it('wraps round 0 on a 0–360 scale (350 and 20: TDC at 5)', () => {
		expect(tdcFromMarks(350, 20, 'full')).toMatchObject({ ok: true, result: { tdcDeg: 5, spreadDeg: 30 } });
		expect(tdcFromMarks(20, 350, 'full')).toMatchObject({ ok: true, result: { tdcDeg: 5, spreadDeg: 30 } });
	});

	it('wraps round ±180 on a signed scale', () => {
		expect(tdcFromMarks(170, -170, 'signed')).toMatchObject({ ok: true, result: { tdcDeg: 180, spreadDeg: 20 } });
	});

	it('takes the longer arc when told', () => {
		expect(tdcFromMarks(-10, 19, 'signed', 'longer')).toMatchObject({ ok: true, result: { tdcDeg: -175.5, spreadDeg: 331 } });
	});

	it('refuses a pair that cannot be a piston-stop pair', () => {
		expect(tdcFromMarks(12, 12, 'signed')).toMatchObject({ ok: false, field: 'b' });
		expect(tdcFromMarks(400, 12, 'full')).toMatchObject({ ok: false, field: 'a' });
	});

	// Arc length s = r·θ: 29° on a 150 mm rim is 150·π·29/360 = 37.96 mm.
	it('converts a spread measured along the rim', () => {
		const s = (150 * Math.PI * 29) / 360;
		expect(spreadFromRim(s, 150)).toMatchObject({ spreadDeg: 29, halfSpreadDeg: 14.5 });
		expect(spreadFromRim(s, 150).fromEitherMarkMm).toBeCloseTo(s / 2, 6);
	});
});
