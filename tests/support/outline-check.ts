// An outline checker of its own for the wheel's cut contours, used by the wheel property test and
// the API fuzz. It reads each segment by its own definition only (a line's two ends; an arc's
// centre, radius, start angle, direction and sweep, which is what a DXF ARC carries), not by the
// shared end points the trade library hands its neighbours, so a chain that only closes on paper
// is caught. Self-intersection is tested the usual way (common practice in CAM/GIS validity
// checks): arcs sampled into short chords, then every pair of non-neighbouring chords tried for
// a crossing, the candidates found by the angles they cover round the centre, so a 720-tooth
// wheel stays cheap.
import type { Contour, Point, Segment } from '../../src/lib/trade/geometry';

export interface OutlineDefect {
	contour: number;
	problem: string;
}

const toRad = (d: number) => (d * Math.PI) / 180;
const at = (c: Point, r: number, d: number): Point => ({ x: c.x + r * Math.cos(toRad(d)), y: c.y + r * Math.sin(toRad(d)) });
const dist = (a: Point, b: Point) => Math.hypot(a.x - b.x, a.y - b.y);

/** Positive sweep in degrees along the direction of travel; an arc whose ends coincide is a full turn (as a DXF ARC with equal angles would be read). */
function sweep(s: Extract<Segment, { kind: 'arc' }>): number {
	const d = s.ccw ? s.endDeg - s.startDeg : s.startDeg - s.endDeg;
	const m = ((d % 360) + 360) % 360;
	return m < 1e-12 ? 360 : m;
}

/** Where the segment starts and ends, by its own geometry. */
function ends(s: Segment): [Point, Point] {
	if (s.kind === 'line') return [s.from, s.to];
	const end = s.startDeg + (s.ccw ? 1 : -1) * sweep(s);
	return [at(s.center, s.radius, s.startDeg), at(s.center, s.radius, end)];
}

/** Degrees between chord points: the chord stays within `sagittaMm` of the arc, and within 15° of it. */
const chordStep = (radius: number, sagittaMm: number) =>
	Math.min(15, radius > sagittaMm ? (2 * Math.acos(1 - sagittaMm / radius) * 180) / Math.PI : 15);

/** Chord points along a segment, first and last included. */
function samples(s: Segment, sagittaMm: number): Point[] {
	if (s.kind === 'line') return [s.from, s.to];
	const sw = sweep(s);
	const n = Math.max(1, Math.ceil(sw / chordStep(s.radius, sagittaMm)));
	const dir = s.ccw ? 1 : -1;
	return Array.from({ length: n + 1 }, (_, i) => at(s.center, s.radius, s.startDeg + (dir * sw * i) / n));
}

/** The contour as a closed polygon (last point not repeated). */
export function polygon(c: Contour, sagittaMm = 0.005): Point[] {
	if (c.kind === 'circle') {
		const n = Math.max(8, Math.ceil(360 / chordStep(c.radius, sagittaMm)));
		return Array.from({ length: n }, (_, i) => at(c.center, c.radius, (360 * i) / n));
	}
	const points: Point[] = [];
	for (const s of c.segments) {
		const p = samples(s, sagittaMm);
		// Each segment's first point is the previous one's last (checked separately); keep one of them,
		// and drop points closer than 0.1 µm, far below any feature a cutter makes.
		for (const q of points.length ? p.slice(1) : p) if (!points.length || dist(points.at(-1)!, q) > 1e-7) points.push(q);
	}
	if (points.length > 1 && dist(points[0]!, points.at(-1)!) <= 1e-7) points.pop();
	return points;
}

/** Signed area of a polygon (shoelace formula): positive when counter-clockwise. */
export function polygonArea(p: Point[]): number {
	let a = 0;
	for (let i = 0; i < p.length; i++) {
		const u = p[i]!;
		const v = p[(i + 1) % p.length]!;
		a += u.x * v.y - v.x * u.y;
	}
	return a / 2;
}

const orient = (a: Point, b: Point, c: Point) => (b.x - a.x) * (c.y - a.y) - (b.y - a.y) * (c.x - a.x);

/** Whether two chords cross or touch (shared end points included; the caller skips neighbours). */
function meet(a: Point, b: Point, c: Point, d: Point, eps: number): boolean {
	const d1 = orient(a, b, c),
		d2 = orient(a, b, d),
		d3 = orient(c, d, a),
		d4 = orient(c, d, b);
	if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) return true;
	// Touching: an end point lying on the other chord (within eps).
	const onChord = (p: Point, q: Point, r: Point) => {
		const len = dist(p, q);
		if (len === 0) return dist(p, r) <= eps;
		const t = ((r.x - p.x) * (q.x - p.x) + (r.y - p.y) * (q.y - p.y)) / (len * len);
		return t >= 0 && t <= 1 && Math.abs(orient(p, q, r)) / len <= eps;
	};
	return onChord(a, b, c) || onChord(a, b, d) || onChord(c, d, a) || onChord(c, d, b);
}

/** Even-odd rule: is the point inside the polygon? */
function inside(p: Point, poly: Point[]): boolean {
	let odd = false;
	for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
		const a = poly[i]!,
			b = poly[j]!;
		if (a.y > p.y !== b.y > p.y && p.x < ((b.x - a.x) * (p.y - a.y)) / (b.y - a.y) + a.x) odd = !odd;
	}
	return odd;
}

/**
 * Every defect of a wheel's cut contours: a chain whose consecutive segments do not meet (the last
 * one back to the first included), a contour that crosses or touches itself, two contours that
 * cross or touch, a bore or hole outside the outline (contour 0) or inside another hole.
 * `tolMm` is how far apart two ends may be and still count as meeting.
 */
export function outlineDefects(contours: Contour[], tolMm = 1e-6): OutlineDefect[] {
	const defects: OutlineDefect[] = [];
	contours.forEach((c, k) => {
		if (c.kind === 'circle') {
			if (!(c.radius > 0)) defects.push({ contour: k, problem: `circle of radius ${c.radius}` });
			return;
		}
		if (c.segments.length < 2) defects.push({ contour: k, problem: `a chain of ${c.segments.length} segment(s) cannot close` });
		c.segments.forEach((s, i) => {
			const next = c.segments[(i + 1) % c.segments.length]!;
			const gap = dist(ends(s)[1], ends(next)[0]);
			if (!(gap <= tolMm))
				defects.push({
					contour: k,
					problem: `segment ${i} (${s.kind}) ends ${gap.toPrecision(3)} mm from where segment ${(i + 1) % c.segments.length} (${next.kind}) starts`
				});
			if (s.kind === 'arc' && !(s.radius > 0)) defects.push({ contour: k, problem: `segment ${i}: arc of radius ${s.radius}` });
		});
	});
	if (defects.length) return defects;

	const polys = contours.map((c) => polygon(c));
	type Chord = { k: number; i: number; a: Point; b: Point };
	const chords: Chord[] = polys.flatMap((p, k) => p.map((a, i) => ({ k, i, a, b: p[(i + 1) % p.length]! })));
	let span = 1e-9;
	for (const { a } of chords) span = Math.max(span, Math.abs(a.x), Math.abs(a.y));
	const eps = span * 1e-12;
	// Sweep and prune round the centre: a wheel's features are laid out by angle, so each chord
	// only meets the few that cover the same angles. A chord through the centre covers all of them.
	type Span = { n: number; from: number; to: number; rLo: number; rHi: number };
	const spans: Span[] = [];
	const everywhere: number[] = [];
	chords.forEach((c, n) => {
		const len = dist(c.a, c.b);
		const t = len ? Math.max(0, Math.min(1, -(c.a.x * (c.b.x - c.a.x) + c.a.y * (c.b.y - c.a.y)) / (len * len))) : 0;
		const rLo = Math.hypot(c.a.x + t * (c.b.x - c.a.x), c.a.y + t * (c.b.y - c.a.y));
		const rHi = Math.max(Math.hypot(c.a.x, c.a.y), Math.hypot(c.b.x, c.b.y));
		if (rLo <= eps * 1e3) return void everywhere.push(n);
		const [p, q] = [Math.atan2(c.a.y, c.a.x), Math.atan2(c.b.y, c.b.x)];
		let d = q - p;
		if (d > Math.PI) d -= 2 * Math.PI;
		if (d < -Math.PI) d += 2 * Math.PI;
		const from = Math.min(p, p + d) - 1e-12;
		const to = Math.max(p, p + d) + 1e-12;
		spans.push({ n, from, to, rLo, rHi });
		// A span over the ±180° seam is looked at from both sides of it.
		if (to > Math.PI) spans.push({ n, from: from - 2 * Math.PI, to: to - 2 * Math.PI, rLo, rHi });
		if (from < -Math.PI) spans.push({ n, from: from + 2 * Math.PI, to: to + 2 * Math.PI, rLo, rHi });
	});
	spans.sort((u, v) => u.from - v.from);
	const reported = new Set<string>();
	const test = (m: number, n: number) => {
		if (m === n) return;
		const u = chords[m]!,
			v = chords[n]!;
		if (u.k === v.k) {
			const len = polys[u.k]!.length;
			const gap = Math.abs(u.i - v.i);
			if (gap <= 1 || gap === len - 1) return; // neighbours share an end point
		}
		if (!meet(u.a, u.b, v.a, v.b, eps)) return;
		const what =
			u.k === v.k ? `contour ${u.k} crosses or touches itself` : `contours ${Math.min(u.k, v.k)} and ${Math.max(u.k, v.k)} cross or touch`;
		if (reported.has(what)) return;
		reported.add(what);
		defects.push({ contour: u.k, problem: `${what} near (${u.a.x.toFixed(4)}, ${u.a.y.toFixed(4)})` });
	};
	for (let i = 0; i < spans.length; i++) {
		const u = spans[i]!;
		for (let j = i + 1; j < spans.length && spans[j]!.from <= u.to; j++) {
			const v = spans[j]!;
			if (v.rLo <= u.rHi + eps && u.rLo <= v.rHi + eps) test(u.n, v.n);
		}
	}
	for (const m of everywhere) for (let n = 0; n < chords.length; n++) test(m, n);
	if (defects.length) return defects;

	// No crossings: what remains is nesting. Everything inside the outline, no hole inside another.
	for (let k = 1; k < polys.length; k++) {
		if (!inside(polys[k]![0]!, polys[0]!)) defects.push({ contour: k, problem: `contour ${k} lies outside the outline` });
		for (let j = 1; j < polys.length; j++) {
			if (j !== k && inside(polys[k]![0]!, polys[j]!)) defects.push({ contour: k, problem: `contour ${k} lies inside contour ${j}` });
		}
	}
	return defects;
}
