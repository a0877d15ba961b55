// The tip ellipse from the wheel's own edges, for a few taps or to sharpen many: colour edges on
// rays out from the tapped centre, then RANSAC over conics through five of them, kept only when
// they pass by the tapped tips and centre. A mat's grid line, wood grain or a finger gives edges
// too, but not an ellipse through the tips with edges all round it; and of the wheel's own
// ellipses (bore, root, tips) the outermost that fits the taps is the tips'.
import { conicEllipse, ellipseError, fitConic, type Conic, type Ellipse } from './conic';
import { solve, type Pt } from './fit';
import { median, type Grey } from './ring';
import { sampleInto } from './sample';

export interface EdgePoint extends Pt {
	ray: number;
	strength: number;
}

const RAYS = 480;

/** Colour gradient maxima along rays from the centre, radii from..to px: at most three a ray. */
export function rayEdges(img: Grey, centre: Pt, from: number, to: number): EdgePoint[] {
	const ch = img.channels;
	const steps = Math.max(8, Math.ceil(to - from));
	const col = new Float32Array((steps + 1) * ch);
	const grad = new Float32Array(steps + 1);
	const found: EdgePoint[] = [];
	for (let ray = 0; ray < RAYS; ray++) {
		const a = (2 * Math.PI * ray) / RAYS;
		const [dx, dy] = [Math.cos(a), -Math.sin(a)];
		for (let s = 0; s <= steps; s++) {
			const r = from + ((to - from) * s) / steps;
			sampleInto(img, centre.x + r * dx, centre.y + r * dy, col, s * ch);
		}
		// Gradient over all channels across two samples each side (light smoothing against noise).
		let max = 0;
		for (let s = 0; s <= steps; s++) {
			if (s < 2 || s > steps - 2) {
				grad[s] = 0;
				continue;
			}
			let g2 = 0;
			for (let n = 0; n < ch; n++) {
				const d = col[(s + 1) * ch + n]! + col[(s + 2) * ch + n]! - col[(s - 1) * ch + n]! - col[(s - 2) * ch + n]!;
				g2 += d * d;
			}
			grad[s] = Number.isNaN(g2) ? 0 : Math.sqrt(g2) / 4;
			if (grad[s]! > max) max = grad[s]!;
		}
		const peaks: EdgePoint[] = [];
		for (let s = 2; s < steps - 1; s++) {
			const g = grad[s]!;
			if (g < 5 || g < 0.3 * max || g < grad[s - 1]! || g <= grad[s + 1]!) continue;
			// Sub-sample peak by a parabola through the three.
			const den = grad[s - 1]! - 2 * g + grad[s + 1]!;
			const off = den < 0 ? (0.5 * (grad[s - 1]! - grad[s + 1]!)) / den : 0;
			const r = from + ((to - from) * (s + off)) / steps;
			peaks.push({ x: centre.x + r * dx, y: centre.y + r * dy, ray, strength: g });
		}
		peaks.sort((p, q) => q.strength - p.strength);
		found.push(...peaks.slice(0, 3));
	}
	return found;
}

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

/** Small seeded generator (mulberry32): the same photo and taps always give the same fit. */
function random(seed: number) {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

export interface EdgeFit {
	conic: Conic;
	ellipse: Ellipse;
	/** Fraction of the rays with an edge on the ellipse. */
	support: number;
	/** Other outlines the edges support nearly as well, best first. */
	alternatives?: EdgeFit[];
}

export interface FitGuide {
	centre: Pt;
	tips: Pt[];
	/** Tip distance guess, px. */
	radius: number;
	/** How far a tapped tip may sit off the ellipse, as a fraction of its size. */
	tipTolerance: number;
	/**
	 * How far the ellipse's centre may sit from the tapped centre, px: perspective moves it only a
	 * few per cent of the radius at the tilts a phone photo has, the rest is the tap's own error.
	 */
	centreTolerance?: number;
	/** Outlines to try before the random ones: the taps' own ellipse, a circle through the tapped tip. */
	seeds?: Ellipse[];
}

function support(points: EdgePoint[], el: Ellipse, tol: number): { rays: number; inliers: EdgePoint[] } {
	const hit = new Uint8Array(RAYS);
	const inliers: EdgePoint[] = [];
	// ellipseError without a trig call a point: the unit-frame radius from the ellipse's own axes.
	const t = (el.angleDeg * Math.PI) / 180;
	const [c, s] = [Math.cos(t) / el.a, Math.sin(t) / el.a];
	const [c2, s2] = [Math.cos(t) / el.b, Math.sin(t) / el.b];
	const [lo, hi] = [(1 - tol) ** 2, (1 + tol) ** 2];
	for (const p of points) {
		const dx = p.x - el.cx;
		const dy = el.cy - p.y;
		const u = dx * c + dy * s;
		const v = -dx * s2 + dy * c2;
		const r2 = u * u + v * v;
		if (r2 > lo && r2 < hi) {
			hit[p.ray] = 1;
			inliers.push(p);
		}
	}
	let rays = 0;
	for (const v of hit) rays += v;
	return { rays, inliers };
}

function plausible(el: Ellipse, g: FitGuide): boolean {
	return (
		el.b / el.a >= 0.55 &&
		el.a <= 1.9 * g.radius &&
		el.b >= 0.5 * g.radius &&
		Math.hypot(el.cx - g.centre.x, el.cy - g.centre.y) <= Math.min(0.35 * el.a, g.centreTolerance ?? Infinity) &&
		g.tips.every((t) => Math.abs(ellipseError(el, t)) <= g.tipTolerance)
	);
}

/**
 * The upper envelope of the outermost edge per ray: a smooth trend (off-centre and tilt, up to the
 * second harmonic) removed, Otsu's split keeps the rays whose edge sits out at the tips, and an
 * ellipse through those. A deep-toothed wheel with narrow teeth has too few tip rays for random
 * samples of five to find; this finds them all at once.
 */
/** Per ray, the outermost of its strong edges (noise and grain make weaker ones) near the taps. */
function outermost(points: EdgePoint[], g: FitGuide): EdgePoint[] {
	const strongest = new Float64Array(RAYS);
	for (const p of points) strongest[p.ray] = Math.max(strongest[p.ray]!, p.strength);
	const outer = new Map<number, EdgePoint>();
	for (const p of points) {
		const r = Math.hypot(p.x - g.centre.x, p.y - g.centre.y);
		if (r < 0.6 * g.radius || r > 1.45 * g.radius || p.strength < 0.5 * strongest[p.ray]!) continue;
		const o = outer.get(p.ray);
		if (!o || r > Math.hypot(o.x - g.centre.x, o.y - g.centre.y)) outer.set(p.ray, p);
	}
	return [...outer.values()];
}

function envelope(pts: EdgePoint[], g: FitGuide): EdgePoint[] {
	if (pts.length < RAYS * 0.3) return [];
	const rOf = (p: EdgePoint) => Math.hypot(p.x - g.centre.x, p.y - g.centre.y);
	const M = Array.from({ length: 5 }, () => new Array<number>(5).fill(0));
	const v = new Array<number>(5).fill(0);
	const feat = (p: EdgePoint) => {
		const phi = (2 * Math.PI * p.ray) / RAYS;
		return [1, Math.cos(phi), Math.sin(phi), Math.cos(2 * phi), Math.sin(2 * phi)];
	};
	for (const p of pts) {
		const f = feat(p);
		for (let a = 0; a < 5; a++) {
			v[a]! += f[a]! * rOf(p);
			for (let b = 0; b < 5; b++) M[a]![b]! += f[a]! * f[b]!;
		}
	}
	const c = solve(M, v);
	if (!c) return [];
	const ratio = pts.map((p) => rOf(p) / feat(p).reduce((s, f, a) => s + f * c[a]!, 0));
	const split = otsu(ratio);
	return pts.filter((_, n) => ratio[n]! >= split.threshold);
}

/** The tip ellipse: RANSAC over the edges, refined on its inliers, then the outermost ellipse of the same shape that still fits. */
export function fitTipEllipse(points: EdgePoint[], g: FitGuide, seed = 17): EdgeFit | null {
	if (points.length < 20) return null;
	const rnd = random(seed);
	const tol = (el: Ellipse) => Math.max(0.005, 2.5 / el.b);
	let best: { el: Ellipse; rays: number } | null = null;
	// The best few outlines that differ from each other (by more than the fit's tolerance).
	const runnersUp: { el: Ellipse; rays: number }[] = [];
	const similar = (p: Ellipse, q: Ellipse, by: number) =>
		Math.hypot(p.cx - q.cx, p.cy - q.cy) < by * q.a && Math.abs(p.a / q.a - 1) < by && Math.abs(p.b / q.b - 1) < by;
	const consider = (el: Ellipse, rays: number) => {
		if (!best || rays > best.rays) best = { el, rays };
		const like = runnersUp.findIndex((r) => similar(r.el, el, 0.03));
		if (like >= 0) {
			if (rays > runnersUp[like]!.rays) runnersUp[like] = { el, rays };
		} else runnersUp.push({ el, rays });
		runnersUp.sort((x, y) => y.rays - x.rays);
		if (runnersUp.length > 3) runnersUp.length = 3;
	};
	const outer = outermost(points, g);
	// Rays on the ellipse, less half the rays whose outermost strong edge lies just outside it: an
	// ellipse through the tips on one side and the roots on the other is as well supported as the
	// tips' own, but leaves the tips outside it on that side. Half, since a mat's lines or wood grain
	// put strong edges just outside the true tips too.
	const score = (el: Ellipse) =>
		support(points, el, tol(el)).rays - 0.5 * support(outer, { ...el, a: el.a * 1.1, b: el.b * 1.1 }, 0.1 - 2 * tol(el)).rays;
	// The taps' own outline first: where tip edges are few among root, bevel and shadow edges, random
	// samples of five can all miss it.
	for (const el of g.seeds ?? []) {
		if (!plausible(el, g)) continue;
		consider(el, score(el));
	}
	// Two pools of five-point samples: the rays' outer envelope (mostly tips, found all at once even
	// on narrow deep teeth), and every edge (for when the envelope is cluttered).
	for (const pool of [envelope(outer, g), points]) {
		// Points by sector, so each sample of five spans the ring (a well-conditioned conic).
		const sectors: EdgePoint[][] = Array.from({ length: 5 }, () => []);
		for (const p of pool) sectors[Math.floor((p.ray * 5) / RAYS)]!.push(p);
		if (sectors.some((s) => !s.length)) continue;
		for (let it = 0; it < 500; it++) {
			const sample = sectors.map((s) => s[Math.floor(rnd() * s.length)]!);
			const q = fitConic(sample);
			const el = q && conicEllipse(q);
			if (!el || !plausible(el, g)) continue;
			consider(el, score(el));
		}
	}
	// Samples of four edges and a tapped tip: a tap is a point on the rim, so only four of the five
	// need to fall on it (a mat's or a bench's edges crowd the tip edges out of random fives).
	const perTip = Math.max(100, Math.round(500 / g.tips.length));
	for (const tip of g.tips) {
		const at = Math.atan2(-(tip.y - g.centre.y), tip.x - g.centre.x);
		const tipRay = Math.round((((at / (2 * Math.PI)) * RAYS) % RAYS) + RAYS) % RAYS;
		for (const pool of [envelope(outer, g), points]) {
			const sectors: EdgePoint[][] = Array.from({ length: 4 }, () => []);
			for (const p of pool) {
				const k = Math.floor((((p.ray - tipRay + RAYS) % RAYS) * 5) / RAYS);
				if (k > 0) sectors[k - 1]!.push(p);
			}
			if (sectors.some((x) => !x.length)) continue;
			for (let it = 0; it < perTip; it++) {
				const q = fitConic([tip, ...sectors.map((x) => x[Math.floor(rnd() * x.length)]!)]);
				const el = q && conicEllipse(q);
				if (!el || !plausible(el, g)) continue;
				consider(el, score(el));
			}
		}
	}
	if (!best) return null;
	const refine = (el: Ellipse): EdgeFit | null => {
		let cur = el;
		let conic: Conic | null = null;
		for (let pass = 0; pass < 3; pass++) {
			const { inliers } = support(points, cur, (pass ? 1 : 2) * tol(cur));
			const q = fitConic(inliers);
			const next = q && conicEllipse(q);
			if (!next || !plausible(next, g)) break;
			[cur, conic] = [next, q];
		}
		if (!conic) return null;
		return { conic, ellipse: cur, support: support(points, cur, tol(cur)).rays / RAYS };
	};
	// The seeds refined too: a circle through a single tapped tip, or the ellipse of taps a little
	// off, lies near the rim's edges without being on them, and beats the random outlines only once
	// drawn onto them.
	// The root and bevel edges make ellipses of the same shape inside the tips': step outwards.
	const stepOut = (first: EdgeFit): EdgeFit => {
		let fit = first;
		for (let round = 0; round < 3; round++) {
			const base = fit;
			let outer: { el: Ellipse; rays: number } | null = null;
			for (let s = 1.012; s <= 1.4; s += 0.004) {
				const el = { ...base.ellipse, a: base.ellipse.a * s, b: base.ellipse.b * s };
				if (!plausible(el, g)) continue;
				const { rays } = support(points, el, tol(el));
				if (rays >= 0.45 * base.support * RAYS && (!outer || el.a > outer.el.a)) outer = { el, rays };
			}
			if (!outer) break;
			const next = refine(outer.el);
			if (!next || next.ellipse.a <= base.ellipse.a * 1.005) break;
			fit = next;
		}
		return fit;
	};
	// The seeds refined too: a circle through a single tapped tip, or the ellipse of taps a little
	// off, lies near the rim's edges without being on them, and beats the random outlines only once
	// drawn onto them. Which one is the rim the edges alone cannot always tell (a mat's line, a
	// shadow's edge): the runners-up go with the best, for the ring reading to judge.
	const fits: { fit: EdgeFit; score: number }[] = [];
	for (const el of [...runnersUp.map((r) => r.el), ...(g.seeds ?? [])]) {
		const f = refine(el);
		if (!f) continue;
		const fit = stepOut(f);
		const same = fits.some((o) => similar(o.fit.ellipse, fit.ellipse, 0.01));
		if (!same) fits.push({ fit, score: score(fit.ellipse) });
	}
	fits.sort((x, y) => y.score - x.score);
	const [top, ...rest] = fits;
	return top ? { ...top.fit, alternatives: rest.slice(0, 2).map((f) => f.fit) } : null;
}
