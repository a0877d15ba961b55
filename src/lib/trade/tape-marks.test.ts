// Where the tape's ends and extra marks sit, against the turning-engine model (tests/support/
// turning-engine.ts: rigid rotation of the hub past a fixed pointer, written from geometry alone).
import { describe, expect, it } from 'vitest';
import { sideOf, underPointer } from '../../../tests/support/turning-engine';
import { tapeEnds, tdcSideOf } from './hub';
import { tapeMarks, type TapeSpec } from './tape';

describe('the words each end of a tape carries', () => {
	for (const rotation of ['cw', 'ccw'] as const) {
		it(`${rotation}: the end the engine brings under the pointer before TDC says BTDC`, () => {
			const engine = { hubDiameterMm: 100, paperThicknessMm: 0.1, rotation };
			const before = sideOf(underPointer(engine, -10));
			const after = sideOf(underPointer(engine, 10));
			expect(tapeEnds(rotation)).toEqual({ [before]: 'BTDC', [after]: 'ATDC' });
		});
	}
	it('names the side of TDC by the sign of degrees ATDC (hub.ts: BTDC negative), none at TDC', () => {
		expect([tdcSideOf(-3), tdcSideOf(3), tdcSideOf(0)]).toEqual(['BTDC', 'ATDC', null]);
	});
});

describe('a tape’s extra marks', () => {
	const spec: TapeSpec = {
		hubDiameterMm: 150,
		paperThicknessMm: 0.1,
		rotation: 'cw',
		windowDeg: 60,
		tickDeg: 1,
		midEveryDeg: 5,
		labelEveryDeg: 10,
		timingMarks: [{ label: 'full', btdcDeg: 32 }],
		otherTdc: [
			{ label: 'cyl 2', atdcDeg: 320 },
			{ label: 'cyl 3', atdcDeg: 90 }
		]
	};
	it('puts each where the crank stands when it reaches the pointer, and says whether the window holds it', () => {
		// By hand: 32° BTDC is −32° ATDC; cylinder 2's TDC 320° after cylinder 1's comes 40° before
		// it (320 − 360); 90° ATDC lies past a ±60° window.
		expect(tapeMarks(spec)).toEqual([
			{ kind: 'timing', label: 'full', atdcDeg: -32, onTape: true },
			{ kind: 'tdc', label: 'cyl 2', atdcDeg: -40, onTape: true },
			{ kind: 'tdc', label: 'cyl 3', atdcDeg: 90, onTape: false }
		]);
	});
});
