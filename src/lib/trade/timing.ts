// The timing-light card: for each engine speed, the advance the ECU should give and where the
// mark must then appear on the hub's tape (degrees BTDC and distance from TDC along the tape).
import { mmPerDegree } from './tape';

export interface AdvancePoint {
	rpm: number;
	advanceDeg: number;
}

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
	fromTdcMm: number;
}

export function timingRows(points: AdvancePoint[], hub: { hubDiameterMm: number; paperThicknessMm: number }): CardRow[] {
	const k = mmPerDegree(hub);
	return [...points].sort((a, b) => a.rpm - b.rpm).map((p) => ({ ...p, fromTdcMm: Math.round(p.advanceDeg * k * 100) / 100 }));
}
