import { describe, expect, it } from 'vitest';
import { underPointer } from '../../../tests/support/turning-engine';
import { mmPerDegree, tapeX, ticks, tile, type TapeSpec } from './tape';

const spec = (over: Partial<TapeSpec> = {}): TapeSpec => ({
	hubDiameterMm: 76.2,
	paperThicknessMm: 0.1,
	rotation: 'cw',
	windowDeg: 45,
	tickDeg: 1,
	midEveryDeg: 5,
	labelEveryDeg: 10,
	timingMarks: [],
	otherTdc: [],
	...over
});

describe('degree tape scale', () => {
	// Arc length: one degree is π·(D + t)/360 along the hub (paper on its mid-thickness).
	it('3 in hub, 0.1 mm paper: 0.66584 mm per degree', () => {
		expect(mmPerDegree(spec())).toBeCloseTo((Math.PI * 76.3) / 360, 12);
	});

	// The turning-engine model (tests/support/turning-engine.ts, rigid rotation of the hub past a
	// fixed pointer) says which tape point is under the pointer at each crank angle; tapeX must put
	// that crank angle's tick there, measured from the tick at TDC, for both rotations and wherever
	// the pointer sits round the rim.
	it('puts each crank angle where the turning engine brings it under the pointer', () => {
		for (const rotation of ['cw', 'ccw'] as const) {
			for (const hubDiameterMm of [40, 76.2, 300]) {
				const s = spec({ rotation, hubDiameterMm, windowDeg: 180 });
				for (const pointerAtDeg of [90, 0, 210]) {
					for (const crank of [-170, -45, -10, -1, 0, 1, 10, 45, 170]) {
						const expected = underPointer({ hubDiameterMm, paperThicknessMm: 0.1, rotation, pointerAtDeg }, crank);
						expect(tapeX(s, crank) - tapeX(s, 0)).toBeCloseTo(expected, 9);
					}
				}
			}
		}
	});

	it('10° BTDC is right of 0 on a clockwise crank, left on an anticlockwise one', () => {
		// Worked by hand on the model: clockwise seen from the wheel side, the top of the hub moves to
		// the right; 10° before TDC the tape's 0 is still 10° short of the pointer, to its left.
		expect(underPointer({ hubDiameterMm: 76.2, paperThicknessMm: 0.1, rotation: 'cw' }, -10)).toBeCloseTo(10 * mmPerDegree(spec()), 9);
		expect(tapeX(spec(), -10)).toBeGreaterThan(tapeX(spec(), 0));
		expect(tapeX(spec({ rotation: 'ccw' }), -10)).toBeLessThan(tapeX(spec({ rotation: 'ccw' }), 0));
	});

	it('ticks every degree, longer every 5, labelled every 10, zero at TDC', () => {
		const t = ticks(spec());
		expect(t).toHaveLength(91);
		expect(t.filter((x) => x.size === 'major').map((x) => x.label)).toEqual(['40', '30', '20', '10', '0', '10', '20', '30', '40']);
		expect(t.filter((x) => x.size === 'mid')).toHaveLength(10); // ±5, ±15, ±25, ±35, ±45
	});

	it('a full circle draws 180° once', () => {
		expect(ticks(spec({ windowDeg: 180 }))).toHaveLength(360);
	});
});

describe('tiling a long tape', () => {
	it('overlaps each strip with the one before, and numbers pages', () => {
		const strips = tile(1000, 190, 10, 4);
		expect(strips[0]).toEqual({ index: 1, page: 1, fromMm: 0, toMm: 190 });
		expect(strips[1]!.fromMm).toBe(180);
		expect(strips.at(-1)!.toMm).toBe(1000);
		expect(strips.map((s) => s.page)).toEqual([1, 1, 1, 1, 2, 2]);
	});

	it('a short tape is one strip', () => {
		expect(tile(120, 190, 10, 4)).toEqual([{ index: 1, page: 1, fromMm: 0, toMm: 120 }]);
	});
});
