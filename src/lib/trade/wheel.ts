// A trigger wheel from its spec: the outer tooth profile, the bore with its keyway, bolt and
// balance holes (cut), and the index mark (etched). All lengths mm; angles are "wheel degrees",
// measured from the leading edge of the first tooth after the gap, in the sense of rotation.
import { arc, line, polar, type Contour, type Point, type Segment } from './geometry';
import type { HubSlot } from './keys';
import { labelShape, placeShape, type PlacedLabel } from './label';
import { gapsOf, pitchDeg, teethOf, type Pattern, type Tooth } from './pattern';
import { deg } from './units';

export type Rotation = 'cw' | 'ccw';

export interface HoleCircle {
	count: number;
	pcdMm: number;
	holeMm: number;
	/** Wheel degrees of the first hole. */
	clockDeg: number;
	/** Degrees between neighbouring holes; omitted = spread evenly round the circle. */
	spacingDeg?: number;
}

export interface WheelSpec {
	pattern: Pattern;
	/** Tooth width as a fraction of the pitch. */
	duty: number;
	odMm: number;
	depthMm: number;
	tipRadiusMm: number;
	rootRadiusMm: number;
	/** 0 = no bore. */
	boreMm: number;
	keyway: HubSlot | null;
	keywayDeg: number;
	bolts: HoleCircle | null;
	balanceHoles: HoleCircle | null;
	indexMarkDeg: number | null;
	label: string;
	/** Seen from the face drawn (the face the DXF shows). */
	rotation: Rotation;
	thicknessMm: number;
	/** The etched degree ring's outer diameter (etch-ring.ts); absent or null for none. */
	etchRingMm?: number | null;
	densityGcm3: number;
	materialLabel: string;
}

/** Where a wheel angle is drawn: tooth 0's leading edge at 12 o'clock, teeth following in turn. */
export function drawDeg(spec: Pick<WheelSpec, 'rotation'>, wheelDeg: number): number {
	// Turning clockwise, the point that reaches the top next is the one counter-clockwise of it.
	return 90 + (spec.rotation === 'cw' ? wheelDeg : -wheelDeg);
}

export interface ToothSpan {
	tooth: Tooth;
	/** Drawing angles (degrees, counter-clockwise from +x) of the tooth's two flanks, a0 < a1. */
	a0: number;
	a1: number;
}

export function toothSpans(spec: WheelSpec): ToothSpan[] {
	return teethOf(spec.pattern, spec.duty)
		.map((tooth) => {
			const lead = drawDeg(spec, tooth.leadDeg);
			const trail = drawDeg(spec, tooth.trailDeg);
			return { tooth, a0: Math.min(lead, trail), a1: Math.max(lead, trail) };
		})
		.sort((a, b) => a.a0 - b.a0);
}

export const rootRadius = (spec: WheelSpec) => spec.odMm / 2 - spec.depthMm;

/** How far the bore reaches: with a keyway, out to the slot's outer corners (the slot's depth is measured on its centre line). */
export const innerRadius = (spec: WheelSpec) =>
	spec.keyway ? Math.hypot(spec.boreMm / 2 + spec.keyway.depthMm, spec.keyway.widthMm / 2) : Math.max(spec.boreMm / 2, 0);

/**
 * The web every hole (bolt, balance) and the keyway keep from the etched label, the tooth roots
 * and each other, and the label from the bore and the roots, mm: 1 mm, enough for a laser or
 * waterjet to leave a wall standing in thin plate (common cutting practice, from memory).
 */
export const clearanceMm = 1;

/** The smallest cap height an etched label is drawn at, mm (common practice for etched part marks). */
export const minLabelHeightMm = 1.5;

/**
 * Where the label goes: across the web opposite the index mark, turned so that it never reads
 * upside down, as tall as the web allows up to 4 mm (cap height) and at least minLabelHeightMm,
 * its ink clear of the bore, keyway and tooth roots. Null when there is no label, or no room for
 * it (checks.ts refuses that).
 */
export function placeLabel(spec: WheelSpec): PlacedLabel | null {
	const shape = labelShape(spec.label);
	if (!shape) return null;
	const out = rootRadius(spec) - clearanceMm;
	const inn = innerRadius(spec) + clearanceMm;
	const fits = (h: number) =>
		inn + 2 * shape.halfHeight * h <= out && (inn + 2 * shape.halfHeight * h) ** 2 + (shape.halfWidth * h) ** 2 <= out * out;
	let h = Math.min(4, (rootRadius(spec) - innerRadius(spec)) * 0.25);
	if (!fits(h)) {
		let lo = 0;
		for (let i = 0; i < 30; i++) {
			const mid = (lo + h) / 2;
			if (fits(mid)) lo = mid;
			else h = mid;
		}
		h = lo;
	}
	if (h < minLabelHeightMm) return null;
	const [hx, hy] = [shape.halfWidth * h, shape.halfHeight * h];
	const labelR = Math.min(Math.sqrt(out * out - hx * hx) - hy, Math.max(inn + hy, (rootRadius(spec) + innerRadius(spec)) / 2));
	const labelAngle = drawDeg(spec, (spec.indexMarkDeg ?? 0) + 180);
	const along = (((labelAngle - 90) % 360) + 360) % 360;
	return placeShape(shape, h, polar(labelR, labelAngle), along > 90 && along < 270 ? along - 180 : along);
}

/**
 * Corner geometry: a fillet of radius ρ between a radial flank and a circle of radius R touches
 * the circle `alpha` degrees from the flank and the flank at `along` from the centre.
 */
function corner(radius: number, rho: number, convex: boolean) {
	if (rho <= 0) return { alpha: 0, along: radius, centreR: radius };
	const centreR = convex ? radius - rho : radius + rho;
	const alpha = deg(Math.asin(rho / centreR));
	return { alpha, along: centreR * Math.cos(Math.asin(rho / centreR)), centreR };
}

/** The outer profile as one closed counter-clockwise chain: root arcs, flanks, tips, fillets. */
export function outerProfile(spec: WheelSpec, spans = toothSpans(spec)): Contour {
	const R = spec.odMm / 2;
	const r = rootRadius(spec);
	const tip = corner(R, spec.tipRadiusMm, true);
	const root = corner(r, spec.rootRadiusMm, false);
	const segments: Segment[] = [];
	if (spans.length === 0) return { kind: 'circle', center: { x: 0, y: 0 }, radius: r };

	// Points are made once and shared by the two segments that meet there, so the chain closes exactly.
	const firstRootPoint = polar(r, spans[0]!.a0 - root.alpha);
	let rootStart = firstRootPoint;
	spans.forEach(({ a0, a1 }, i) => {
		const next = spans[(i + 1) % spans.length]!;
		const nextA0 = i + 1 < spans.length ? next.a0 : next.a0 + 360;
		const flankLow0 = polar(root.along, a0);
		const flankHigh0 = polar(tip.along, a0);
		const tip0 = polar(R, a0 + tip.alpha);
		const tip1 = polar(R, a1 - tip.alpha);
		const flankHigh1 = polar(tip.along, a1);
		const flankLow1 = polar(root.along, a1);
		const rootEnd = polar(r, a1 + root.alpha);
		if (root.alpha)
			segments.push(
				arc(polar(root.centreR, a0 - root.alpha), spec.rootRadiusMm, a0 - root.alpha + 180, a0 + 90, false, rootStart, flankLow0)
			);
		segments.push(line(root.alpha ? flankLow0 : rootStart, flankHigh0));
		if (tip.alpha)
			segments.push(arc(polar(tip.centreR, a0 + tip.alpha), spec.tipRadiusMm, a0 - 90, a0 + tip.alpha, true, flankHigh0, tip0));
		segments.push(
			arc({ x: 0, y: 0 }, R, a0 + tip.alpha, a1 - tip.alpha, true, tip.alpha ? tip0 : flankHigh0, tip.alpha ? tip1 : flankHigh1)
		);
		if (tip.alpha)
			segments.push(arc(polar(tip.centreR, a1 - tip.alpha), spec.tipRadiusMm, a1 - tip.alpha, a1 + 90, true, tip1, flankHigh1));
		const low = root.alpha ? flankLow1 : rootEnd;
		segments.push(line(flankHigh1, low));
		if (root.alpha)
			segments.push(
				arc(polar(root.centreR, a1 + root.alpha), spec.rootRadiusMm, a1 - 90, a1 + root.alpha + 180, false, flankLow1, rootEnd)
			);
		const nextRootStart = i + 1 < spans.length ? polar(r, nextA0 - root.alpha) : firstRootPoint;
		segments.push(arc({ x: 0, y: 0 }, r, a1 + root.alpha, nextA0 - root.alpha, true, rootEnd, nextRootStart));
		rootStart = nextRootStart;
	});
	return { kind: 'chain', segments };
}

/** The bore, with the hub keyway as part of the same closed chain when there is one. */
export function boreContour(spec: WheelSpec): Contour | null {
	if (spec.boreMm <= 0) return null;
	const Rb = spec.boreMm / 2;
	const origin = { x: 0, y: 0 };
	if (!spec.keyway) return { kind: 'circle', center: origin, radius: Rb };
	const { widthMm: w, depthMm } = spec.keyway;
	const turn = drawDeg(spec, spec.keywayDeg) - 90;
	// Drawn with the key slot straight up, then turned to its place.
	const place = (p: Point): Point => {
		const c = Math.cos((turn * Math.PI) / 180);
		const s = Math.sin((turn * Math.PI) / 180);
		return { x: p.x * c - p.y * s, y: p.x * s + p.y * c };
	};
	const y0 = Math.sqrt(Rb * Rb - (w / 2) ** 2);
	const top = Rb + depthMm;
	const A = place({ x: w / 2, y: y0 });
	const B = place({ x: w / 2, y: top });
	const C = place({ x: -w / 2, y: top });
	const D = place({ x: -w / 2, y: y0 });
	const beta = deg(Math.asin(w / 2 / Rb));
	return {
		kind: 'chain',
		segments: [line(A, B), line(B, C), line(C, D), arc(origin, Rb, 90 + beta + turn, 90 - beta + 360 + turn, true, D, A)]
	};
}

export function holeCenters(spec: WheelSpec, holes: HoleCircle): Point[] {
	const step = holes.spacingDeg ?? 360 / holes.count;
	return Array.from({ length: holes.count }, (_, i) => polar(holes.pcdMm / 2, drawDeg(spec, holes.clockDeg + i * step)));
}

export interface Hole {
	kind: 'bolt' | 'balance';
	contour: Contour;
}

export function holes(spec: WheelSpec): Hole[] {
	const circle = (kind: Hole['kind'], h: HoleCircle | null): Hole[] =>
		h && h.count > 0 ? holeCenters(spec, h).map((center) => ({ kind, contour: { kind: 'circle', center, radius: h.holeMm / 2 } })) : [];
	return [...circle('bolt', spec.bolts), ...circle('balance', spec.balanceHoles)];
}

/** Each gap's open space in wheel degrees: from the trailing edge before it to the leading edge after it. */
export function gapOpenings(spec: WheelSpec): { first: number; count: number; fromDeg: number; toDeg: number }[] {
	const pitch = pitchDeg(spec.pattern.teeth);
	return gapsOf(spec.pattern).map((g) => ({
		...g,
		fromDeg: (g.first - 1) * pitch + spec.duty * pitch,
		toDeg: (g.first + g.count) * pitch
	}));
}

/** The etched index (TDC) mark: a radial line inside the tooth root at the marked wheel angle. */
export function indexMark(spec: WheelSpec): Segment | null {
	if (spec.indexMarkDeg === null) return null;
	const r = rootRadius(spec);
	const inner = Math.max(spec.boreMm / 2 + (spec.keyway?.depthMm ?? 0), r * 0.55);
	const length = Math.min(8, (r - inner) * 0.5);
	if (length <= 0.5) return null;
	const a = drawDeg(spec, spec.indexMarkDeg);
	return line(polar(r - 1, a), polar(r - 1 - length, a));
}

export interface WheelDrawing {
	outer: Contour;
	bore: Contour | null;
	holes: Hole[];
	etch: Segment[];
	/** The gaps' open spaces in drawing angles, a0 < a1. */
	gaps: { a0: number; a1: number }[];
	/** The etched part label as outlines of the font's letters (etched, like the index mark). */
	label: PlacedLabel | null;
	spans: ToothSpan[];
}

/** Everything a cutter cuts: the outer profile, the bore with its keyway, and every hole. */
export const cutContours = (d: WheelDrawing): Contour[] => [d.outer, ...(d.bore ? [d.bore] : []), ...d.holes.map((h) => h.contour)];

// One drawing per spec object: the summary (mass, unbalance), the preview and each export all
// ask for the same spec's drawing, often several times in one request or keystroke. Specs and
// drawings are values, never changed once made, so the spec object itself is the key.
const drawings = new WeakMap<WheelSpec, WheelDrawing>();

export function drawWheel(spec: WheelSpec): WheelDrawing {
	let d = drawings.get(spec);
	if (!d) drawings.set(spec, (d = draw(spec)));
	return d;
}

function draw(spec: WheelSpec): WheelDrawing {
	const mark = indexMark(spec);
	const spans = toothSpans(spec);
	return {
		outer: outerProfile(spec, spans),
		bore: boreContour(spec),
		holes: holes(spec),
		gaps: gapOpenings(spec).map((g) => {
			const [p, q] = [drawDeg(spec, g.fromDeg), drawDeg(spec, g.toDeg)];
			return { a0: Math.min(p, q), a1: Math.max(p, q) };
		}),
		etch: mark ? [mark] : [],
		label: placeLabel(spec),
		spans
	};
}

/** The label's outlines as straight edges, for writers that take segments (DXF). */
export const labelSegments = (d: WheelDrawing): Segment[] =>
	d.label ? d.label.outlines.flatMap((o) => o.map((p, i) => line(p, o[(i + 1) % o.length]!))) : [];

export { pitchDeg };
