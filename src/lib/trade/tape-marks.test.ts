// Where the tape's ends and extra marks sit, against the turning-engine model (tests/support/
// turning-engine.ts: rigid rotation of the hub past a fixed pointer, written from geometry alone).
import { describe, expect, it } from 'vitest';
import { sideOf, underPointer } from '../../../tests/support/turning-engine';
import { tapeEnds, tdcSideOf } from './hub';
import { outsideNote, tapeMarks, tapeX, type TapeSpec } from './tape';

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
		// it (320 − 360), its spec timing 32° before that, at −72°; cylinder 3's TDC at 90° ATDC lies
		// past a ±60° window, its timing at 90 − 32 = 58° ATDC inside it.
		expect(tapeMarks(spec).map(({ kind, label, atdcDeg, onTape, cylinder }) => ({ kind, label, atdcDeg, onTape, cylinder }))).toEqual([
			{ kind: 'timing', label: 'full', atdcDeg: -32, onTape: true, cylinder: 1 },
			{ kind: 'tdc', label: 'cyl 2', atdcDeg: -40, onTape: true, cylinder: 2 },
			{ kind: 'timing', label: 'cyl 2: full 32° BTDC', atdcDeg: -72, onTape: false, cylinder: 2 },
			{ kind: 'tdc', label: 'cyl 3', atdcDeg: 90, onTape: false, cylinder: 3 },
			{ kind: 'timing', label: 'cyl 3: full 32° BTDC', atdcDeg: 58, onTape: true, cylinder: 3 }
		]);
	});

	it('says where a mark left off the tape is and which window it misses, instead of dropping it', () => {
		const off = tapeMarks(spec).filter((m) => !m.onTape);
		// Typed from the spec above: cylinder 3's TDC 90° after cylinder 1's, a ±60° window.
		expect(off.map((m) => outsideNote(spec, m))).toEqual([
			"cyl 2: full 32° BTDC at 288° after cylinder 1's TDC, 72° BTDC on this scale: outside this tape's 60° BTDC to 60° ATDC window",
			"cyl 3 TDC at 90° after cylinder 1's TDC, 90° ATDC on this scale: outside this tape's 60° BTDC to 60° ATDC window"
		]);
	});
});

describe('a twin’s marks against the turning engine', () => {
	// A 270° twin (cylinder 2 fires 270 crank degrees after cylinder 1, common practice for a
	// 270° crank), spec timing 10° BTDC on both cylinders, a full-circle tape on a 150 mm hub.
	for (const rotation of ['cw', 'ccw'] as const) {
		it(`${rotation}: each cylinder's TDC and timing sit where the engine brings them under the pointer`, () => {
			const twin: TapeSpec = {
				hubDiameterMm: 150,
				paperThicknessMm: 0.1,
				rotation,
				windowDeg: 180,
				tickDeg: 1,
				midEveryDeg: 5,
				labelEveryDeg: 10,
				timingMarks: [{ label: 'base', btdcDeg: 10 }],
				otherTdc: [{ label: 'cyl 2', atdcDeg: 270 }]
			};
			const engine = { hubDiameterMm: 150, paperThicknessMm: 0.1, rotation };
			const zero = tapeX(twin, 0);
			// Crank angles after cylinder 1's TDC at which each mark is under the pointer, typed from the engine:
			// cylinder 1 fires 10° before 0; cylinder 2's TDC is at 270°, its timing 10° before, at 260°.
			const crankAt = { base: -10, 'cyl 2': 270, 'cyl 2: base 10° BTDC': 260 } as Record<string, number>;
			for (const m of tapeMarks(twin)) {
				expect(m.onTape).toBe(true);
				expect(tapeX(twin, m.atdcDeg) - zero, m.label).toBeCloseTo(underPointer(engine, crankAt[m.label]!), 6);
			}
		});
	}
});
