// The tip outline as a general conic (a x² + b xy + c y² + d x + e y + f = 0, image px, y down):
// what five or more tapped tips, or the edge points found round the rim, determine. Under
// perspective a circle's image is still an ellipse, but its centre is not the wheel's centre and
// its angles are not the wheel's angles; plane.ts takes it from here.
import type { Pt } from './fit';

export type Conic = [number, number, number, number, number, number];

/** The ellipse as the API answers it: stored-image px, y down; a ≥ b; angleDeg of the a-axis, ccw from +x with y up. */
export interface Ellipse {
	cx: number;
	cy: number;
	a: number;
	b: number;
	angleDeg: number;
}

/** Symmetric eigen-decomposition by Jacobi rotations: values and column vectors. */
export function eigenSym(m: number[][]): { values: number[]; vectors: number[][] } {
	const n = m.length;
	const a = m.map((r) => [...r]);
	const v: number[][] = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 1 : 0)));
	for (let sweep = 0; sweep < 60; sweep++) {
		let off = 0;
		for (let p = 0; p < n; p++) for (let q = p + 1; q < n; q++) off += a[p]![q]! ** 2;
		if (off < 1e-22) break;
		for (let p = 0; p < n; p++)
			for (let q = p + 1; q < n; q++) {
				if (Math.abs(a[p]![q]!) < 1e-300) continue;
				const theta = (a[q]![q]! - a[p]![p]!) / (2 * a[p]![q]!);
				const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
				const c = 1 / Math.sqrt(t * t + 1);
				const s = t * c;
				for (let k = 0; k < n; k++) {
					const akp = a[k]![p]!;
					const akq = a[k]![q]!;
					a[k]![p] = c * akp - s * akq;
					a[k]![q] = s * akp + c * akq;
				}
				for (let k = 0; k < n; k++) {
					const apk = a[p]![k]!;
					const aqk = a[q]![k]!;
					a[p]![k] = c * apk - s * aqk;
					a[q]![k] = s * apk + c * aqk;
				}
				for (let k = 0; k < n; k++) {
					const vkp = v[k]![p]!;
					const vkq = v[k]![q]!;
					v[k]![p] = c * vkp - s * vkq;
					v[k]![q] = s * vkp + c * vkq;
				}
			}
	}
	return { values: a.map((r, i) => r[i]!), vectors: v };
}

/**
 * Least-squares conic through points (five determine it; more are averaged): the unit-norm
 * coefficient vector minimising the algebraic error, after moving the points to their centroid and
 * scaling them to about 1 (Hartley's normalisation, so the result does not depend on image size).
 */
export function fitConic(points: readonly Pt[]): Conic | null {
	if (points.length < 5) return null;
	let mx = 0;
	let my = 0;
	for (const p of points) [mx, my] = [mx + p.x / points.length, my + p.y / points.length];
	let s = 0;
	for (const p of points) s += Math.hypot(p.x - mx, p.y - my) / points.length;
	if (!(s > 0)) return null;
	const M = Array.from({ length: 6 }, () => new Array<number>(6).fill(0));
	for (const p of points) {
		const x = (p.x - mx) / s;
		const y = (p.y - my) / s;
		const f = [x * x, x * y, y * y, x, y, 1];
		for (let i = 0; i < 6; i++) for (let j = 0; j < 6; j++) M[i]![j]! += f[i]! * f[j]!;
	}
	const { values, vectors } = eigenSym(M);
	let k = 0;
	for (let i = 1; i < 6; i++) if (values[i]! < values[k]!) k = i;
	const [A, B, C, D, E, F] = vectors.map((r) => r[k]!) as Conic;
	// Undo the normalisation: x' = (x - mx) / s.
	const a = A / (s * s);
	const b = B / (s * s);
	const c = C / (s * s);
	const d = D / s - 2 * a * mx - b * my;
	const e = E / s - 2 * c * my - b * mx;
	const f = F + a * mx * mx + b * mx * my + c * my * my - (D / s) * mx - (E / s) * my;
	return [a, b, c, d, e, f];
}

/** Centre, semi-axes and angle of a conic that is a real ellipse; null for anything else. */
export function conicEllipse(q: Conic): Ellipse | null {
	const [a, b, c, d, e, f] = q;
	const det = 4 * a * c - b * b;
	if (!(det > 0)) return null;
	const cx = (b * e - 2 * c * d) / det;
	const cy = (b * d - 2 * a * e) / det;
	// Value at the centre: the conic is (p - c)^T S (p - c) = -g with S = [[a, b/2], [b/2, c]].
	const g = f + (d * cx + e * cy) / 2;
	const mean = (a + c) / 2;
	const rad = Math.hypot((a - c) / 2, b / 2);
	const l1 = mean + rad;
	const l2 = mean - rad;
	if (!(-g / l1 > 0) || !(-g / l2 > 0)) return null;
	// A conic scaled by a negative number is the same ellipse with its eigenvalues' order turned
	// round: the long axis then belongs to the larger one.
	const flip = g > 0;
	const major = Math.sqrt(-g / (flip ? l1 : l2));
	const minor = Math.sqrt(-g / (flip ? l2 : l1));
	// Eigenvector of the long axis's eigenvalue, in y-down image coordinates.
	const t = 0.5 * Math.atan2(b, a - c) + (flip ? 0 : Math.PI / 2);
	let angleDeg = (-t * 180) / Math.PI;
	angleDeg = ((angleDeg % 180) + 180) % 180;
	return { cx, cy, a: major, b: minor, angleDeg };
}

/** The conic of an ellipse (inverse of conicEllipse), scaled so that f = -1 at unit size. */
export function ellipseConic(el: Ellipse): Conic {
	const t = (-el.angleDeg * Math.PI) / 180;
	const [co, si] = [Math.cos(t), Math.sin(t)];
	const ia = 1 / (el.a * el.a);
	const ib = 1 / (el.b * el.b);
	const a = co * co * ia + si * si * ib;
	const b = 2 * co * si * (ia - ib);
	const c = si * si * ia + co * co * ib;
	const d = -2 * a * el.cx - b * el.cy;
	const e = -2 * c * el.cy - b * el.cx;
	const f = a * el.cx * el.cx + b * el.cx * el.cy + c * el.cy * el.cy - 1;
	return [a, b, c, d, e, f];
}

/**
 * How far a point lies off an ellipse, as a fraction of its size (0 on it, + outside): the ratio of
 * its distance from the centre to the ellipse's along the same ray, less 1.
 */
export function ellipseError(el: Ellipse, p: Pt): number {
	const t = (el.angleDeg * Math.PI) / 180;
	const dx = p.x - el.cx;
	const dy = -(p.y - el.cy);
	const u = (dx * Math.cos(t) + dy * Math.sin(t)) / el.a;
	const v = (-dx * Math.sin(t) + dy * Math.cos(t)) / el.b;
	return Math.hypot(u, v) - 1;
}

/** Point of the ellipse at parameter φ (radians, ccw with y up from the a-axis), scaled by ρ. */
export function ellipsePoint(el: Ellipse, rho: number, phi: number): Pt {
	const t = (el.angleDeg * Math.PI) / 180;
	const u = rho * el.a * Math.cos(phi);
	const v = rho * el.b * Math.sin(phi);
	return { x: el.cx + u * Math.cos(t) - v * Math.sin(t), y: el.cy - (u * Math.sin(t) + v * Math.cos(t)) };
}
