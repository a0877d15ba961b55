// The test oracle for a missing-tooth wheel's balance, written from the geometry alone (no imports
// from src): first moments ∬ r dA of the material the gap, a keyway and holes take away, as vectors
// in wheel degrees (from tooth 0's leading edge in the sense of rotation; tooth k spans
// [k·p, k·p + w], design.md). A plate that is whole and round is balanced, so the wheel's
// unbalance is minus the sum of what was taken away.

export type Vec = { x: number; y: number };
const rad = (d: number) => (d * Math.PI) / 180;
const add = (a: Vec, b: Vec): Vec => ({ x: a.x + b.x, y: a.y + b.y });
export const polarVec = (length: number, deg: number): Vec => ({ x: length * Math.cos(rad(deg)), y: length * Math.sin(rad(deg)) });
export const angleOf = (v: Vec) => ((((Math.atan2(v.y, v.x) * 180) / Math.PI) % 360) + 360) % 360;

/** One sharp-cornered tooth between radii r and R from angle a to a + w: ∫∫ (cos θ, sin θ) ρ² dρ dθ. */
function toothMoment(rootR: number, tipR: number, fromDeg: number, widthDeg: number): Vec {
	const k = (tipR ** 3 - rootR ** 3) / 3;
	const [a, b] = [rad(fromDeg), rad(fromDeg + widthDeg)];
	return { x: k * (Math.sin(b) - Math.sin(a)), y: k * (Math.cos(a) - Math.cos(b)) };
}

/** The missing teeth of an N-M wheel: positions N−M … N−1 (the gap ends at tooth 0's leading edge). */
export function gapMoment(w: { teeth: number; missing: number; odMm: number; depthMm: number; duty: number }): Vec {
	const p = 360 / w.teeth;
	let sum: Vec = { x: 0, y: 0 };
	for (let k = w.teeth - w.missing; k < w.teeth; k++) sum = add(sum, toothMoment(w.odMm / 2 - w.depthMm, w.odMm / 2, k * p, w.duty * p));
	return sum;
}

/** The area a tooth takes: a ring sector. */
export const toothArea = (w: { teeth: number; odMm: number; depthMm: number; duty: number }) =>
	(rad((w.duty * 360) / w.teeth) / 2) * ((w.odMm / 2) ** 2 - (w.odMm / 2 - w.depthMm) ** 2);

/**
 * A parallel keyway of width b cut into a bore of radius rb, its flat bottom rb + t2 from the
 * centre on its centre line (the hub depth t2 of DIN 6885-1, measured there): the strip |x| ≤ b/2
 * between the bore's arc and the flat. Along its centre line, ∫ ((rb+t2)² − (rb² − x²))/2 dx.
 */
export function keywayMoment(boreMm: number, widthMm: number, t2Mm: number, atDeg: number): { moment: Vec; areaMm2: number } {
	const rb = boreMm / 2;
	const b = widthMm;
	const along = (((rb + t2Mm) ** 2 - rb ** 2) * b) / 2 + b ** 3 / 24;
	const h = b / 2;
	const arc = h * Math.sqrt(rb * rb - h * h) + rb * rb * Math.asin(h / rb); // ∫ sqrt(rb² − x²) dx over [−h, h]
	return { moment: polarVec(along, atDeg), areaMm2: b * (rb + t2Mm) - arc };
}

/** Round holes of diameter d at radius ρ at the given angles. */
export const holesMoment = (d: number, pcd: number, anglesDeg: number[]): Vec =>
	anglesDeg.reduce((s, a) => add(s, polarVec(((Math.PI * d * d) / 4) * (pcd / 2), a)), { x: 0, y: 0 });

export const sum = (...v: Vec[]): Vec => v.reduce(add, { x: 0, y: 0 });
export const length = (v: Vec) => Math.hypot(v.x, v.y);

/** ISO 21940-11: U_per = 9549·G·m/n, g·mm (G mm/s, m kg, n rpm). */
export const permissibleGmm = (grade: number, massKg: number, rpm: number) => (9549 * grade * massKg) / rpm;
