import fc from 'fast-check';
import makerjs from 'makerjs';
import { describe, expect, it } from 'vitest';
import { summarize } from '$lib/trade/summary';
import { exampleSpec } from '$lib/trade/testing';
import type { WheelSpec } from '$lib/trade/wheel';
import { dxfOptions, wheelDxf, wheelModel } from './dxf';

// The reference is makerjs's own DXF writer (makerjs.exporter.toDXF) given the wheel's model: the
// file written straight from the drawing must be the same text, character for character.
const running = { rpm: 8000, gradeMmS: 6.3 };

const specs = fc
	.record({
		teeth: fc.constantFrom(1, 4, 12, 24, 36, 60, 7),
		missing: fc.constantFrom(0, 1, 2),
		odMm: fc.double({ min: 40, max: 300, noNaN: true }),
		depthMm: fc.double({ min: 1, max: 8, noNaN: true }),
		tipRadiusMm: fc.constantFrom(0, 0.3, 0.75),
		rootRadiusMm: fc.constantFrom(0, 0.4, 1),
		boreMm: fc.constantFrom(0, 10, 20),
		keyway: fc.boolean(),
		keywayDeg: fc.double({ min: -90, max: 90, noNaN: true }),
		bolts: fc.boolean(),
		indexMarkDeg: fc.constantFrom(null, 0, 15, -40),
		label: fc.constantFrom('', 'A', 'crank 60-2', 'Wheel 12.0203'),
		rotation: fc.constantFrom('cw' as const, 'ccw' as const)
	})
	.map(
		(g): WheelSpec =>
			exampleSpec({
				pattern: { kind: 'missing', teeth: g.teeth, missing: Math.min(g.missing, g.teeth - 1) },
				odMm: g.odMm,
				depthMm: g.depthMm,
				tipRadiusMm: g.tipRadiusMm,
				rootRadiusMm: g.rootRadiusMm,
				boreMm: g.boreMm,
				keyway: g.keyway && g.boreMm > 0 ? { widthMm: 4, depthMm: 1.8, source: 'custom keyway' } : null,
				keywayDeg: g.keywayDeg,
				bolts: g.bolts ? { count: 3, pcdMm: g.odMm * 0.55, holeMm: 4, clockDeg: 10 } : null,
				indexMarkDeg: g.indexMarkDeg,
				label: g.label,
				rotation: g.rotation
			})
	)
	.filter((spec) => summarize(spec, 'mm', running).ok);

describe('the wheel DXF', () => {
	it("is makerjs's toDXF of the wheel's model, in mm and in inches", () => {
		fc.assert(
			fc.property(specs, fc.constantFrom('mm' as const, 'in' as const), (spec, units) => {
				expect(wheelDxf(spec, units)).toBe(makerjs.exporter.toDXF(wheelModel(spec, units), dxfOptions(spec, units)));
			}),
			{ numRuns: 300 }
		);
		// A labelled wheel is a thousand LINE entities or so through makerjs's writer.
	}, 120_000);

	it('has the parts a cutting shop reads: units, both layers, closed outline, the label', () => {
		const spec = exampleSpec({ label: 'crank', indexMarkDeg: 0, boreMm: 20 });
		const dxf = wheelDxf(spec, 'mm').split('\n');
		// Group code 9 $INSUNITS, then 70 with 4 = millimetres (AutoCAD DXF reference, HEADER section).
		expect(dxf.slice(dxf.indexOf('$INSUNITS'), dxf.indexOf('$INSUNITS') + 3)).toEqual(['$INSUNITS', '70', '4']);
		expect(dxf.filter((l, i) => l === 'LAYER' && dxf[i - 1] === '0').length).toBe(2);
		// 35 teeth of a 36-1 wheel with sharp corners: a tip arc and a root arc each; the bore, one CIRCLE.
		expect(dxf.filter((l, i) => l === 'ARC' && dxf[i - 1] === '0').length).toBe(70);
		expect(dxf.filter((l, i) => l === 'CIRCLE' && dxf[i - 1] === '0').length).toBe(1);
		// The label is outlines on ETCH, not a TEXT entity each reader would set in its own font.
		expect(dxf.filter((l, i) => l === 'TEXT' && dxf[i - 1] === '0')).toEqual([]);
		expect(dxf).not.toContain('crank');
		const etchLines = dxf.filter((l, i) => l === 'LINE' && dxf[i - 1] === '0' && dxf[i + 2] === 'ETCH').length;
		expect(etchLines).toBeGreaterThan(50);
		expect(dxf.at(-1)).toBe('EOF');
	});
});
