// Degree tapes: a strip wrapped round a timing hub that reads crank degrees, zero at TDC.
// Scale: arc length s = r·θ, so one degree is π·D/360 along the hub; the tape lies on its own
// mid-thickness, so D is the hub diameter plus the paper thickness t (about 0.1 mm for office
// paper, from memory).
import { tapeOffsetDeg, type Rotation } from './hub';
import { papers, type Paper } from './paper';

export interface TapeSpec {
	/** Hub diameter, mm (from a measured circumference C: D = C/π). */
	hubDiameterMm: number;
	paperThicknessMm: number;
	/** Crank rotation seen from the wheel side (hub.ts: how the tape sits on the engine). */
	rotation: Rotation;
	/** Degrees shown each side of TDC; 180 = the full circle. */
	windowDeg: number;
	/** Degrees between ticks; every `midEvery`-th tick is longer, every `labelEvery` degrees labelled. */
	tickDeg: number;
	midEveryDeg: number;
	labelEveryDeg: number;
	/** Extra marks: spec timings (degrees BTDC, positive) and other cylinders' TDC (degrees after TDC 1). */
	timingMarks: { label: string; btdcDeg: number }[];
	otherTdc: { label: string; atdcDeg: number }[];
}

export const mmPerDegree = (spec: Pick<TapeSpec, 'hubDiameterMm' | 'paperThicknessMm'>) =>
	(Math.PI * (spec.hubDiameterMm + spec.paperThicknessMm)) / 360;

export const diameterFromCircumference = (circumferenceMm: number) => circumferenceMm / Math.PI;

/**
 * Where a crank angle sits along the tape, mm from the tape's left end as printed and read
 * upright. Angles are degrees ATDC (BTDC negative); which side of 0 BTDC takes is hub.ts's.
 */
export function tapeX(spec: TapeSpec, atdcDeg: number): number {
	return (spec.windowDeg + tapeOffsetDeg(spec.rotation, atdcDeg)) * mmPerDegree(spec);
}

/** How to fit the printed tape on the engine, in words (the PDF, the page and the API say it). */
export const fittingWords =
	'Fit the tape on the rim of the timing hub, printed side out, its top edge (the header side of the print) toward the engine and its bottom edge toward the wheel face, so that it reads upright from where you stand at the wheel.';

export const tapeLengthMm = (spec: TapeSpec) => 2 * spec.windowDeg * mmPerDegree(spec);

export interface TapeMark {
	kind: 'timing' | 'tdc';
	label: string;
	/**
	 * Degrees ATDC of cylinder 1 in (−180, 180], BTDC negative: a spec timing lies before TDC, and
	 * another cylinder's TDC more than half a turn after cylinder 1's comes round before it.
	 */
	atdcDeg: number;
	/** Within the tape's window, so printed. */
	onTape: boolean;
	/** The cylinder the mark belongs to, 1 for the tape's own 0. */
	cylinder: number;
	/** Where the crank stands at the mark, degrees after cylinder 1's TDC as the cycle counts them, [0, 360). */
	cycleDeg: number;
}

/** Degrees into (−180, 180]: where a crank angle comes round on one turn of the hub. */
const onTurn = (deg: number) => {
	const d = (((deg % 360) + 360) % 360) as number;
	return d > 180 ? d - 360 : d;
};

/** A mark's name as printed beside it: another cylinder's TDC says TDC. */
export const markName = (m: Pick<TapeMark, 'kind' | 'label'>) =>
	m.kind === 'tdc' && !/\btdc\b/i.test(m.label) ? `${m.label} TDC` : m.label;

/**
 * The extra marks of a tape, each where the crank stands when it reaches the pointer: cylinder 1's
 * spec timings, then each other cylinder's TDC followed by the same spec timings before it (each
 * cylinder fires at the same advance before its own TDC). The hub turns once per crank turn, so a
 * mark sits at its crank angle modulo 360°.
 */
export function tapeMarks(spec: TapeSpec): TapeMark[] {
	const at = (kind: TapeMark['kind'], label: string, cylinder: number, atdc: number): TapeMark => {
		const atdcDeg = onTurn(atdc);
		return { kind, label, atdcDeg, onTape: Math.abs(atdcDeg) <= spec.windowDeg, cylinder, cycleDeg: ((atdc % 360) + 360) % 360 };
	};
	const marks = spec.timingMarks.map((m) => at('timing', m.label, 1, -m.btdcDeg));
	spec.otherTdc.forEach((c, i) => {
		marks.push(at('tdc', c.label, i + 2, c.atdcDeg));
		// The label names the cylinder and the degrees, so it reads alone beside cylinder 1's.
		for (const m of spec.timingMarks) {
			const timing = m.label.includes('°') ? m.label : `${m.label} ${m.btdcDeg}° BTDC`;
			marks.push(at('timing', `${c.label}: ${timing}`, i + 2, c.atdcDeg - m.btdcDeg));
		}
	});
	return marks;
}

/** The window a tape shows, in words: `60° BTDC to 60° ATDC`, or the whole circle. */
export const windowWords = (spec: Pick<TapeSpec, 'windowDeg'>) =>
	spec.windowDeg >= 180 ? 'full-circle' : `${spec.windowDeg}° BTDC to ${spec.windowDeg}° ATDC`;

/** Why a mark is not printed, said instead of leaving it out: `cyl 2 TDC at 270° …: outside this tape's … window`. */
export function outsideNote(spec: Pick<TapeSpec, 'windowDeg'>, m: TapeMark): string {
	const side = m.atdcDeg < 0 ? `${Number((-m.atdcDeg).toFixed(2))}° BTDC` : `${Number(m.atdcDeg.toFixed(2))}° ATDC`;
	const where =
		m.cylinder === 1 && m.kind === 'timing' ? side : `${Number(m.cycleDeg.toFixed(2))}° after cylinder 1's TDC, ${side} on this scale`;
	return `${markName(m)} at ${where}: outside this tape's ${windowWords(spec)} window`;
}

/** Where a crank angle sits from the tape's TDC line: the distance along the tape (mm, never negative) and the side, read upright. */
export function fromTdcLine(
	spec: Pick<TapeSpec, 'hubDiameterMm' | 'paperThicknessMm' | 'rotation'>,
	atdcDeg: number
): { fromTdcMm: number; side: 'left' | 'right' | null } {
	const offset = tapeOffsetDeg(spec.rotation, atdcDeg);
	return { fromTdcMm: Math.abs(offset) * mmPerDegree(spec), side: offset === 0 ? null : offset > 0 ? 'right' : 'left' };
}

export interface Tick {
	atdcDeg: number;
	xMm: number;
	size: 'minor' | 'mid' | 'major';
	label: string | null;
}

/** Every tick of the tape, left to right. Labels are the degrees from TDC without sign (0 at TDC); the sides say BTDC and ATDC. */
export function ticks(spec: TapeSpec): Tick[] {
	const out: Tick[] = [];
	const n = Math.round((2 * spec.windowDeg) / spec.tickDeg);
	const near = (v: number, step: number) => Math.abs(v / step - Math.round(v / step)) < 1e-6;
	for (let i = 0; i <= n; i++) {
		const deg = -spec.windowDeg + i * spec.tickDeg;
		// A full circle's two ends are the same place (180° BTDC = 180° ATDC): draw it once.
		if (spec.windowDeg >= 180 && i === n) break;
		const labelled = near(deg, spec.labelEveryDeg);
		out.push({
			atdcDeg: deg,
			xMm: tapeX(spec, deg),
			size: labelled ? 'major' : near(deg, spec.midEveryDeg) ? 'mid' : 'minor',
			label: labelled ? String(Math.round(Math.abs(deg) * 100) / 100) : null
		});
	}
	return out.sort((a, b) => a.xMm - b.xMm);
}

/** Tape warnings: ticks too close to read or print. */
export function tapeWarnings(spec: TapeSpec): string[] {
	const pitch = spec.tickDeg * mmPerDegree(spec);
	const out: string[] = [];
	if (pitch < 0.5) out.push(`Ticks ${pitch.toFixed(2)} mm apart are hard to print and read: choose a coarser tick spacing.`);
	if (spec.labelEveryDeg * mmPerDegree(spec) < 4) out.push('Labels closer than 4 mm crowd each other: label fewer degrees.');
	return out;
}

/** How a tape sits on paper (mm): strips stacked between a header and the calibration bars. */
export const tapePage = { marginMm: 12, headerMm: 40, footerMm: 22, stripHeightMm: 24, rowGapMm: 7, overlapMm: 12 } as const;

/** The strips a tape prints as on a paper size, with their pages. */
export function tapeStrips(spec: TapeSpec, paper: Paper): Strip[] {
	const { widthMm, heightMm } = papers[paper];
	const p = tapePage;
	const rows = Math.floor((heightMm - 2 * p.marginMm - p.headerMm - p.footerMm) / (p.stripHeightMm + p.rowGapMm));
	return tile(tapeLengthMm(spec), widthMm - 2 * p.marginMm, p.overlapMm, rows);
}

export interface Strip {
	/** Order on the pages, from 1. */
	index: number;
	page: number;
	/** Tape coordinates (mm) this strip shows, overlap included. */
	fromMm: number;
	toMm: number;
}

/**
 * Tiles a tape over pages: strips of at most `widthMm`, each repeating the last `overlapMm` of
 * the one before (join marks line them up), stacked `rowsPerPage` to a page.
 */
export function tile(lengthMm: number, widthMm: number, overlapMm: number, rowsPerPage: number): Strip[] {
	const strips: Strip[] = [];
	const advance = widthMm - overlapMm;
	for (let from = 0, i = 0; ; i++, from += advance) {
		strips.push({ index: i + 1, page: Math.floor(i / rowsPerPage) + 1, fromMm: from, toMm: Math.min(from + widthMm, lengthMm) });
		if (from + widthMm >= lengthMm) break;
	}
	return strips;
}
