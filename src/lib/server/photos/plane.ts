// The wheel's plane from its tip ellipse: a pinhole camera (focal length from the image size, the
// principal point at the image's middle) sees a circle as an ellipse; the cone through that ellipse
// gives the plane's normal up to a two-way ambiguity (circle pose from a conic, textbook projective
// geometry). Turning a virtual camera to face the plane makes the ellipse a circle, whose centre
// and radius then give the homography from the wheel's unit frame (ρ = 1 at the tips, angles ccw)
// to the photo. Unlike an affine stretch, this puts the wheel's centre and its equal angles where
// perspective puts them.
import type { Pt } from './fit';
import { eigenSym, type Conic } from './conic';

/** 3x3 row-major: unit frame (u, v, 1), v up, to image px (y down). */
export type Homography = [number, number, number, number, number, number, number, number, number];

export interface Camera {
	/** Focal length in px. */
	f: number;
	/** Principal point in px. */
	px: number;
	py: number;
}

/** A phone's main camera (~26 mm equivalent): f ≈ 0.8 x the long side (the brief's figure). */
export const phoneCamera = (width: number, height: number): Camera => ({ f: 0.8 * Math.max(width, height), px: width / 2, py: height / 2 });

export function mapPoint(h: Homography, u: number, v: number): Pt {
	const w = h[6] * u + h[7] * v + h[8];
	return { x: (h[0] * u + h[1] * v + h[2]) / w, y: (h[3] * u + h[4] * v + h[5]) / w };
}

/** Image point to the unit frame (u, v), by the inverse homography. */
export function unmapPoint(h: Homography, p: Pt): Pt {
	const [a, b, c, d, e, f, g, k, l] = h;
	const i0 = e * l - f * k;
	const i1 = c * k - b * l;
	const i2 = b * f - c * e;
	const i3 = f * g - d * l;
	const i4 = a * l - c * g;
	const i5 = c * d - a * f;
	const i6 = d * k - e * g;
	const i7 = b * g - a * k;
	const i8 = a * e - b * d;
	const w = i6 * p.x + i7 * p.y + i8;
	return { x: (i0 * p.x + i1 * p.y + i2) / w, y: (i3 * p.x + i4 * p.y + i5) / w };
}

const mul = (a: number[][], b: number[][]) => a.map((r) => b[0]!.map((_, j) => r.reduce((s, v, k) => s + v * b[k]![j]!, 0)));
const tr = (a: number[][]) => a[0]!.map((_, j) => a.map((r) => r[j]!));
const unit = (v: number[]) => {
	const n = Math.hypot(...v);
	return v.map((x) => x / n);
};
const cross = (a: number[], b: number[]) => [a[1]! * b[2]! - a[2]! * b[1]!, a[2]! * b[0]! - a[0]! * b[2]!, a[0]! * b[1]! - a[1]! * b[0]!];

/**
 * The two homographies (the two plane normals a conic allows; one when the wheel faces the
 * camera) from the unit frame to the image, for the tip ellipse `q` in image px.
 */
export function circlePoses(q: Conic, cam: Camera): Homography[] {
	const [a, b, c, d, e, f] = q;
	const Q = [
		[a, b / 2, d / 2],
		[b / 2, c, e / 2],
		[d / 2, e / 2, f]
	];
	const K = [
		[cam.f, 0, cam.px],
		[0, cam.f, cam.py],
		[0, 0, 1]
	];
	// The cone in camera coordinates, scaled to unit size so the eigen tolerance means something.
	let cone = mul(tr(K), mul(Q, K));
	const size = Math.max(...cone.flat().map(Math.abs));
	cone = cone.map((r) => r.map((v) => v / size));
	const { values, vectors } = eigenSym(cone);
	let vals = values;
	if (vals.filter((v) => v > 0).length < 2) vals = vals.map((v) => -v);
	if (vals.filter((v) => v > 0).length !== 2) return [];
	const order = [0, 1, 2].sort((i, j) => vals[j]! - vals[i]!);
	const [i1, i2, i3] = order as [number, number, number];
	const [l1, l2, l3] = [vals[i1]!, vals[i2]!, vals[i3]!];
	const col = (i: number) => vectors.map((r) => r[i]!);
	const [v1, v3] = [col(i1), col(i3)];
	const g1 = Math.sqrt(Math.max(0, (l1 - l2) / (l1 - l3)));
	const g3 = Math.sqrt(Math.max(0, (l2 - l3) / (l1 - l3)));
	const signs = g1 < 1e-4 ? [1] : [1, -1];
	const poses: Homography[] = [];
	for (const s of signs) {
		let n = [0, 1, 2].map((k) => s * g1 * v1[k]! + g3 * v3[k]!);
		if (n[2]! < 0) n = n.map((x) => -x);
		n = unit(n);
		// The virtual camera looks along n, its x axis as close to the photo's as it can be.
		const e1 = unit([1 - n[0]! * n[0]!, -n[0]! * n[1]!, -n[0]! * n[2]!]);
		const e2 = cross(n, e1);
		const R = [e1, e2, n];
		const Qv = mul(R, mul(cone, tr(R)));
		const A = (Qv[0]![0]! + Qv[1]![1]!) / 2;
		const xc = -Qv[0]![2]! / A;
		const yc = -Qv[1]![2]! / A;
		const r2 = xc * xc + yc * yc - Qv[2]![2]! / A;
		if (!(r2 > 0)) continue;
		const r = Math.sqrt(r2);
		const S = [
			[r, 0, xc],
			[0, -r, yc],
			[0, 0, 1]
		];
		const H = mul(K, mul(tr(R), S)).flat();
		const scale = H[8]!;
		poses.push(H.map((v) => v / scale) as Homography);
	}
	return poses;
}

/** The homography of a plain affine ellipse (no perspective): centre plus the axes. */
export function affinePose(cx: number, cy: number, a: number, b: number, angleDeg: number): Homography {
	const t = (angleDeg * Math.PI) / 180;
	const [co, si] = [Math.cos(t), Math.sin(t)];
	// Unit frame aligned with the image axes (y up): u' = R diag(a, b) R^T u keeps the frame unturned.
	const m00 = a * co * co + b * si * si;
	const m01 = (a - b) * co * si;
	const m11 = a * si * si + b * co * co;
	return [m00, m01, cx, -m01, -m11, cy, 0, 0, 1];
}
