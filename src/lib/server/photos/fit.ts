// The wheel's outline in the image: a circle, or an ellipse when the camera was tilted. Shapes are
// kept as a centre plus a symmetric 2x2 matrix A that maps the unit circle onto the tip outline
// (offsets y up). A symmetric A is what a pure tilt gives under weak perspective; any turn of the
// wheel in its own plane is left to the reading (it is the gap angle we are after anyway).

export interface Pt {
	x: number;
	y: number;
}

/** Centre in image px (y down); A = [a11, a12, a21, a22] from the unit circle to offsets y up. */
export interface Outline {
	cx: number;
	cy: number;
	A: [number, number, number, number];
}

export const circleOutline = (c: Pt, r: number): Outline => ({ cx: c.x, cy: c.y, A: [r, 0, 0, r] });

/** Image point (y down) of unit-frame point (ρ cos φ, ρ sin φ). */
export function outlinePoint(o: Outline, rho: number, phi: number): Pt {
	const vx = rho * Math.cos(phi);
	const vy = rho * Math.sin(phi);
	return { x: o.cx + o.A[0] * vx + o.A[1] * vy, y: o.cy - (o.A[2] * vx + o.A[3] * vy) };
}

/** Semi-axes (major first): the major one is the true tip radius of a tilted wheel. */
export function semiAxes(o: Outline): [number, number] {
	const [a, b, , d] = o.A;
	const m = (a + d) / 2;
	const r = Math.sqrt(((a - d) / 2) ** 2 + b * b);
	return [m + r, m - r];
}

/** Solves the n x n system M x = v in place (Gauss with partial pivoting); null when singular. */
export function solve(M: number[][], v: number[]): number[] | null {
	const n = v.length;
	for (let i = 0; i < n; i++) {
		let p = i;
		for (let r = i + 1; r < n; r++) if (Math.abs(M[r]![i]!) > Math.abs(M[p]![i]!)) p = r;
		if (Math.abs(M[p]![i]!) < 1e-12) return null;
		[M[i], M[p]] = [M[p]!, M[i]!];
		[v[i], v[p]] = [v[p]!, v[i]!];
		for (let r = i + 1; r < n; r++) {
			const f = M[r]![i]! / M[i]![i]!;
			for (let c = i; c < n; c++) M[r]![c]! -= f * M[i]![c]!;
			v[r]! -= f * v[i]!;
		}
	}
	const x = new Array<number>(n).fill(0);
	for (let i = n - 1; i >= 0; i--) {
		let s = v[i]!;
		for (let c = i + 1; c < n; c++) s -= M[i]![c]! * x[c]!;
		x[i] = s / M[i]![i]!;
	}
	return x;
}

/** Least squares over rows f(p) = [features], target t: returns the coefficients. */
function leastSquares(points: Pt[], features: (x: number, y: number) => number[], target: (x: number, y: number) => number) {
	const n = features(0, 0).length;
	const M = Array.from({ length: n }, () => new Array<number>(n).fill(0));
	const v = new Array<number>(n).fill(0);
	for (const p of points) {
		const f = features(p.x, p.y);
		const t = target(p.x, p.y);
		for (let i = 0; i < n; i++) {
			v[i]! += f[i]! * t;
			for (let j = 0; j < n; j++) M[i]![j]! += f[i]! * f[j]!;
		}
	}
	return solve(M, v);
}

/** Algebraic circle fit (Kåsa) through points in image px. */
export function fitCircle(points: Pt[]): Outline | null {
	if (points.length < 3) return null;
	const o = points[0]!;
	const s = leastSquares(
		points.map((p) => ({ x: p.x - o.x, y: p.y - o.y })),
		(x, y) => [x, y, 1],
		(x, y) => x * x + y * y
	);
	if (!s) return null;
	const cx = s[0]! / 2;
	const cy = s[1]! / 2;
	const r2 = s[2]! + cx * cx + cy * cy;
	return r2 > 0 ? circleOutline({ x: cx + o.x, y: cy + o.y }, Math.sqrt(r2)) : null;
}

/**
 * Ellipse fit through points in image px: a x² + b xy + c y² + d x + e y = 1 about a point inside
 * (`inside`), scaled by `scale` so the normal equations stay well conditioned. Null unless the conic
 * is a real ellipse.
 */
export function fitEllipse(points: Pt[], inside: Pt, scale: number): Outline | null {
	if (points.length < 5) return null;
	const local = points.map((p) => ({ x: (p.x - inside.x) / scale, y: -(p.y - inside.y) / scale }));
	const s = leastSquares(
		local,
		(x, y) => [x * x, x * y, y * y, x, y],
		() => 1
	);
	if (!s) return null;
	const [a, b, c, d, e] = s as [number, number, number, number, number];
	const det = 4 * a * c - b * b;
	if (!(det > 0) || a <= 0) return null;
	const x0 = (-2 * c * d + b * e) / det;
	const y0 = (b * d - 2 * a * e) / det;
	const g = 1 + a * x0 * x0 + b * x0 * y0 + c * y0 * y0;
	if (!(g > 0)) return null;
	// Q = [[a, b/2], [b/2, c]] / g; A = Q^(-1/2) by its eigen-decomposition.
	const qa = a / g;
	const qb = b / 2 / g;
	const qc = c / g;
	const mean = (qa + qc) / 2;
	const rad = Math.sqrt(((qa - qc) / 2) ** 2 + qb * qb);
	const l1 = mean + rad;
	const l2 = mean - rad;
	if (!(l2 > 0)) return null;
	const theta = 0.5 * Math.atan2(2 * qb, qa - qc);
	const [co, si] = [Math.cos(theta), Math.sin(theta)];
	const [s1, s2] = [scale / Math.sqrt(l1), scale / Math.sqrt(l2)];
	const A: Outline['A'] = [s1 * co * co + s2 * si * si, (s1 - s2) * co * si, (s1 - s2) * co * si, s1 * si * si + s2 * co * co];
	return { cx: inside.x + x0 * scale, cy: inside.y - y0 * scale, A };
}

/** How far a point lies off the outline, as a fraction of the radius (0 on it). */
export function radialError(o: Outline, p: Pt): number {
	// Map back to the unit frame: v = A^-1 u.
	const [a, b, c, d] = o.A;
	const det = a * d - b * c;
	const ux = p.x - o.cx;
	const uy = -(p.y - o.cy);
	const vx = (d * ux - b * uy) / det;
	const vy = (-c * ux + a * uy) / det;
	return Math.hypot(vx, vy) - 1;
}

/** Unit-frame angle (radians) of an image point. */
export function outlineAngle(o: Outline, p: Pt): number {
	const [a, b, c, d] = o.A;
	const det = a * d - b * c;
	const ux = p.x - o.cx;
	const uy = -(p.y - o.cy);
	return Math.atan2((-c * ux + a * uy) / det, (d * ux - b * uy) / det);
}
