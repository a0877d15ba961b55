// The degree wheel: the tape's scale laid round a printed disc stuck on the timing hub's face, 0 at
// TDC, each crank angle where hub.ts puts it on a face (BTDC ahead of 0 in the sense of rotation,
// the side that reaches the pointer first). The disc is the hub's diameter, with a centre hole cut
// to the shaft; it turns once per crank turn.
import { faceClockwiseDeg, type Rotation } from './hub';
import { papers, type Paper } from './paper';
import { ticks, type TapeSpec, type Tick } from './tape';

/** How a disc sits on paper (mm): a header above it, the calibration bars below. */
export const discPage = { marginMm: 12, headerMm: 40, footerMm: 30 } as const;

/**
 * The ring of marks and words inside the disc's edge, mm: major ticks 7 mm long (upright numbers at 3 and 9 o'clock reach 2.2 mm each way along the ray), the number under
 * them, the side word (BTDC / ATDC) under the number. The centre hole must leave that ring whole.
 */
export const discRing = { majorMm: 7, midMm: 4.5, minorMm: 2.5, numberFromEdgeMm: 10.5, sideFromEdgeMm: 16, widthMm: 20 } as const;

/** The smallest disc that leaves room for the ring round a hole, mm. */
export const minDiscMm = 50;

/** The largest disc a paper holds, mm: its width or its height less header and footer, whichever is less. */
export function maxDiscMm(paper: Paper): number {
	const { widthMm, heightMm } = papers[paper];
	const p = discPage;
	return Math.floor(Math.min(widthMm - 2 * p.marginMm, heightMm - 2 * p.marginMm - p.headerMm - p.footerMm));
}

/** The largest centre hole a disc of this diameter takes, mm. */
export const maxShaftMm = (discMm: number) => discMm - 2 * discRing.widthMm;

export interface DiscMark extends Tick {
	/** Degrees clockwise from 0, seen from the wheel side (the printed face). */
	clockwiseDeg: number;
}

/** The scale's marks round the disc: the tape's ticks, each at its angle on the face. */
export const discMarks = (spec: TapeSpec): DiscMark[] =>
	ticks(spec).map((t) => ({ ...t, clockwiseDeg: faceClockwiseDeg(spec.rotation, t.atdcDeg) }));

/** How to fit the disc, in words (the PDF says it). */
export const discFittingWords =
	'Cut the disc out and its centre hole, and stick it to the face of the timing hub, printed side out, 0 under the pointer with the piston at TDC.';

/** Which way round from 0 the BTDC numbers sit on the face, and the turning, in words a person checks at the engine. */
export function discSideWords(rotation: Rotation): string {
	const btdc = faceClockwiseDeg(rotation, -1) > 0 ? 'clockwise' : 'counter-clockwise';
	const turning = rotation === 'cw' ? 'clockwise' : 'counter-clockwise';
	return `Crank turning ${turning} seen from the wheel side: the disc turns ${turning} past the pointer, so BTDC numbers sit ${btdc} of 0 and reach the pointer first.`;
}
