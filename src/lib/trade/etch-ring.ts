// The degree wheel's scale etched on the trigger wheel itself (or a timing hub cut with it): a ring
// of crank-degree ticks inside the tooth roots, 0 at the index (TDC) mark, numbered every 10° with
// the side (BTDC / ATDC) under each number. The sides come from hub.ts like every other scale's:
// a crank angle sits `faceClockwiseDeg` clockwise of 0 on the face seen from the wheel side, which
// is the face drawn. Crank degrees: for a wheel that turns with the crank.
import { line, polar, type Point, type Segment } from './geometry';
import { faceClockwiseDeg, tdcSideOf } from './hub';
import { labelShape, placeShape, type PlacedLabel } from './label';
import { formatLength, type Units } from './units';
import { clearanceMm, drawDeg, holeCenters, innerRadius, placeLabel, rootRadius, type WheelSpec } from './wheel';

/** The ring's parts, mm: tick lengths from the outer edge, then the number and the side word under it. */
export const etchRingLayout = { majorMm: 3, midMm: 2, minorMm: 1.2, tdcMm: 3.8, gapMm: 0.5, numberMm: 1.5, sideMm: 1.2 } as const;

/** The ring's width, mm: the longest tick, then a number and a side word with their gaps. */
export const etchRingWidthMm =
	etchRingLayout.tdcMm + etchRingLayout.gapMm + etchRingLayout.numberMm + etchRingLayout.gapMm + etchRingLayout.sideMm;

/** Ten degrees of the ring must hold a number ("170", about 2.4 cap heights wide) with room between: the smallest ring, mm. */
export const minEtchRingMm = 60;

/** Where a crank angle (degrees ATDC, BTDC negative) is drawn on the wheel: counter-clockwise degrees from +x. */
export const etchAngle = (spec: WheelSpec, atdcDeg: number) =>
	drawDeg(spec, spec.indexMarkDeg ?? 0) - faceClockwiseDeg(spec.rotation, atdcDeg);

export interface EtchRing {
	ticks: Segment[];
	labels: PlacedLabel[];
}

function word(text: string, heightMm: number, radius: number, angleDeg: number): PlacedLabel | null {
	const shape = labelShape(text);
	// Running along the ring, its top toward the rim, so every word reads from outside the wheel.
	return shape ? placeShape(shape, heightMm, polar(radius, angleDeg), angleDeg - 90) : null;
}

/** The ring's ticks and words, or null when the wheel has none. */
export function etchRing(spec: WheelSpec): EtchRing | null {
	if (!spec.etchRingMm) return null;
	const L = etchRingLayout;
	const R = spec.etchRingMm / 2;
	const ticks: Segment[] = [];
	const labels: PlacedLabel[] = [];
	// One turn of the crank: 180° BTDC and 180° ATDC are one place, numbered as the full-circle tape numbers it (BTDC).
	for (let deg = -180; deg < 180; deg++) {
		const a = etchAngle(spec, deg);
		const length = deg === 0 ? L.tdcMm : deg % 10 === 0 ? L.majorMm : deg % 5 === 0 ? L.midMm : L.minorMm;
		ticks.push(line(polar(R, a), polar(R - length, a)));
		if (deg % 10 !== 0) continue;
		const numberR = R - L.tdcMm - L.gapMm - L.numberMm / 2;
		const number = word(String(Math.abs(deg)), L.numberMm, numberR, a);
		const side = word(tdcSideOf(deg) ?? 'TDC', L.sideMm, numberR - L.numberMm / 2 - L.gapMm - L.sideMm / 2, a);
		for (const w of [number, side]) if (w) labels.push(w);
	}
	return { ticks, labels };
}

/** The ring's words as straight edges, for writers that take segments (DXF). */
export const etchRingSegments = (ring: EtchRing): Segment[] => [
	...ring.ticks,
	...ring.labels.flatMap((l) => l.outlines.flatMap((o) => o.map((p, i) => line(p, o[(i + 1) % o.length]!))))
];

const radiusOf = (p: Point) => Math.hypot(p.x, p.y);

/**
 * Why the ring cannot go where asked (the message without the field's name), or null: inside the
 * tooth roots and outside the bore with its keyway, clear of every hole and of the etched label by
 * the clearance the rest of the wheel keeps.
 */
export function etchRingRefusal(spec: WheelSpec, units: Units): string | null {
	if (!spec.etchRingMm) return null;
	const outer = spec.etchRingMm / 2;
	const inner = outer - etchRingWidthMm;
	const most = 2 * (rootRadius(spec) - clearanceMm);
	const least = Math.max(minEtchRingMm, 2 * (innerRadius(spec) + clearanceMm + etchRingWidthMm));
	if (least > most) return `no room for a degree ring ${formatLength(etchRingWidthMm, units)} wide between the bore and the tooth roots`;
	if (spec.etchRingMm > most || spec.etchRingMm < least)
		return `${formatLength(least, units)} to ${formatLength(most, units)}, so the ring sits between the bore and the tooth roots`;
	for (const holes of [spec.bolts, spec.balanceHoles]) {
		if (!holes || holes.count <= 0) continue;
		const reach = holes.holeMm / 2 + clearanceMm;
		if (holeCenters(spec, holes).some((c) => radiusOf(c) + reach > inner && radiusOf(c) - reach < outer))
			return 'clear of the bolt and balance holes: choose a diameter whose ring passes inside or outside their circle';
	}
	const label = placeLabel(spec);
	if (label) {
		const radii = label.outlines.flat().map(radiusOf);
		if (Math.max(...radii) + clearanceMm > inner && Math.min(...radii) - clearanceMm < outer)
			return 'clear of the etched label: choose a diameter whose ring passes inside or outside it, or leave the label empty';
	}
	return null;
}
