import { describe, expect, it } from 'vitest';
import { massProperties } from './balance';
import { refusals, warnings } from './checks';
import { exampleSpec } from '$support/example-spec';

const running = { rpm: 8000, gradeMmS: 6.3 };
const codes = (spec = exampleSpec()) => warnings(spec, 'mm', running, massProperties(spec)).map((w) => w.code);

describe('refusals name the field and the range that would work', () => {
	it('missing must be fewer than the positions', () => {
		expect(refusals(exampleSpec({ pattern: { kind: 'missing', teeth: 36, missing: 36 } }), 'mm')).toEqual([
			{ field: 'missing', message: 'missing: at most 35, so that a tooth is left of the 36 positions' }
		]);
	});

	it('tooth roots must stay outside the bore and keyway', () => {
		const [r] = refusals(exampleSpec({ depthMm: 42 }), 'mm');
		expect(r).toEqual({
			field: 'depth',
			message: 'depth: more than 0 and less than 39.00 mm, so the tooth roots keep 1.00 mm from the bore and keyway'
		});
	});

	it('a bore too large for the wheel is the bore’s refusal, not the tooth depth’s', () => {
		// 100 mm OD, 5 mm teeth, 1 mm kept to the roots: the bore may reach 2 × (50 − 5 − 1) = 88 mm (arithmetic).
		const [r] = refusals(exampleSpec({ boreMm: 98 }), 'mm');
		expect(r).toEqual({
			field: 'bore',
			message: 'bore: at most 88.00 mm for 5.00 mm deep teeth, so the tooth roots keep 1.00 mm from it; or make the teeth shallower'
		});
		// A bore wider than the wheel itself, on an inch wheel: 88 mm / 25.4 = 3.465 in.
		expect(refusals(exampleSpec({ boreMm: 120 }), 'in')[0]!.message).toMatch(/^bore: at most 3\.465 in /);
		// With a keyway 6 wide and 2.8 deep the bore's corner counts: (b/2 + 2.8)² + 3² < 44² gives b < 82.195 (arithmetic).
		const keyed = refusals(exampleSpec({ boreMm: 90, keyway: { widthMm: 6, depthMm: 2.8, source: 'custom keyway' } }), 'mm');
		expect(keyed[0]).toMatchObject({ field: 'bore', message: expect.stringMatching(/^bore: at most 82\.20 mm with this keyway/) });
	});

	it("ranges come in the caller's units", () => {
		const [r] = refusals(exampleSpec({ depthMm: 42 }), 'in');
		expect(r!.message).toContain('1.535 in');
	});

	it('bolt holes must clear the bore and the roots, and each other', () => {
		const cutsBore = refusals(exampleSpec({ bolts: { count: 3, pcdMm: 24, holeMm: 6, clockDeg: 0 } }), 'mm');
		expect(cutsBore.map((r) => r.field)).toEqual(['pcd']);
		const overlap = refusals(exampleSpec({ bolts: { count: 24, pcdMm: 60, holeMm: 9, clockDeg: 0 } }), 'mm');
		expect(overlap.map((r) => r.field)).toEqual(['bolts']);
	});

	it('fillets must fit the tooth and the gap', () => {
		const [tip] = refusals(exampleSpec({ tipRadiusMm: 3 }), 'mm');
		expect(tip!.field).toBe('tipRadius');
		expect(tip!.message).toMatch(/^tipRadius: 0 to 2\.\d\d mm/);
	});

	it('an N+1 wheel needs room for the extra tooth', () => {
		expect(refusals(exampleSpec({ pattern: { kind: 'extra', teeth: 12, extraAfter: 0 }, duty: 0.5 }), 'mm').map((r) => r.field)).toEqual([
			'duty'
		]);
	});
});

describe('warnings say why', () => {
	it('a plain 36-1 in 3 mm steel is only warned about balance at 8000 rpm', () => {
		expect(codes()).toEqual(['unbalanced']);
	});

	it('teeth narrower than the material thickness (common cutting practice) and than a sensor face (from memory)', () => {
		const fine = exampleSpec({ pattern: { kind: 'missing', teeth: 120, missing: 2 }, thicknessMm: 3 });
		expect(codes(fine)).toEqual(expect.arrayContaining(['tooth-narrow-for-cutting', 'gap-narrow-for-cutting', 'tooth-narrow-for-sensor']));
	});

	it('shallow teeth for a sensor', () => {
		expect(codes(exampleSpec({ depthMm: 2 }))).toContain('tooth-shallow-for-sensor');
	});

	it('a balanced wheel is not warned about balance', () => {
		expect(codes(exampleSpec({ pattern: { kind: 'missing', teeth: 36, missing: 0 } }))).not.toContain('unbalanced');
	});
});
