// Plane geometry the wheel is drawn with: closed contours of lines and arcs (what cutting shops'
// software reads most reliably), and their exact area and first moments by Green's theorem.
import { rad } from './units';

export interface Point {
	x: number;
	y: number;
}

export type Segment =
	| { kind: 'line'; from: Point; to: Point }
	/** Traversed from `startDeg` to `endDeg`, counter-clockwise when `ccw`, else clockwise. */
	| { kind: 'arc'; from: Point; to: Point; center: Point; radius: number; startDeg: number; endDeg: number; ccw: boolean };

export type Contour = { kind: 'chain'; segments: Segment[] } | { kind: 'circle'; center: Point; radius: number };

const origin: Point = Object.freeze({ x: 0, y: 0 });

export const polar = (r: number, degrees: number, center: Point = origin): Point => ({
	x: center.x + r * Math.cos(rad(degrees)),
	y: center.y + r * Math.sin(rad(degrees))
});

export const line = (from: Point, to: Point): Segment => ({ kind: 'line', from, to });

/** An arc between two points already computed (so neighbouring segments share them exactly). */
export function arc(center: Point, radius: number, startDeg: number, endDeg: number, ccw: boolean, from?: Point, to?: Point): Segment {
	return {
		kind: 'arc',
		center,
		radius,
		startDeg,
		endDeg,
		ccw,
		from: from ?? polar(radius, startDeg, center),
		to: to ?? polar(radius, endDeg, center)
	};
}

/** The arc's sweep in degrees, positive, in its direction of travel. */
export function sweepDeg(a: Extract<Segment, { kind: 'arc' }>): number {
	const d = a.ccw ? a.endDeg - a.startDeg : a.startDeg - a.endDeg;
	return ((d % 360) + 360) % 360 || 360;
}

export interface Moments {
	/** Signed area: positive for a counter-clockwise contour. */
	area: number;
	/** ∬x dA and ∬y dA, signed like the area. */
	mx: number;
	my: number;
}

function segmentMoments(s: Segment): Moments {
	if (s.kind === 'line') {
		const { x: x0, y: y0 } = s.from;
		const { x: x1, y: y1 } = s.to;
		// The same line integrals as for arcs (the per-segment terms must come from one form).
		return {
			area: (x0 * y1 - x1 * y0) / 2,
			mx: ((y1 - y0) * (x0 * x0 + x0 * x1 + x1 * x1)) / 6,
			my: (-(x1 - x0) * (y0 * y0 + y0 * y1 + y1 * y1)) / 6
		};
	}
	const { x: cx, y: cy } = s.center;
	const r = s.radius;
	const t0 = rad(s.startDeg);
	const t1 = t0 + (s.ccw ? 1 : -1) * rad(sweepDeg(s));
	const sin0 = Math.sin(t0);
	const sin1 = Math.sin(t1);
	const cos0 = Math.cos(t0);
	const cos1 = Math.cos(t1);
	// ½∮(x dy − y dx), ½∮x² dy and −½∮y² dx along x = cx + r cos t, y = cy + r sin t.
	const area = 0.5 * (r * r * (t1 - t0) + r * (cx * (sin1 - sin0) - cy * (cos1 - cos0)));
	const intCos = sin1 - sin0;
	const sin2 = Math.sin(2 * t1) - Math.sin(2 * t0);
	const intCos2 = (t1 - t0) / 2 + sin2 / 4;
	const intCos3 = sin1 - sin1 ** 3 / 3 - (sin0 - sin0 ** 3 / 3);
	const mx = 0.5 * r * (cx * cx * intCos + 2 * cx * r * intCos2 + r * r * intCos3);
	const intSin = -(cos1 - cos0);
	const intSin2 = (t1 - t0) / 2 - sin2 / 4;
	const intSin3 = -cos1 + cos1 ** 3 / 3 - (-cos0 + cos0 ** 3 / 3);
	const my = 0.5 * r * (cy * cy * intSin + 2 * cy * r * intSin2 + r * r * intSin3);
	return { area, mx, my };
}

export function contourMoments(c: Contour): Moments {
	if (c.kind === 'circle') {
		const area = Math.PI * c.radius ** 2;
		return { area, mx: area * c.center.x, my: area * c.center.y };
	}
	// Summed in order, as a reduce from zero would, without an object per step (the summary sums
	// hundreds of segments per keystroke).
	let area = 0;
	let mx = 0;
	let my = 0;
	for (const s of c.segments) {
		const m = segmentMoments(s);
		area += m.area;
		mx += m.mx;
		my += m.my;
	}
	return { area, mx, my };
}

/** The largest gap between one segment's end and the next one's start (0 for a closed chain). */
export function closureError(c: Contour): number {
	if (c.kind === 'circle') return 0;
	let worst = 0;
	c.segments.forEach((s, i) => {
		const next = c.segments[(i + 1) % c.segments.length]!;
		worst = Math.max(worst, Math.hypot(s.to.x - next.from.x, s.to.y - next.from.y));
	});
	return worst;
}
