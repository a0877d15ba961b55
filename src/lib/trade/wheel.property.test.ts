// Property: every wheel the checks accept draws as cut contours a cutter can follow: each chain
// closed, none crossing or touching itself or another, the bore and holes inside the outline.
// Specs are generated as the flat parameters the designer and the API take, over their ranges,
// and go through the same parsing and checks the API uses (parseWheel, then the refusals that
// summarize answers with).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { outlineDefects, polygon, polygonArea } from '../../../tests/support/outline-check';
import { acceptedSpec, wheelParams } from '../../../tests/support/wheel-params';
import { parseWheel } from '$lib/schemas/wheel';
import { refusals } from './checks';
import { arc, contourMoments, line, polar, type Contour } from './geometry';
import { exampleSpec } from '$support/example-spec';
import { cutContours, drawWheel } from './wheel';

describe('the outline checker', () => {
	// A checker that never finds anything proves nothing: each defect kind, made by hand, is caught.
	const square = (s: number): Contour => {
		const [a, b, c, d] = [
			{ x: 0, y: 0 },
			{ x: s, y: 0 },
			{ x: s, y: s },
			{ x: 0, y: s }
		];
		return { kind: 'chain', segments: [line(a, b), line(b, c), line(c, d), line(d, a)] };
	};

	it('passes a square and the plain 36-1 example wheel', () => {
		expect(outlineDefects([square(10)])).toEqual([]);
		expect(outlineDefects(cutContours(drawWheel(exampleSpec())))).toEqual([]);
	});

	it('finds an open chain, an arc whose angles do not reach its neighbour, a bow tie, crossing and stray holes', () => {
		const open: Contour = {
			kind: 'chain',
			segments: [line({ x: 0, y: 0 }, { x: 10, y: 0 }), line({ x: 10, y: 0 }, { x: 10, y: 10 }), line({ x: 10, y: 10.001 }, { x: 0, y: 0 })]
		};
		expect(
			outlineDefects([open])
				.map((d) => d.problem)
				.join()
		).toMatch(/segment 1 \(line\) ends 0\.001/);
		// The arc's stored end point agrees with its neighbour, its angles do not (a DXF ARC carries the angles).
		const liar: Contour = {
			kind: 'chain',
			segments: [
				arc({ x: 0, y: 0 }, 10, 0, 90, true, polar(10, 0), polar(10, 90)),
				line(polar(10, 90), { x: 0, y: 0 }),
				line({ x: 0, y: 0 }, polar(10, 0))
			]
		};
		(liar.segments[0] as { endDeg: number }).endDeg = 89;
		expect(outlineDefects([liar])[0]?.problem).toMatch(/segment 0 \(arc\) ends/);
		const bowTie: Contour = {
			kind: 'chain',
			segments: [
				line({ x: 0, y: 0 }, { x: 10, y: 10 }),
				line({ x: 10, y: 10 }, { x: 10, y: 0 }),
				line({ x: 10, y: 0 }, { x: 0, y: 10 }),
				line({ x: 0, y: 10 }, { x: 0, y: 0 })
			]
		};
		expect(outlineDefects([bowTie])[0]?.problem).toMatch(/crosses or touches itself/);
		const hole = (x: number, y: number, radius: number): Contour => ({ kind: 'circle', center: { x, y }, radius });
		expect(outlineDefects([square(10), hole(9.5, 5, 1)])[0]?.problem).toMatch(/contours 0 and 1 cross/);
		expect(outlineDefects([square(10), hole(5, 5, 1), hole(6, 5, 1)])[0]?.problem).toMatch(/contours 1 and 2 cross/);
		expect(outlineDefects([square(10), hole(20, 5, 1)])[0]?.problem).toMatch(/outside the outline/);
		expect(outlineDefects([square(10), hole(5, 5, 3), hole(5, 5, 1)])[0]?.problem).toMatch(/contour 2 lies inside contour 1/);
	});
});

describe('wheels the property found drawn with crossing contours, now refused', () => {
	const refusedFields = (params: Record<string, string>) => {
		const parsed = parseWheel(params);
		if (!parsed.ok) return Object.keys(parsed.errors);
		return refusals(parsed.value.spec, parsed.value.units).map((r) => `${r.field} | ${r.message}`);
	};
	const base = { teeth: '1', missing: '0', duty: '0.05', od: '10', depth: '0.2', bore: '0', thickness: '3', mark: 'none' };

	// Holes keep clearanceMm (1 mm) from the tooth roots, the bore and each other: on this 10 mm
	// wheel with a 4.8 mm root radius, 0.5 mm holes go on pitch circles of 2.5 to 7.1 mm.
	it('balance holes whose given spacing brings the last one round onto the first', () => {
		// 3 holes 165.53° apart on a 5 mm circle: the third sits 28.94° short of the first, a chord of
		// 2·2.5·sin 14.47° = 1.25 mm between centres, less than 0.5 mm of hole plus 1 mm of web.
		const refused = refusedFields({ ...base, balanceCount: '3', balancePcd: '5', balanceHole: '0.5', balanceSpacing: '165.53' });
		expect(refused).toEqual([expect.stringMatching(/^balanceCount \| balanceCount: the holes come closer than 1\.00 mm to each other/)]);
		// 4 holes 110.72° apart: the fourth 27.84° short of the first (chord 1.20 mm).
		expect(refusedFields({ ...base, balanceCount: '4', balancePcd: '5', balanceHole: '0.5', balanceSpacing: '110.72' })).toHaveLength(1);
		// Spread evenly they clear each other (chord 2·2.5·sin 60° = 4.33 mm ≥ 0.5 + 1 mm).
		expect(refusedFields({ ...base, balanceCount: '3', balancePcd: '5', balanceHole: '0.5' })).toEqual([]);
	});

	it('a balance hole on top of a bolt hole', () => {
		const refused = refusedFields({
			...base,
			bolts: '1',
			pcd: '5',
			boltHole: '0.5',
			balanceCount: '1',
			balancePcd: '5',
			balanceHole: '0.5'
		});
		expect(refused).toEqual([
			expect.stringMatching(/^balancePcd \| balancePcd: the balance holes come closer than 1\.00 mm to the bolt holes/)
		]);
		expect(
			refusedFields({
				...base,
				bolts: '1',
				pcd: '5',
				boltHole: '0.5',
				balanceCount: '1',
				balancePcd: '5',
				balanceHole: '0.5',
				balanceAngle: '180'
			})
		).toEqual([]);
	});

	it('a wide keyway whose outer corners reach past the tooth roots', () => {
		// 19 mm slot in a 20 mm bore, 0.2 mm deep: its corners sit at √(10.2² + 9.5²) = 13.94 mm from the
		// centre, beyond the 11 mm root circle of a 30 mm wheel with 4 mm teeth; 1 mm clearance leaves
		// 15 − 13.94 − 1 = 0.06 mm of tooth depth.
		const params = { teeth: '36', od: '30', depth: '4', bore: '20', keyway: 'custom', keyWidth: '19', keyDepth: '0.2', thickness: '3' };
		expect(refusedFields(params)).toEqual([expect.stringMatching(/^depth \| depth: more than 0 and less than 0\.06 mm/)]);
		// A 17 mm slot: corners at √(10.2² + 8.5²) = 13.28 mm, room for 0.72 mm teeth.
		const shallow = acceptedSpec({ ...params, keyWidth: '17', depth: '0.5' });
		expect(shallow).toBeTruthy();
		expect(outlineDefects(cutContours(drawWheel(shallow!)))).toEqual([]);
	});
});

describe('accepted wheels', () => {
	it('draw closed cut contours that neither cross nor touch, for generated specs over the valid ranges', () => {
		let accepted = 0;
		fc.assert(
			fc.property(wheelParams, (params) => {
				const spec = acceptedSpec(params);
				if (!spec) return;
				accepted++;
				const contours = cutContours(drawWheel(spec));
				expect(outlineDefects(contours), JSON.stringify(params)).toEqual([]);
				// The outline runs counter-clockwise, and the library's exact area (Green's theorem on
				// lines and arcs) agrees with the shoelace area of the chords, which cut each arc short by
				// at most the sampling's sagitta along its length.
				const outline = polygon(contours[0]!);
				const perimeter = outline.reduce(
					(s, p, i) => s + Math.hypot(outline[(i + 1) % outline.length]!.x - p.x, outline[(i + 1) % outline.length]!.y - p.y),
					0
				);
				const exact = contourMoments(contours[0]!).area;
				expect(polygonArea(outline)).toBeGreaterThan(0);
				expect(Math.abs(polygonArea(outline) - exact), JSON.stringify(params)).toBeLessThanOrEqual(0.005 * perimeter + 1e-9 * exact);
			}),
			{ numRuns: 400 }
		);
		// About a third of the generated specs are buildable (the rest meet the refusals a user would:
		// small wheels leave no 1 mm web round their holes), so the property is about real wheels.
		expect(accepted).toBeGreaterThan(100);
	}, 60_000);
});
