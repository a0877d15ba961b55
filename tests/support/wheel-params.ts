// Generated wheel parameters over the valid ranges of every field, as the designer and the API
// take them (flat strings, lengths in mm or inches, fractions now and then), for the wheel
// property test and the API fuzz.
import fc from 'fast-check';
import { parseWheel, type WheelParams } from '../../src/lib/schemas/wheel';
import { wheelParams as wheelRegistry } from '../../src/lib/schemas/wheel-params';
import { refusals } from '../../src/lib/trade/checks';
import { clearanceMm, type WheelSpec } from '../../src/lib/trade/wheel';

const MM_PER_IN = 25.4;
const num = (x: number, places: number) => String(Number(x.toFixed(places)));

/**
 * A length as someone types it, kept inside the field's range: mm to 0.001; inches to 0.0001 or,
 * now and then, as a fraction in 64ths (when the rounding keeps it in range).
 */
type LengthField =
	| 'od'
	| 'depth'
	| 'tipRadius'
	| 'rootRadius'
	| 'bore'
	| 'keyWidth'
	| 'keyDepth'
	| 'shaft'
	| 'pcd'
	| 'boltHole'
	| 'balancePcd'
	| 'balanceHole'
	| 'thickness';

/** A length parameter's range in mm, as the wheel's registry gives it. */
function rangeOf(field: LengthField): [number, number] {
	const def = wheelRegistry.get(field);
	if (def?.kind !== 'length') throw new Error(`${field} is not a length`);
	return [def.minMm, def.maxMm];
}

function typed(mm: number, field: LengthField, units: 'mm' | 'in', asFraction: boolean): string {
	const [lo, hi] = rangeOf(field);
	const v = Math.min(hi, Math.max(lo, mm));
	if (units === 'mm') return num(Math.min(hi, Math.max(lo, Number(v.toFixed(3)))), 3);
	const inches = v / MM_PER_IN;
	const whole = Math.floor(inches);
	const n = Math.round((inches - whole) * 64);
	const fractionMm = (whole + n / 64) * MM_PER_IN;
	if (asFraction && fractionMm >= lo && fractionMm <= hi)
		return n === 0 || n === 64 ? String(whole + n / 64) : whole ? `${whole} ${n}/64` : `${n}/64`;
	const decimal = Math.min(hi / MM_PER_IN, Math.max(lo / MM_PER_IN, inches));
	return String(Math.round(decimal * 1e4) / 1e4 + (Math.round(decimal * 1e4) / 1e4 < lo / MM_PER_IN ? 1e-4 : 0));
}

const unit = fc.double({ min: 0, max: 1, noNaN: true });

/** Flat wheel parameters within every field's range; the cross-field checks refuse some, as they would for a user. */
export const wheelParams = fc
	.record({
		units: fc.constantFrom('mm', 'mm', 'mm', 'in'),
		fractions: fc.boolean(),
		pattern: fc.constantFrom('missing', 'missing', 'missing', 'custom', 'single', 'extra'),
		teeth: fc.oneof(fc.integer({ min: 1, max: 72 }), fc.integer({ min: 1, max: 720 })),
		missing: unit,
		gaps: fc.array(unit, { maxLength: 6 }),
		extraAfter: unit,
		duty: fc.double({ min: 0.05, max: 0.95, noNaN: true }),
		od: fc.oneof(fc.double({ min: 10, max: 300, noNaN: true }), fc.double({ min: 10, max: 2000, noNaN: true })),
		depth: unit,
		bore: fc.option(unit, { nil: undefined }),
		keyway: fc.constantFrom('none', 'none', 'custom', 'din6885', 'b17.1', 'woodruff'),
		keyWidth: unit,
		keyDepth: unit,
		woodruff: fc.constantFrom('204', '305', '404', '406', '506', '606', '608', '807', '1210'),
		keywayAngle: fc.double({ min: -360, max: 360, noNaN: true }),
		tipRadius: fc.option(unit, { nil: undefined }),
		rootRadius: fc.option(unit, { nil: undefined }),
		bolts: fc.oneof(fc.constant(0), fc.integer({ min: 1, max: 6 }), fc.integer({ min: 1, max: 24 })),
		holes: fc.record({ pcd: unit, size: unit, angle: fc.double({ min: -360, max: 360, noNaN: true }) }),
		balance: fc.oneof(fc.constant(0), fc.constant(0), fc.integer({ min: 1, max: 8 })),
		balanceHoles: fc.record({
			pcd: unit,
			size: unit,
			angle: fc.double({ min: -360, max: 360, noNaN: true }),
			spacing: fc.option(fc.double({ min: 0, max: 180, noNaN: true }), { nil: undefined, freq: 2 })
		}),
		mark: fc.option(fc.double({ min: -360, max: 360, noNaN: true }), { nil: undefined }),
		rotation: fc.constantFrom('cw', 'ccw'),
		// Long labels find room only on large wheels; short and empty ones are what most people etch.
		label: fc.oneof({ arbitrary: fc.constant(''), weight: 3 }, fc.string({ maxLength: 12 }), fc.string({ maxLength: 40 }))
	})
	.map((g): WheelParams => {
		const u = g.units as 'mm' | 'in';
		const L = (mm: number, field: LengthField) => typed(mm, field, u, g.fractions);
		const R = g.od / 2;
		const toothMm = (g.duty * Math.PI * g.od) / g.teeth;
		const gapMm = ((1 - g.duty) * Math.PI * g.od) / g.teeth;
		const boreMm = g.bore === undefined ? 0 : g.bore * R * 0.8;
		const inner = boreMm / 2;
		const depthMm = 0.2 + g.depth * Math.max(0, (R - inner) * 0.6 - 0.2);
		const root = R - depthMm;
		const p: WheelParams = {
			units: u,
			pattern: g.pattern,
			teeth: String(g.teeth),
			duty: num(g.pattern === 'extra' ? 0.05 + g.duty * 0.4 : g.duty, 3),
			od: L(g.od, 'od'),
			depth: L(depthMm, 'depth'),
			bore: L(boreMm, 'bore'),
			keywayAngle: num(g.keywayAngle, 2),
			rotation: g.rotation,
			label: g.label,
			mark: g.mark === undefined ? 'none' : num(g.mark, 2),
			thickness: L(3, 'thickness')
		};
		if (g.pattern === 'missing') p.missing = String(Math.floor(g.missing * Math.min(g.teeth - 1, 8)));
		if (g.pattern === 'custom') p.gaps = g.gaps.map((f) => Math.floor(f * g.teeth)).join(',');
		if (g.pattern === 'extra') p.extraAfter = String(Math.floor(g.extraAfter * g.teeth));
		if (g.tipRadius !== undefined) p.tipRadius = L(g.tipRadius * Math.min(depthMm, toothMm / 2), 'tipRadius');
		if (g.rootRadius !== undefined) p.rootRadius = L(g.rootRadius * Math.min(depthMm, gapMm / 2), 'rootRadius');
		if (g.keyway !== 'none' && boreMm > 1) {
			p.keyway = g.keyway;
			if (g.keyway === 'custom') {
				p.keyWidth = L(g.keyWidth * boreMm, 'keyWidth');
				p.keyDepth = L(0.2 + g.keyDepth * Math.max(0, root - inner) * 0.5, 'keyDepth');
			}
			if (g.keyway === 'din6885' || g.keyway === 'b17.1') p.shaft = L(boreMm, 'shaft');
			if (g.keyway === 'woodruff') p.woodruff = g.woodruff;
		}
		// Holes sized to their share of the circle, so most sets fit; some still come too close (refused).
		const c = clearanceMm;
		const holeSet = (count: number, f: { pcd: number; size: number }) => {
			const rho = inner + c + 0.25 + f.pcd * Math.max(0, root - inner - 2 * c - 0.5);
			const radial = 2 * Math.min(rho - inner - c, root - c - rho);
			const around = count > 1 ? 2 * rho * Math.sin(Math.PI / count) - c : radial;
			return { pcd: 2 * rho, size: 0.5 + f.size * Math.max(0, Math.min(radial, around) * 0.9 - 0.5) };
		};
		if (g.bolts) {
			const h = holeSet(g.bolts, g.holes);
			Object.assign(p, { bolts: String(g.bolts), pcd: L(h.pcd, 'pcd'), boltHole: L(h.size, 'boltHole'), boltAngle: num(g.holes.angle, 2) });
		}
		if (g.balance) {
			const b = g.balanceHoles;
			const h = holeSet(g.balance, b);
			Object.assign(p, {
				balanceCount: String(g.balance),
				balancePcd: L(h.pcd, 'balancePcd'),
				balanceHole: L(h.size, 'balanceHole'),
				balanceAngle: num(b.angle, 2)
			});
			if (b.spacing !== undefined) p.balanceSpacing = num(b.spacing, 2);
		}
		return p;
	});

/** The accepted wheel's spec, or null when parsing or the cross-field checks (what summarize refuses on) say no. */
export function acceptedSpec(params: WheelParams): WheelSpec | null {
	const parsed = parseWheel(params);
	if (!parsed.ok) return null;
	return refusals(parsed.value.spec, parsed.value.units).length ? null : parsed.value.spec;
}
