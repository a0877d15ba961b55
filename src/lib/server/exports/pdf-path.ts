// A drawing's contours as PDF path operators (ISO 32000-1, 8.5.2: m, l, c, h), written straight
// from the geometry. pdfkit's doc.path() takes SVG path data, parses it again and solves each arc
// from its end points: a seventh of a wheel template's time. Here each arc goes from its centre,
// in pieces of at most 90°, each a cubic Bézier with the usual 4/3·tan(θ/4) handles, the same
// curves pdfkit would draw. Drawing coordinates are y-up; the page under pdfkit is y-down, so y is
// negated, as in trade/svg.ts. Numbers to 1e-4 of a unit, as the SVG path data was.
import { sweepDeg, type Contour, type Point, type Segment } from '$lib/trade/geometry';
import { pathNumber as n } from '$lib/trade/svg';

const pt = (x: number, y: number) => `${n(x)} ${n(-y)}`;

function arcOps(center: Point, radius: number, startDeg: number, sweep: number): string {
	const pieces = Math.max(1, Math.ceil(Math.abs(sweep) / 90.001));
	const step = (sweep / pieces) * (Math.PI / 180);
	const t = (4 / 3) * Math.tan(step / 4) * radius;
	let a = startDeg * (Math.PI / 180);
	let ops = '';
	for (let i = 0; i < pieces; i++) {
		const b = a + step;
		const [ca, sa, cb, sb] = [Math.cos(a), Math.sin(a), Math.cos(b), Math.sin(b)];
		const x0 = center.x + radius * ca;
		const y0 = center.y + radius * sa;
		const x3 = center.x + radius * cb;
		const y3 = center.y + radius * sb;
		ops += `${pt(x0 - t * sa, y0 + t * ca)} ${pt(x3 + t * sb, y3 - t * cb)} ${pt(x3, y3)} c\n`;
		a = b;
	}
	return ops;
}

function segmentOps(s: Segment): string {
	if (s.kind === 'line') return `${pt(s.to.x, s.to.y)} l\n`;
	const sweep = sweepDeg(s);
	return arcOps(s.center, s.radius, s.startDeg, s.ccw ? sweep : -sweep);
}

/** One closed contour. */
export function contourOps(c: Contour): string {
	if (c.kind === 'circle') return `${pt(c.center.x - c.radius, c.center.y)} m\n${arcOps(c.center, c.radius, 180, 360)}h\n`;
	const first = c.segments[0]!.from;
	let ops = `${pt(first.x, first.y)} m\n`;
	for (const s of c.segments) ops += segmentOps(s);
	return ops + 'h\n';
}

/** Open segments, each a subpath of its own (the etch). */
export function segmentsOps(segments: Segment[]): string {
	let ops = '';
	for (const s of segments) ops += `${pt(s.from.x, s.from.y)} m\n${segmentOps(s)}`;
	return ops;
}

/** Closed polylines (the label's letter outlines). */
export function outlinesOps(outlines: Point[][]): string {
	let ops = '';
	for (const o of outlines) {
		ops += `${pt(o[0]!.x, o[0]!.y)} m\n`;
		for (let i = 1; i < o.length; i++) ops += `${pt(o[i]!.x, o[i]!.y)} l\n`;
		ops += 'h\n';
	}
	return ops;
}
