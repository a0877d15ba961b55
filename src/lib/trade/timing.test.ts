// The timing-light rows against the turning-engine model (tests/support/turning-engine.ts: rigid
// rotation of the hub past a fixed pointer): the distance and side of TDC at which the pointer
// stands when the light freezes the crank `advance` degrees before TDC.
import { describe, expect, it } from 'vitest';
import { sideOf, underPointer } from '../../../tests/support/turning-engine';
import { timingRows } from './timing';

describe('timing-light rows', () => {
	for (const rotation of ['cw', 'ccw'] as const) {
		it(`${rotation}: distance and side from the turning engine, sorted by speed`, () => {
			const hub = { hubDiameterMm: 150, paperThicknessMm: 0.1, rotation };
			const rows = timingRows(
				[
					{ rpm: 3000, advanceDeg: 20 },
					{ rpm: 800, advanceDeg: -5 },
					{ rpm: 900, advanceDeg: 0 }
				],
				hub
			);
			expect(rows.map((r) => r.rpm)).toEqual([800, 900, 3000]);
			for (const r of rows) {
				const want = underPointer(hub, -r.advanceDeg);
				expect(Math.abs(r.fromTdcMm - Math.abs(want))).toBeLessThanOrEqual(0.005 + 1e-9);
				expect(r.side ?? 'at 0').toBe(sideOf(want));
			}
		});
	}

	it('20° BTDC on a 150 mm hub with 0.1 mm paper is 26.20 mm along the tape (20·π·150.1/360)', () => {
		expect(timingRows([{ rpm: 3000, advanceDeg: 20 }], { hubDiameterMm: 150, paperThicknessMm: 0.1, rotation: 'cw' })[0]!.fromTdcMm).toBe(
			26.2
		);
	});
});
