// The timing-light card: for each engine speed, the advance the ECU should give and where the
// mark must then appear on the hub's tape (degrees BTDC, distance from TDC along the tape and on
// which side of it, as hub.ts places BTDC).
import { tapeOffsetDeg, type Rotation } from './hub';
import { mmPerDegree } from './tape';

export interface AdvancePoint {
	rpm: number;
	advanceDeg: number;
}

/**
 * What a timing-light card takes: engine speeds from a slow idle to past any rev limit, advance
 * from a little after TDC (some idles are set there) to more than any spark-ignition engine runs,
 * and a table short enough to print on one card (from memory, generous on purpose).
 */
export const curveLimits = { rpmMin: 100, rpmMax: 30000, advanceMinDeg: -10, advanceMaxDeg: 60, maxPoints: 20 } as const;

/**
 * A starting table to edit, not a recommendation: every engine, fuel and compression wants its
 * own curve. Shaped like a mild air-cooled single's (from memory).
 */
export const exampleCurve: AdvancePoint[] = [
	{ rpm: 1200, advanceDeg: 10 },
	{ rpm: 2000, advanceDeg: 14 },
	{ rpm: 3000, advanceDeg: 20 },
	{ rpm: 4000, advanceDeg: 26 },
	{ rpm: 5000, advanceDeg: 30 },
	{ rpm: 6000, advanceDeg: 32 }
];

export interface CardRow extends AdvancePoint {
	/** Distance along the tape from its TDC line, mm, never negative. */
	fromTdcMm: number;
	/** The side of the TDC line, the tape read upright; null at TDC. */
	side: 'left' | 'right' | null;
}

export function timingRows(
	points: AdvancePoint[],
	hub: { hubDiameterMm: number; paperThicknessMm: number; rotation: Rotation }
): CardRow[] {
	const k = mmPerDegree(hub);
	return [...points]
		.sort((a, b) => a.rpm - b.rpm)
		.map((p) => {
			const offset = tapeOffsetDeg(hub.rotation, -p.advanceDeg);
			return { ...p, fromTdcMm: Math.round(Math.abs(offset) * k * 100) / 100, side: offset === 0 ? null : offset > 0 ? 'right' : 'left' };
		});
}
