// The overlay's geometry against models that are not the code under test: the ellipse's textbook
// parametric form (x = a cos t, y = b sin t, turned by the axis angle, then y flipped for the screen),
// and makerjs's own reading of SVG path data (its importer turns the arcs into curves we sample).
import makerjs from 'makerjs';
import { describe, expect, it } from 'vitest';
import {
	angleOrigin,
	clampTo,
	confidenceWord,
	ellipsePath,
	labelledTeeth,
	overlayFacts,
	rimArc,
	rimAt,
	spanDeg,
	type Ellipse,
	type ToothSeen
} from './overlay-geometry';

/** The textbook ellipse (y up), then y flipped for image px. */
function textbook(e: Ellipse, t: number) {
	const phi = (e.angleDeg * Math.PI) / 180;
	const x = e.a * Math.cos(t) * Math.cos(phi) - e.b * Math.sin(t) * Math.sin(phi);
	const y = e.a * Math.cos(t) * Math.sin(phi) + e.b * Math.sin(t) * Math.cos(phi);
	return { x: e.cx + x, y: e.cy - y };
}

/** The implicit form, textbook again: 1 on the ellipse, < 1 inside. */
function level(e: Ellipse, p: { x: number; y: number }) {
	const phi = (e.angleDeg * Math.PI) / 180;
	const dx = p.x - e.cx;
	const dy = -(p.y - e.cy);
	const along = dx * Math.cos(phi) + dy * Math.sin(phi);
	const across = -dx * Math.sin(phi) + dy * Math.cos(phi);
	return (along / e.a) ** 2 + (across / e.b) ** 2;
}

/** Points along SVG path data as makerjs reads it (its y is up: flipped back to image px). */
function pathPoints(d: string): { x: number; y: number }[] {
	const model = makerjs.importer.fromSVGPathData(d, { bezierAccuracy: 0.01 });
	const chains = makerjs.model.findChains(model) as makerjs.IChain[];
	return chains.flatMap((chain) => makerjs.chain.toPoints(chain, 1).map((p) => ({ x: p[0]!, y: -p[1]! })));
}

const tilted: Ellipse[] = [
	{ cx: 800, cy: 600, a: 420, b: 300, angleDeg: 30 },
	{ cx: 500, cy: 700, a: 350, b: 349, angleDeg: -75 },
	{ cx: 1200, cy: 900, a: 900, b: 380, angleDeg: 128 },
	{ cx: 300, cy: 300, a: 200, b: 200, angleDeg: 0 }
];

describe('ellipsePath', () => {
	it.each(tilted)('draws the textbook ellipse (%o)', (e) => {
		const drawn = pathPoints(ellipsePath(e));
		expect(drawn.length).toBeGreaterThan(50);
		// Every drawn point lies on the ellipse (makerjs approximates the arcs to 0.01 px: 0.0002 is under 0.05 px here) ...
		for (const p of drawn) expect(Math.abs(level(e, p) - 1)).toBeLessThan(0.0002);
		// ... and the drawing goes all the way round: each textbook point has a drawn one near it.
		for (let i = 0; i < 72; i++) {
			const q = textbook(e, (i * Math.PI) / 36);
			const nearest = Math.min(...drawn.map((p) => Math.hypot(p.x - q.x, p.y - q.y)));
			expect(nearest).toBeLessThan(e.a * 0.06);
		}
	});

	it('a wrong turn would not pass: the same axes turned the other way are another ellipse', () => {
		const e = tilted[0]!;
		const drawn = pathPoints(ellipsePath({ ...e, angleDeg: -e.angleDeg }));
		expect(Math.max(...drawn.map((p) => Math.abs(level(e, p) - 1)))).toBeGreaterThan(0.2);
	});
});

describe('rimAt and rimArc', () => {
	it('meets the ellipse along the ray at the image angle (counter-clockwise, y up)', () => {
		for (const e of tilted) {
			for (const from of [
				{ x: e.cx, y: e.cy },
				{ x: e.cx + e.b * 0.3, y: e.cy - e.b * 0.2 }
			]) {
				for (let deg = -180; deg < 360; deg += 23) {
					const p = rimAt(e, from, deg);
					expect(Math.abs(level(e, p) - 1)).toBeLessThan(1e-9);
					// Direction: y up, so 90° is up the screen.
					const seen = (Math.atan2(-(p.y - from.y), p.x - from.x) * 180) / Math.PI;
					expect(Math.abs((((seen - deg) % 360) + 540) % 360) - 180).toBeLessThan(1e-6);
				}
			}
		}
		// 90° from the centre of a circle is straight up the screen.
		expect(rimAt({ cx: 10, cy: 10, a: 5, b: 5, angleDeg: 0 }, { x: 10, y: 10 }, 90).y).toBeCloseTo(5, 9);
	});

	it('a scaled rim is the ellipse with both axes scaled about its centre', () => {
		const e = tilted[2]!;
		const p = rimAt(e, { x: e.cx, y: e.cy }, 40, 1.1);
		expect(level({ ...e, a: e.a * 1.1, b: e.b * 1.1 }, p)).toBeCloseTo(1, 9);
	});

	it('an arc runs counter-clockwise from its first angle, across 0° when it must', () => {
		expect(spanDeg(350, 20)).toBe(30);
		expect(spanDeg(20, 350)).toBe(330);
		expect(spanDeg(45, 45)).toBe(360);
		const e = tilted[0]!;
		const pts = pathPoints(rimArc(e, { x: e.cx, y: e.cy }, 350, 20));
		const angles = pts.map((p) => (Math.atan2(-(p.y - e.cy), p.x - e.cx) * 180) / Math.PI);
		// Every point within 350°..20° (that is -10°..20°), none on the far side.
		for (const a of angles) {
			expect(a).toBeGreaterThan(-10.5);
			expect(a).toBeLessThan(20.5);
		}
		for (const p of pts) expect(Math.abs(level(e, p) - 1)).toBeLessThan(0.01);
	});

	it('reads angles about the tapped centre when it is inside the ellipse, else about the ellipse centre', () => {
		const e = tilted[0]!;
		expect(angleOrigin(e, { x: 810, y: 590 })).toEqual({ x: 810, y: 590 });
		expect(angleOrigin(e, { x: 10, y: 10 })).toEqual({ x: 800, y: 600 });
		expect(angleOrigin(e, null)).toEqual({ x: 800, y: 600 });
		expect(clampTo({ x: -3, y: 900 }, 100, 200)).toEqual({ x: 0, y: 200 });
	});
});

/** A wheel's teeth as a reader would number them: 1 is the first after the gap, counter-clockwise. */
function wheelTeeth(teeth: number, missing: number, r: number, squash = 1): ToothSeen[] {
	return Array.from({ length: teeth - missing }, (_, i) => {
		const deg = ((missing + i + 0.5) * 360) / teeth;
		return { n: i + 1, x: 1000 + r * Math.cos((deg * Math.PI) / 180), y: 1000 - r * squash * Math.sin((deg * Math.PI) / 180) };
	});
}

describe('labelledTeeth', () => {
	it('labels every tooth when there is room', () => {
		// 36-1 of radius 800 image px shown at 1:2: pitch 2π·800/36 ≈ 140 image px ≈ 70 screen px.
		const labels = labelledTeeth(wheelTeeth(36, 1, 800), 0.5, 18);
		expect(labels.size).toBe(35);
	});

	it('on a 60-2 wheel shown small: every 5th plus the first after the gap, not a smear', () => {
		// Radius 800 image px shown 360/2000 = 0.18: pitch ≈ 83.8 image px ≈ 15 screen px < 18.
		const labels = labelledTeeth(wheelTeeth(60, 2, 800), 0.18, 18);
		expect([...labels].sort((p, q) => p - q)).toEqual([1, 5, 10, 15, 20, 25, 30, 35, 40, 45, 50, 55]);
	});

	it('thins further rather than overlap when even every 5th would touch', () => {
		// Pitch ≈ 83.8 image px at 0.04: 5 pitches ≈ 16.8 screen px < 18, 10 pitches ≈ 33.5.
		const labels = [...labelledTeeth(wheelTeeth(60, 2, 800), 0.04, 18)].sort((p, q) => p - q);
		expect(labels).toEqual([1, 10, 20, 30, 40, 50]);
	});

	it('room is measured on the photo as shown: a tilted wheel crowds its foreshortened side', () => {
		// Pitch 83.8 image px at 0.25 is 21 screen px round a circle, but squashed to a third it is not.
		expect(labelledTeeth(wheelTeeth(60, 2, 800), 0.25, 18).size).toBe(58);
		expect(labelledTeeth(wheelTeeth(60, 2, 800, 1 / 3), 0.25, 18).size).toBe(12);
	});

	it('labels tooth 1 even when the teeth seen do not include every 5th', () => {
		const few = wheelTeeth(60, 2, 800).filter((t) => t.n <= 3);
		expect([...labelledTeeth(few, 0.01, 18)]).toEqual([1]);
	});
});

describe('overlayFacts', () => {
	it('is empty for a reading from before these fields', () => {
		expect(overlayFacts({ teeth: 36, missing: 1, confidence: 0.9 })).toEqual({
			ellipse: null,
			teethAt: [],
			unseen: [],
			confidenceWord: null,
			advice: []
		});
		expect(overlayFacts(null).teethAt).toEqual([]);
	});

	it('keeps what is well formed and drops the rest', () => {
		const facts = overlayFacts({
			ellipse: { cx: 1, cy: 2, a: 3, b: 4, angleDeg: 10 },
			teethAt: [{ n: 1, x: 1, y: 2 }, { n: 0, x: 1, y: 1 }, { n: 2, x: 'a', y: 1 }, null],
			unseen: [{ fromDeg: 10, toDeg: 40 }, { fromDeg: 'x' }],
			confidenceWord: 'certain',
			advice: ['Tap more tips.', '', 3]
		});
		// a < b: the same ellipse with a and b swapped and the axis turned a quarter.
		expect(facts.ellipse).toEqual({ cx: 1, cy: 2, a: 4, b: 3, angleDeg: 100 });
		expect(facts.teethAt).toEqual([{ n: 1, x: 1, y: 2 }]);
		expect(facts.unseen).toEqual([{ fromDeg: 10, toDeg: 40 }]);
		expect(facts.confidenceWord).toBeNull();
		expect(facts.advice).toEqual(['Tap more tips.']);
		expect(overlayFacts({ ellipse: { cx: 1, cy: 2, a: 0, b: 4, angleDeg: 0 } }).ellipse).toBeNull();
	});

	it('says the confidence in words: the reader’s word first, else from the number', () => {
		expect(confidenceWord('medium', 0.95)).toBe('medium');
		expect(confidenceWord(null, 0.95)).toBe('high');
		expect(confidenceWord(null, 0.7)).toBe('medium');
		expect(confidenceWord(null, 0.3)).toBe('low');
		expect(confidenceWord(null, undefined)).toBeNull();
	});
});
