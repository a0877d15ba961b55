import { describe, expect, it } from 'vitest';
import { arc, contourMoments, line, polar, type Contour } from './geometry';
import { exampleSpec } from '$support/example-spec';
import { outerProfile, toothSpans } from './wheel';
import { closureError } from './geometry';

/** One tooth alone as a closed annular sector, R outside, r inside, θ wide. */
function sector(R: number, r: number, a0: number, a1: number): Contour {
	const p0 = polar(r, a0),
		p1 = polar(R, a0),
		p2 = polar(R, a1),
		p3 = polar(r, a1);
	return {
		kind: 'chain',
		segments: [line(p0, p1), arc({ x: 0, y: 0 }, R, a0, a1, true, p1, p2), line(p2, p3), arc({ x: 0, y: 0 }, r, a1, a0, false, p3, p0)]
	};
}

describe('area and first moments', () => {
	// Handbook formulas for an annular sector of half-angle α (radians):
	// A = α(R² − r²), centroid at 2 sin α (R³ − r³) / (3 α (R² − r²)) from the centre.
	it('match the annular-sector formulas for one tooth', () => {
		const [R, r, a0, a1] = [50, 45, 80, 85];
		const alpha = ((a1 - a0) / 2) * (Math.PI / 180);
		const area = alpha * (R * R - r * r);
		const centroid = (2 * Math.sin(alpha) * (R ** 3 - r ** 3)) / (3 * alpha * (R * R - r * r));
		const m = contourMoments(sector(R, r, a0, a1));
		expect(m.area).toBeCloseTo(area, 9);
		expect(Math.hypot(m.mx, m.my) / m.area).toBeCloseTo(centroid, 9);
		expect((Math.atan2(m.my, m.mx) * 180) / Math.PI).toBeCloseTo(82.5, 9);
	});

	it('of a circle: πr², centred', () => {
		expect(contourMoments({ kind: 'circle', center: { x: 3, y: 4 }, radius: 2 })).toEqual({
			area: 4 * Math.PI,
			mx: 12 * Math.PI,
			my: 16 * Math.PI
		});
	});
});

describe('outer profile', () => {
	it.each([
		['sharp corners', 0, 0],
		['filleted tips and roots', 0.5, 0.8]
	])('is one closed chain (%s)', (_, tip, root) => {
		const outline = outerProfile(exampleSpec({ tipRadiusMm: tip, rootRadiusMm: root }));
		expect(outline.kind).toBe('chain');
		expect(closureError(outline)).toBeLessThan(1e-9);
	});

	it('encloses the root disc plus the teeth (area by annular sectors)', () => {
		const spec = exampleSpec();
		const m = contourMoments(outerProfile(spec));
		const R = 50,
			r = 45;
		const toothArea = ((5 * Math.PI) / 180 / 2) * (R * R - r * r);
		expect(m.area).toBeCloseTo(Math.PI * r * r + 35 * toothArea, 6);
	});

	it("puts tooth 0 at 12 o'clock, later teeth counter-clockwise for a clockwise wheel", () => {
		const spans = toothSpans(exampleSpec());
		const first = spans.find((s) => s.tooth.position === 0)!;
		const second = spans.find((s) => s.tooth.position === 1)!;
		expect(first.a0).toBeCloseTo(90, 9);
		expect(second.a0).toBeCloseTo(100, 9);
		const ccw = toothSpans(exampleSpec({ rotation: 'ccw' }));
		expect(ccw.find((s) => s.tooth.position === 1)!.a1).toBeCloseTo(80, 9);
	});
});
