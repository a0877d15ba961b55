// The wheel's true outline from its own edge, so that a finger-placed centre and a tilted camera
// correct themselves before the teeth are read.
import { fitEllipse, outlinePoint, radialError, semiAxes, solve, type Outline, type Pt } from './fit';
import { median } from './ring';

/** Otsu's threshold of a set of values, with the medians of the two classes it splits. */
export function otsu(values: number[]): { threshold: number; low: number; high: number } {
	const s = Float64Array.from(values).sort();
	const lo = s[Math.floor(s.length * 0.005)]!;
	const hi = s[Math.floor(s.length * 0.995)]!;
	const bins = 128;
	const hist = new Array<number>(bins).fill(0);
	const at = (v: number) => Math.max(0, Math.min(bins - 1, Math.floor(((v - lo) / (hi - lo || 1)) * bins)));
	for (const v of s) hist[at(v)]!++;
	let best = -1;
	let bestK = bins / 2;
	const total = s.length;
	const sumAll = hist.reduce((acc, h, i) => acc + h * i, 0);
	let w0 = 0;
	let sum0 = 0;
	for (let i = 0; i < bins - 1; i++) {
		w0 += hist[i]!;
		sum0 += hist[i]! * i;
		const w1 = total - w0;
		if (!w0 || !w1) continue;
		const between = w0 * w1 * (sum0 / w0 - (sumAll - sum0) / w1) ** 2;
		if (between > best) [best, bestK] = [between, i + 1];
	}
	const threshold = lo + ((hi - lo) * bestK) / bins;
	return { threshold, low: median(s.filter((v) => v < threshold)), high: median(s.filter((v) => v >= threshold)) };
}

export interface Refined {
	outline: Outline;
	/** Root radius / tip radius, from the edge's two levels. */
	rootRatio: number;
}

/**
 * A better outline from the edge itself: take the angles where the edge sits at the tips (above
 * Otsu's split of the edge radius against a smooth trend), fit an ellipse to those edge points,
 * drop stragglers, fit again. Works with any number of taps and corrects a finger-placed centre.
 */
export function refineOutline(o: Outline, edge: Float64Array): Refined | null {
	const na = edge.length;
	const idx = [...edge.keys()].filter((i) => !Number.isNaN(edge[i]!));
	if (idx.length < na * 0.8) return null;
	// A trend up to the second harmonic absorbs an off-centre tap and a tilt before the split.
	const M = Array.from({ length: 5 }, () => new Array<number>(5).fill(0));
	const v = new Array<number>(5).fill(0);
	const feat = (i: number) => {
		const phi = (2 * Math.PI * i) / na;
		return [1, Math.cos(phi), Math.sin(phi), Math.cos(2 * phi), Math.sin(2 * phi)];
	};
	for (const i of idx) {
		const f = feat(i);
		for (let a = 0; a < 5; a++) {
			v[a]! += f[a]! * edge[i]!;
			for (let b = 0; b < 5; b++) M[a]![b]! += f[a]! * f[b]!;
		}
	}
	const c = solve(M, v);
	if (!c) return null;
	const ratio = idx.map((i) => edge[i]! / feat(i).reduce((s, f, a) => s + f * c[a]!, 0));
	const split = otsu(ratio);
	const tipCut = (split.threshold + split.high) / 2;
	let points: Pt[] = idx.filter((_, n) => ratio[n]! >= tipCut).map((i) => outlinePoint(o, edge[i]!, (2 * Math.PI * i) / na));
	const [major] = semiAxes(o);
	let fit: Outline | null = null;
	for (let pass = 0; pass < 2; pass++) {
		fit = fitEllipse(points, { x: o.cx, y: o.cy }, major);
		if (!fit) return null;
		const f = fit;
		const errs = points.map((p) => Math.abs(radialError(f, p)));
		const cut = Math.max(0.01, 3 * median(errs));
		points = points.filter((_, n) => errs[n]! <= cut);
	}
	if (!fit) return null;
	const [a, b] = semiAxes(fit);
	if (b / a < 0.7 || Math.hypot(fit.cx - o.cx, fit.cy - o.cy) > 0.35 * major || a > 1.4 * major || a < 0.7 * major) return null;
	return { outline: fit, rootRatio: split.low / split.high };
}
