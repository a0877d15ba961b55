// SVG path data for contours: shared by the live preview and the SVG and PDF exports.
// Drawing coordinates are y-up (mathematics); SVG's are y-down, so y is negated here.
import { sweepDeg, type Contour, type Point, type Segment } from './geometry';

// Four decimals (0.1 µm in mm): far finer than any cutter, and short. The preview formats
// thousands of numbers per keystroke, and turning a fraction into its shortest decimal is the
// slow part of number-to-text; so the whole ten-thousandths are written as an integer and the
// four decimals come from a table, with the very text String(Math.round(v * 1e4) / 1e4) gives.
const decimals: string[] = [];
/** '.25' for 2500, '.0005' for 5: ten-thousandths as decimals, trailing zeros dropped. */
const decimalsOf = (f: number) =>
	(decimals[f] ??= String(10000 + f)
		.replace(/0+$/, '')
		.replace('1', '.'));
/** A number in path data: rounded to four decimals, no exponent, no trailing zeros, never -0. */
export function pathNumber(v: number): string {
	const q = Math.round(v * 1e4);
	if (!q) return '0'; // 0, -0 and NaN alike
	const a = q < 0 ? -q : q;
	// Past 2^53 ten-thousandths the integer route is no longer exact (no wheel comes near).
	if (a > Number.MAX_SAFE_INTEGER) return String(q / 1e4);
	const whole = Math.floor(a / 1e4);
	const f = a - whole * 1e4;
	const text = q < 0 ? '-' + whole : '' + whole;
	return f ? text + decimalsOf(f) : text;
}
const n = pathNumber;
const pt = (p: Point, k: number) => `${n(p.x * k)} ${n(-p.y * k)}`;

function segmentPath(s: Segment, k: number): string {
	if (s.kind === 'line') return `L${pt(s.to, k)}`;
	const sweep = sweepDeg(s);
	const r = n(s.radius * k);
	// SVG's sweep-flag 1 is the positive-angle direction of its y-down space; with y negated, that is
	// our clockwise. So a counter-clockwise arc has sweep-flag 0.
	const dir = s.ccw ? 0 : 1;
	const flags = `${sweep > 180 ? 1 : 0} ${dir}`;
	if (sweep >= 359.999) {
		// A full turn cannot be one SVG arc: go half-way, then the rest.
		const mid = { x: 2 * s.center.x - s.from.x, y: 2 * s.center.y - s.from.y };
		return `A${r} ${r} 0 0 ${dir} ${pt(mid, k)}A${r} ${r} 0 0 ${dir} ${pt(s.to, k)}`;
	}
	return `A${r} ${r} 0 ${flags} ${pt(s.to, k)}`;
}

/** Path data for one closed contour, scaled by k (1 for mm; 1/25.4 for inches). */
export function contourPath(c: Contour, k = 1): string {
	if (c.kind === 'circle') {
		const r = n(c.radius * k);
		const left = { x: c.center.x - c.radius, y: c.center.y };
		const right = { x: c.center.x + c.radius, y: c.center.y };
		return `M${pt(left, k)}A${r} ${r} 0 1 0 ${pt(right, k)}A${r} ${r} 0 1 0 ${pt(left, k)}Z`;
	}
	let d = `M${pt(c.segments[0]!.from, k)}`;
	for (const s of c.segments) d += segmentPath(s, k);
	return d + 'Z';
}

export function segmentsPath(segments: Segment[], k = 1): string {
	let d = '';
	for (const s of segments) d += `M${pt(s.from, k)}${segmentPath(s, k)}`;
	return d;
}

/** Path data for closed polylines (the label's letter outlines), scaled by k. */
export function outlinesPath(outlines: Point[][], k = 1): string {
	let d = '';
	for (const o of outlines) {
		d += `M${pt(o[0]!, k)}`;
		for (let i = 1; i < o.length; i++) d += `L${pt(o[i]!, k)}`;
		d += 'Z';
	}
	return d;
}
