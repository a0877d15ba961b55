// The PDF path operators read back as a PDF reader takes them: each Bézier evaluated at t = ½ and at
// its ends must lie on the arc it stands for. The expected points come from the circle itself
// (centre, radius, the angles given), not from the writer; the error of a ≤90° cubic with
// 4/3·tan(θ/4) handles is about 2.7e-4 of the radius at most (common practice, from memory), so 1e-3 of
// the radius (plus the 1e-4 rounding) is a bound that a wrong handle, sign or sweep would break.
import { describe, expect, it } from 'vitest';
import type { Point, Segment } from '$lib/trade/geometry';
import { contourOps, outlinesOps, segmentsOps } from './pdf-path';

type Op = { op: string; args: number[] };
function ops(text: string): Op[] {
	const out: Op[] = [];
	let args: number[] = [];
	for (const token of text.trim().split(/\s+/)) {
		if (/^[a-zA-Z]+$/.test(token)) {
			out.push({ op: token, args });
			args = [];
		} else args.push(Number(token));
	}
	return out;
}

/** Every point the path passes through (y back to y-up), with each Bézier's point at t = ½. */
function points(text: string): Point[] {
	const out: Point[] = [];
	let at: Point = { x: 0, y: 0 };
	for (const { op, args: a } of ops(text)) {
		const p = (i: number): Point => ({ x: a[i]!, y: -a[i + 1]! });
		if (op === 'm' || op === 'l') out.push((at = p(0)));
		if (op === 'c') {
			const [p1, p2, p3] = [p(0), p(2), p(4)];
			out.push({ x: (at.x + 3 * p1.x + 3 * p2.x + p3.x) / 8, y: (at.y + 3 * p1.y + 3 * p2.y + p3.y) / 8 }, (at = p3));
		}
	}
	return out;
}

const polar = (c: Point, r: number, deg: number): Point => ({
	x: c.x + r * Math.cos((deg * Math.PI) / 180),
	y: c.y + r * Math.sin((deg * Math.PI) / 180)
});
const arc = (c: Point, r: number, startDeg: number, endDeg: number, ccw: boolean): Segment => ({
	kind: 'arc',
	center: c,
	radius: r,
	startDeg,
	endDeg,
	ccw,
	from: polar(c, r, startDeg),
	to: polar(c, r, endDeg)
});

describe('PDF path operators', () => {
	const c = { x: 3, y: -7 };
	const r = 60;
	const onCircle = (p: Point) => Math.abs(Math.hypot(p.x - c.x, p.y - c.y) - r);

	it('draws a full circle as four quarter curves on the circle, closed', () => {
		const text = contourOps({ kind: 'circle', center: c, radius: r });
		expect(ops(text).map((o) => o.op)).toEqual(['m', 'c', 'c', 'c', 'c', 'h']);
		for (const p of points(text)) expect(onCircle(p)).toBeLessThan(1e-3 * r + 2e-4);
	});

	it.each([
		['counter-clockwise, 30° to 250°', 30, 250, true, 3],
		['clockwise, 30° to -60° (90° exactly: one piece)', 30, -60, false, 1],
		['clockwise past a turn, 10° to 350°', 10, 350, false, 1],
		['counter-clockwise past a turn, 350° to 10°', 350, 10, true, 1]
	])('draws an arc %s on the circle, from its start to its end', (_, start, end, ccw, pieces) => {
		const s = arc(c, r, start, end, ccw);
		const text = segmentsOps([s]);
		expect(ops(text).filter((o) => o.op === 'c')).toHaveLength(pieces);
		const pts = points(text);
		for (const p of pts) expect(onCircle(p)).toBeLessThan(1e-3 * r + 2e-4);
		expect(pts[0]!.x).toBeCloseTo(s.from.x, 4);
		expect(pts[0]!.y).toBeCloseTo(s.from.y, 4);
		expect(pts.at(-1)!.x).toBeCloseTo(s.to.x, 4);
		expect(pts.at(-1)!.y).toBeCloseTo(s.to.y, 4);
		// The midpoint of the first piece lies on the side the arc turns to: the sweep's sense, not its complement.
		const mid = pts[1]!;
		const midDeg = start + ((ccw ? 1 : -1) * ((ccw ? end - start + 360 : start - end + 360) % 360)) / pieces / 2;
		expect(Math.hypot(mid.x - polar(c, r, midDeg).x, mid.y - polar(c, r, midDeg).y)).toBeLessThan(1e-3 * r);
	});

	it('closes a chain and an outline, lines as written, y turned down', () => {
		const square = [
			{ x: 0, y: 0 },
			{ x: 10, y: 0 },
			{ x: 10, y: 5 }
		];
		expect(outlinesOps([square])).toBe('0 0 m\n10 0 l\n10 -5 l\nh\n');
		const chain = contourOps({
			kind: 'chain',
			segments: [
				{ kind: 'line', from: square[0]!, to: square[1]! },
				{ kind: 'line', from: square[1]!, to: square[2]! },
				{ kind: 'line', from: square[2]!, to: square[0]! }
			]
		});
		expect(chain).toBe('0 0 m\n10 0 l\n10 -5 l\n0 0 l\nh\n');
	});
});
