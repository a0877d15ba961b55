// Mass and static unbalance of a wheel, and the balance holes that cancel it.
// Static unbalance U = ρ·t·∬r dA (g·mm), from the exact first moments of the cut outline.
// Permissible residual unbalance, ISO 21940-11 (formerly ISO 1940-1): U_per = 9549·G·m/n g·mm,
// G the balance grade in mm/s, m the rotor mass in kg, n the speed in rpm.
import { contourMoments, polar } from './geometry';
import { perMm3 } from './materials';
import { cutContours, drawDeg, drawWheel, rootRadius, type HoleCircle, type WheelSpec } from './wheel';
import { deg, norm360 } from './units';

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

/**
 * Holes on the heavy side that cancel the unbalance of the wheel without balance holes: as few
 * and as small as fit in the web between the bore (with keyway) and the tooth roots, clear of the
 * bolt circle, hole sizes rounded to 0.1 mm. Null when nothing needs cancelling or nothing fits.
 */
export function balanceHoles(spec: WheelSpec, withoutHoles?: MassProperties): HoleCircle | null {
	const { unbalanceGmm, heavyDeg } = withoutHoles ?? massProperties({ ...spec, balanceHoles: null });
	const gPerMm2 = perMm3(spec.densityGcm3) * spec.thicknessMm;
	const moment = unbalanceGmm / gPerMm2; // mm³ of first moment to take away
	if (moment < 1e-6) return null;

	const margin = Math.max(spec.thicknessMm, 2);
	const inner = spec.boreMm / 2 + (spec.keyway?.depthMm ?? 0) + margin;
	const outer = rootRadius(spec) - margin;
	const bands: [number, number][] = spec.bolts
		? [
				[inner, spec.bolts.pcdMm / 2 - spec.bolts.holeMm / 2 - margin],
				[spec.bolts.pcdMm / 2 + spec.bolts.holeMm / 2 + margin, outer]
			]
		: [[inner, outer]];
	const [lo, hi] = bands.reduce((best, b) => (b[1] - b[0] > best[1] - best[0] ? b : best));
	const maxHole = hi - lo;
	if (maxHole < 1) return null;
	const rc = (lo + hi) / 2;

	for (let count = 1; count <= 8; count++) {
		let hole = Math.sqrt((4 * moment) / (Math.PI * rc * count));
		let spacing = 0;
		for (let i = 0; i < 30; i++) {
			spacing = count > 1 ? deg((hole + margin) / rc) : 0;
			const reach = Array.from({ length: count }, (_, k) => Math.cos(((k - (count - 1) / 2) * spacing * Math.PI) / 180)).reduce((a, b) => a + b, 0);
			hole = Math.sqrt((4 * moment) / (Math.PI * rc * reach));
		}
		if (hole <= maxHole && spacing * (count - 1) <= 150) {
			return { count, pcdMm: 2 * rc, holeMm: Math.round(hole * 10) / 10, clockDeg: norm360(heavyDeg - ((count - 1) / 2) * spacing), spacingDeg: count > 1 ? spacing : undefined };
		}
	}
	return null;
}

/** The centre of a hole, for drawings and tests. */
export const holeAt = (spec: WheelSpec, pcdMm: number, wheelDeg: number) => polar(pcdMm / 2, drawDeg(spec, wheelDeg));
