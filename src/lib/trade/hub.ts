// How a degree scale sits on the engine: the one physical convention every output that places
// BTDC or ATDC follows (tape, degree wheel, timing-light card, phasing drawing, build sheet).
//
// The scale turns with the crank past a fixed pointer. With the crank θ before TDC, the scale's 0
// has not reached the pointer yet, so the point under the pointer lies θ ahead of 0 in the sense
// of rotation (rigid rotation: hub point α sits at α + φ(t); the pointer at 0; φ = −θ before TDC
// gives α = θ). BTDC numbers therefore lie ahead of 0, on the side that reaches the pointer first.
//
// A tape on the rim of the timing hub is fitted with its top edge (the printed header side)
// toward the engine and its bottom edge toward the wheel face, where the person stands. Read
// upright from there, at any pointer position round the hub, the tape then travels toward its own
// right for a crank turning clockwise seen from the wheel side, toward its left for anticlockwise
// (the tape's right = up × outward normal = −axis × radius, the velocity of a clockwise rim).

/** Crank rotation as seen from the wheel side of the engine. */
export type Rotation = 'cw' | 'ccw';

/** The way the tape, as printed and read upright, moves past the pointer: +1 toward its right. */
export const tapeTravel = (rotation: Rotation): 1 | -1 => (rotation === 'cw' ? 1 : -1);

/** The side of 0 on which a printed tape carries its BTDC numbers. */
export const btdcSide = (rotation: Rotation): 'right' | 'left' => (tapeTravel(rotation) === 1 ? 'right' : 'left');

/** The side of 0 on which a printed tape carries its ATDC numbers. */
export const atdcSide = (rotation: Rotation): 'right' | 'left' => (btdcSide(rotation) === 'right' ? 'left' : 'right');

/**
 * Where a crank angle sits on the tape, in degrees from 0 toward the tape's right (read upright).
 * Angles are degrees ATDC, BTDC negative.
 */
export const tapeOffsetDeg = (rotation: Rotation, atdcDeg: number): number => -tapeTravel(rotation) * atdcDeg;

/**
 * Where a crank angle sits on a round scale on the hub face, seen from the wheel side: degrees
 * clockwise from 0. BTDC lies ahead of 0 in the sense of rotation.
 */
export const faceClockwiseDeg = (rotation: Rotation, atdcDeg: number): number => -tapeTravel(rotation) * atdcDeg;

/** The direction of travel in words, for prints and answers a person checks against the engine. */
export function travelWords(rotation: Rotation): string {
	const toward = btdcSide(rotation);
	return `Crank turning ${rotation === 'cw' ? 'clockwise' : 'counter-clockwise'} seen from the wheel side: the tape moves ${toward === 'right' ? 'left to right' : 'right to left'} past the pointer, so BTDC numbers sit to the ${toward} of 0 and reach the pointer first.`;
}

export type TdcSide = 'BTDC' | 'ATDC';

/** Which side of TDC a crank angle lies on (degrees ATDC, BTDC negative); null at TDC itself. */
export const tdcSideOf = (atdcDeg: number): TdcSide | null => (Math.abs(atdcDeg) < 1e-9 ? null : atdcDeg < 0 ? 'BTDC' : 'ATDC');

/** What each end of a printed tape, read upright, carries: the words the preview, the PDF and its diagram print. */
export const tapeEnds = (rotation: Rotation): { left: TdcSide; right: TdcSide } =>
	btdcSide(rotation) === 'left' ? { left: 'BTDC', right: 'ATDC' } : { left: 'ATDC', right: 'BTDC' };
