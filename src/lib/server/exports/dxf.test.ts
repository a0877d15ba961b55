import fc from 'fast-check';
import makerjs from 'makerjs';
import { describe, expect, it } from 'vitest';
import { summarize } from '$lib/trade/summary';
import { exampleSpec } from '$support/example-spec';
import type { WheelSpec } from '$lib/trade/wheel';
import { dxfOptions, wheelModel } from '$support/wheel-model';
import { dxfNumber, wheelDxf } from './dxf';

// The reference is makerjs's own DXF writer (makerjs.exporter.toDXF) given the wheel's model: the
// file written straight from the drawing must be the same text, character for character, past two
// differences the test applies to makerjs's text itself: our header (version, code page, units),
// and every angle (group codes 50 and 51) brought into [0, 360).
const sections = (dxf: string) => dxf.split('\n0\nSECTION\n');

/** makerjs's file with each angle value reduced modulo 360, computed here on the text. */
function anglesReduced(dxf: string): string {
	const lines = dxf.split('\n');
	for (let i = 1; i < lines.length; i += 2) {
		if (lines[i - 1] !== '50' && lines[i - 1] !== '51') continue;
		let a = Number(lines[i]);
		while (a >= 360 - 5e-8) a -= 360;
		while (a < -5e-8) a += 360;
		lines[i] = String(Math.abs(a) < 5e-8 ? 0 : Math.round(a * 1e7) / 1e7);
	}
	return lines.join('\n');
}
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
	.map((g): WheelSpec =>
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
				const ours = sections(wheelDxf(spec, units));
				const theirs = sections(anglesReduced(makerjs.exporter.toDXF(wheelModel(spec, units), dxfOptions(spec, units))));
				expect(ours.slice(1)).toEqual(theirs.slice(1));
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
		// $MEASUREMENT 1 = metric; $ACADVER AC1009 = R12; $DWGCODEPAGE ANSI_1252 (DXF reference).
		expect(dxf.slice(dxf.indexOf('$MEASUREMENT'), dxf.indexOf('$MEASUREMENT') + 3)).toEqual(['$MEASUREMENT', '70', '1']);
		expect(dxf.slice(dxf.indexOf('$ACADVER'), dxf.indexOf('$ACADVER') + 3)).toEqual(['$ACADVER', '1', 'AC1009']);
		expect(dxf.slice(dxf.indexOf('$DWGCODEPAGE'), dxf.indexOf('$DWGCODEPAGE') + 3)).toEqual(['$DWGCODEPAGE', '3', 'ANSI_1252']);
		const inches = wheelDxf(spec, 'in').split('\n');
		expect(inches.slice(inches.indexOf('$INSUNITS'), inches.indexOf('$INSUNITS') + 3)).toEqual(['$INSUNITS', '70', '1']);
		expect(inches.slice(inches.indexOf('$MEASUREMENT'), inches.indexOf('$MEASUREMENT') + 3)).toEqual(['$MEASUREMENT', '70', '0']);
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

	it('writes every angle in [0, 360), and nothing past ASCII', () => {
		fc.assert(
			fc.property(specs, fc.constantFrom('mm' as const, 'in' as const), (spec, units) => {
				const dxf = wheelDxf({ ...spec, label: spec.label && `${spec.label} Zündung` }, units);
				const lines = dxf.split('\n');
				// Group codes sit on the even lines; 50 and 51 carry angles (DXF reference, group codes).
				const angles = lines.filter((_, i) => i % 2 === 1 && (lines[i - 1] === '50' || lines[i - 1] === '51')).map(Number);
				expect(angles.filter((a) => !(a >= 0 && a < 360))).toEqual([]);
				expect(/^[\x00-\x7f]*$/.test(dxf)).toBe(true);
			}),
			{ numRuns: 100 }
		);
	});

	it('brings a bore arc from 72.5° to 432.5° into one turn, and writes a label past ASCII as outlines', () => {
		// A 20 mm bore with a 6 mm keyway at 0° (12 o'clock): the bore arc runs round from one keyway
		// wall to the other, the long way, and its end came out as 432.5° or so before.
		const spec = exampleSpec({ label: 'Zündung', boreMm: 20, keyway: { widthMm: 6, depthMm: 2.8, source: 'custom keyway' }, keywayDeg: 0 });
		const lines = wheelDxf(spec, 'mm').split('\n');
		// ARC, then 8 layer, 6 linetype, 10/20 centre, 40 radius, 50 start, 51 end: the one of radius 10.
		const bore = lines.findIndex((l, i) => l === 'ARC' && lines[i + 9] === '40' && lines[i + 10] === '10');
		expect(lines[bore + 11]).toBe('50');
		expect(lines[bore + 13]).toBe('51');
		const [start, end] = [Number(lines[bore + 12]), Number(lines[bore + 14])];
		// The keyway's half-width subtends asin(3 / 10) = 17.46° at the centre: the arc leaves 2 x 17.46°
		// round 90° (12 o'clock) open, i.e. from 107.46° on round to 72.54°.
		expect(start).toBeCloseTo(90 + (Math.asin(3 / 10) * 180) / Math.PI, 3);
		expect(end).toBeCloseTo(90 - (Math.asin(3 / 10) * 180) / Math.PI, 3);
		expect(lines.join('\n')).not.toContain('ndung');
	});
});

// The oracle is makerjs's own rounding and JavaScript's own shortest decimal: the text makerjs's DXF writes.
describe('dxfNumber', () => {
	const reference = (v: number) => String(makerjs.round(v));
	it('writes every number as String(makerjs.round(v)) does (property test over doubles from 1e-9 to 1e9)', () => {
		fc.assert(
			fc.property(fc.double({ min: -1e9, max: 1e9, noNaN: true }), (v) => {
				expect(dxfNumber(v)).toBe(reference(v));
			}),
			// Found by this property: 16 digits of ten-millionths, where the double's shortest decimal drops one.
			{ numRuns: 20_000, examples: [[-586831298.297162]] }
		);
		fc.assert(
			fc.property(fc.double({ min: -1e-3, max: 1e-3, noNaN: true }), (v) => {
				expect(dxfNumber(v)).toBe(reference(v));
			}),
			{ numRuns: 20_000 }
		);
	});
	it.each([
		0, -0, 1e-7, -1e-7, 2.0000001, -12.0000003, 0.0000012, 4e-8, 6e-8, 1e-6, 0.5, -0.5, 359.99999999, 12.30000004, -60.00000005, 1e20,
		123456.7654321
	])('writes %s as makerjs does', (v) => expect(dxfNumber(v)).toBe(reference(v)));
});
