// Mass and static unbalance of a wheel, and the balance holes that cancel it.
// Static unbalance U = ρ·t·∬r dA (g·mm), from the exact first moments of the cut outline.
// Permissible residual unbalance, ISO 21940-11 (formerly ISO 1940-1): U_per = 9549·G·m/n g·mm,
// G the balance grade in mm/s, m the rotor mass in kg, n the speed in rpm.
import type { Running } from './checks';
import { distanceToPolygon } from './clearance';
import { contourMoments, polar, type Point } from './geometry';
import { perMm3 } from './materials';
import {
	clearanceMm,
	cutContours,
	drawDeg,
	drawWheel,
	holeCenters,
	innerRadius,
	placeLabel,
	rootRadius,
	type HoleCircle,
	type WheelSpec
} from './wheel';
import { deg, norm360, rad, type Units } from './units';

export interface MassProperties {
	areaMm2: number;
	massG: number;
	/** Static unbalance, g·mm, and where its heavy side points (wheel degrees). */
	unbalanceGmm: number;
	heavyDeg: number;
}

export function massProperties(spec: WheelSpec): MassProperties {
	const parts = cutContours(drawWheel(spec)).map(contourMoments);
	const [outer, ...cutouts] = parts.map((m) => (m.area < 0 ? { area: -m.area, mx: -m.mx, my: -m.my } : m));
	const net = cutouts.reduce((a, c) => ({ area: a.area - c.area, mx: a.mx - c.mx, my: a.my - c.my }), outer!);
	const gPerMm2 = perMm3(spec.densityGcm3) * spec.thicknessMm;
	const drawn = deg(Math.atan2(net.my, net.mx));
	return {
		areaMm2: net.area,
		massG: net.area * gPerMm2,
		unbalanceGmm: Math.hypot(net.mx, net.my) * gPerMm2,
		heavyDeg: norm360(spec.rotation === 'cw' ? drawn - 90 : 90 - drawn)
	};
}

/** ISO 21940-11 permissible residual unbalance, g·mm. */
export const permissibleUnbalanceGmm = (gradeMmS: number, massKg: number, rpm: number) => (9549 * gradeMmS * massKg) / rpm;

/** Centrifugal force of an unbalance at a speed: F = U·ω², N. */
export const unbalanceForceN = (unbalanceGmm: number, rpm: number) => unbalanceGmm * 1e-6 * ((2 * Math.PI * rpm) / 60) ** 2;

/** Balance grades of ISO 21940-11 offered to choose from (mm/s). */
export const balanceGrades = [1, 2.5, 6.3, 16, 40] as const;

export interface BalanceSuggestion extends HoleCircle {
	/** The unbalance left with these holes cut, g·mm (exact for the values as given, which are what a form writes back). */
	residualGmm: number;
}

export type BalanceAdvice = { ok: true; holes: BalanceSuggestion } | { ok: false; reason: string };

/** Steps a suggestion is given in, so that writing it into the form changes nothing: hole sizes, pitch circles (mm), angles (°). */
const steps = { mm: { hole: 0.1, pcd: 0.01 }, in: { hole: 0.0254, pcd: 0.00254 }, angle: 0.01 };
const onStep = (v: number, step: number) => Number((Math.round(v / step) * step).toFixed(6));

/**
 * Holes on the heavy side that bring the wheel without balance holes within the permissible
 * residual unbalance of ISO 21940-11 for the grade and rev limit: as few as will do, clear of
 * the bore and keyway, the tooth roots, the bolt holes and the etched label (each by a web of
 * the plate thickness, at least 2 mm, and where that leaves no room, by clearanceMm), sized to
 * 0.1 mm (0.001 in), their circle to 0.01 mm (0.0001 in) and angles to 0.01°, checked with
 * those very values. When no holes do, the reason, said plainly.
 */
export function balanceHoles(spec: WheelSpec, running: Running, units: Units, withoutHoles?: MassProperties): BalanceAdvice {
	const bare = withoutHoles ?? massProperties({ ...spec, balanceHoles: null });
	if (bare.unbalanceGmm <= 0.01) return { ok: false, reason: 'Nothing to cancel: the wheel is balanced as drawn.' };
	const gPerMm2 = perMm3(spec.densityGcm3) * spec.thicknessMm;
	const heavy = polar(bare.unbalanceGmm / gPerMm2, drawDeg(spec, bare.heavyDeg)); // mm³ of first moment to take away
	const moment = Math.hypot(heavy.x, heavy.y);
	const label = placeLabel(spec);
	const bolts = spec.bolts ? holeCenters(spec, spec.bolts) : [];
	const step = steps[units];
	const inner = innerRadius(spec);
	const root = rootRadius(spec);
	let fitted = false;

	function attempt(count: number, rc: number, spacingDeg: number, margin: number): BalanceSuggestion | null {
		const spacing = onStep(spacingDeg, steps.angle);
		const reach = Array.from({ length: count }, (_, k) => Math.cos(rad((k - (count - 1) / 2) * spacing))).reduce((a, b) => a + b, 0);
		if (reach <= 0) return null;
		const hole = onStep(Math.sqrt((4 * moment) / (Math.PI * rc * reach)), step.hole);
		if (hole < 0.5) return null;
		// The size on its step, the circle takes up the difference.
		const pcd = onStep((2 * moment) / ((Math.PI * hole * hole) / 4) / reach, step.pcd);
		const holes: HoleCircle = {
			count,
			pcdMm: pcd,
			holeMm: hole,
			clockDeg: onStep(norm360(bare.heavyDeg - ((count - 1) / 2) * spacing), steps.angle),
			spacingDeg: count > 1 ? spacing : undefined
		};
		const r = pcd / 2;
		if (r - hole / 2 < inner + margin - 1e-9 || r + hole / 2 > root - margin + 1e-9) return null;
		const centers = holeCenters(spec, holes);
		const clearOf = (p: Point, q: Point, qMm: number) => Math.hypot(p.x - q.x, p.y - q.y) >= (hole + qMm) / 2 + margin - 1e-9;
		if (!centers.every((p, i) => centers.slice(i + 1).every((q) => clearOf(p, q, hole)))) return null;
		if (!centers.every((p) => bolts.every((q) => clearOf(p, q, spec.bolts!.holeMm)))) return null;
		if (label && !centers.every((p) => distanceToPolygon(p, label.corners) >= hole / 2 + margin - 1e-9)) return null;
		fitted = true;
		const area = (Math.PI * hole * hole) / 4;
		const taken = centers.reduce((a, c) => ({ x: a.x + c.x * area, y: a.y + c.y * area }), { x: 0, y: 0 });
		const residualGmm = Math.hypot(heavy.x - taken.x, heavy.y - taken.y) * gPerMm2;
		const massKg = (bare.massG - count * area * gPerMm2) / 1000;
		// Within the limit with room to spare, for arithmetic done another way (a reader, a CAM program).
		return residualGmm <= 0.5 * permissibleUnbalanceGmm(running.gradeMmS, massKg, running.rpm) ? { ...holes, residualGmm } : null;
	}

	for (const margin of [Math.max(spec.thicknessMm, 2), clearanceMm]) {
		if (root - inner - 2 * margin < 0.5) continue;
		const radii = Array.from({ length: 24 }, (_, i) => root - margin - ((root - inner - 2 * margin) * (i + 0.5)) / 24);
		for (let count = 1; count <= 8; count++) {
			// Closest together first; spread wider, they can stand either side of the label.
			const spreads = count === 1 ? [0] : Array.from({ length: 8 }, (_, i) => i / 7);
			for (const spread of spreads) {
				for (const rc of radii) {
					const reachGuess = count;
					const d = Math.sqrt((4 * moment) / (Math.PI * rc * reachGuess));
					const tight = deg(2 * Math.asin(Math.min(1, (d + margin) / (2 * rc))));
					const widest = 150 / Math.max(1, count - 1);
					if (count > 1 && tight > widest) continue;
					const found = attempt(count, rc, count > 1 ? tight * 1.05 + (widest - tight * 1.05) * spread : 0, margin);
					if (found) return { ok: true, holes: found };
				}
			}
		}
	}
	const allowed = permissibleUnbalanceGmm(running.gradeMmS, bare.massG / 1000, running.rpm);
	return {
		ok: false,
		reason: fitted
			? `No set of up to 8 balance holes, sized to ${units === 'in' ? '0.001 in' : '0.1 mm'}, brings the residual within the ${allowed.toFixed(2)} g·mm ISO 21940-11 allows for G ${running.gradeMmS} at ${running.rpm} rpm: balance the assembly instead.`
			: `No room for balance holes clear of the bore and keyway, the tooth roots, the bolt holes and the label: balance the assembly instead.`
	};
}

/** The centre of a hole, for drawings and tests. */
export const holeAt = (spec: WheelSpec, pcdMm: number, wheelDeg: number) => polar(pcdMm / 2, drawDeg(spec, wheelDeg));
