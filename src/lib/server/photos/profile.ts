// From the angular profile round the ring (metal fraction per angle, ccw) to the pattern: tooth
// runs, the pitch (p = 360 / N with the missing positions counted; common practice), and every
// spacing of about (k + 1) pitches read as k missing teeth.

export interface ProfileReading {
	teeth: number;
	missing: number;
	/** Pattern positions: 0 is the first tooth counter-clockwise of the main gap. */
	gaps: { first: number; count: number }[];
	/** Unit-frame angle (radians, ccw) of the main gap's middle. */
	gapPhi: number;
	duty: number;
	confidence: number;
	toothCount: number;
}

export type ProfileFailure = { failure: string };

interface Run {
	start: number;
	len: number;
	on: boolean;
}

/** Runs of the circular binary profile, starting at a change so none wraps. */
function runsOf(on: boolean[]): Run[] {
	const n = on.length;
	const first = on.findIndex((v, i) => v !== on[(i - 1 + n) % n]);
	if (first < 0) return [];
	const runs: Run[] = [];
	for (let i = 0; i < n;) {
		const start = (first + i) % n;
		let len = 0;
		while (i + len < n && on[(first + i + len) % n] === on[start]) len++;
		runs.push({ start, len, on: on[start]! });
		i += len;
	}
	return runs;
}

/** Flips the shortest run under `min` samples into its neighbours until none is left. */
function clean(runs: Run[], min: number, n: number): Run[] {
	let rs = runs;
	for (;;) {
		if (rs.length < 4) return rs;
		let k = -1;
		for (let i = 0; i < rs.length; i++) if (rs[i]!.len < min && (k < 0 || rs[i]!.len < rs[k]!.len)) k = i;
		if (k < 0) return rs;
		const prev = rs[(k - 1 + rs.length) % rs.length]!;
		const next = rs[(k + 1) % rs.length]!;
		const merged: Run = { start: prev.start, len: prev.len + rs[k]!.len + next.len, on: prev.on };
		const out: Run[] = [];
		for (let i = 0; i < rs.length; i++) {
			if (i === k || i === (k + 1) % rs.length) continue;
			out.push(i === (k - 1 + rs.length) % rs.length ? merged : rs[i]!);
		}
		// Merging across index 0 may leave the first run's start mid-list; keep order by start.
		rs = out.map((r) => ({ ...r, start: r.start % n })).sort((a, b) => a.start - b.start);
	}
}

const medianOf = (a: number[]) => {
	const s = [...a].sort((x, y) => x - y);
	return s.length ? s[s.length >> 1]! : NaN;
};

/** Power of the profile at each whole number of cycles round the ring; the strongest one. */
function strongestHarmonic(s: Float64Array, from: number, to: number): number {
	const n = s.length;
	let mean = 0;
	for (const v of s) mean += v / n;
	const cos = new Float64Array(n).map((_, i) => Math.cos((2 * Math.PI * i) / n));
	const sin = new Float64Array(n).map((_, i) => Math.sin((2 * Math.PI * i) / n));
	let best = from;
	let bestPower = -1;
	for (let h = from; h <= to; h++) {
		let re = 0;
		let im = 0;
		for (let i = 0, a = 0; i < n; i++, a = (a + h) % n) {
			const v = s[i]! - mean;
			re += v * cos[a]!;
			im += v * sin[a]!;
		}
		const p = re * re + im * im;
		if (p > bestPower) [best, bestPower] = [h, p];
	}
	return best;
}

const clamp01 = (v: number) => Math.max(0, Math.min(1, v));

export function readProfile(s: Float64Array): ProfileReading | ProfileFailure {
	const n = s.length;
	const on = [...s].map((v) => v >= 0.5);
	let runs = clean(runsOf(on), 3, n);
	runs = clean(runs, Math.max(3, 0.3 * medianOf(runs.map((r) => r.len))), n);
	const teethRuns = runs.filter((r) => r.on);
	if (teethRuns.length < 5) return { failure: 'few' };
	const centre = (r: Run) => r.start + r.len / 2;
	const gapsAfter = teethRuns.map((r, i) => {
		const next = teethRuns[(i + 1) % teethRuns.length]!;
		return (((centre(next) - centre(r)) % n) + n) % n || n;
	});
	const med = medianOf(gapsAfter);
	const guess = Math.round(n / med);
	let best: { teeth: number; ks: number[]; err: number; sumOk: boolean } | null = null;
	for (let N = Math.max(6, guess - 2); N <= guess + 2; N++) {
		const p = n / N;
		const ks = gapsAfter.map((g) => Math.max(1, Math.round(g / p)));
		const sumOk = ks.reduce((a, b) => a + b, 0) === N;
		const err = Math.max(...gapsAfter.map((g, i) => Math.abs(g / p - ks[i]!)));
		if (!best || (sumOk && !best.sumOk) || (sumOk === best.sumOk && err < best.err)) best = { teeth: N, ks, err, sumOk };
	}
	if (!best) return { failure: 'few' };
	const { teeth: N, ks } = best;
	const p = n / N;
	const widths = teethRuns.map((r) => r.len / p);
	const duty = widths.reduce((a, b) => a + b, 0) / widths.length;
	const sd = Math.sqrt(widths.reduce((a, w) => a + (w - duty) ** 2, 0) / widths.length);
	const gapsAt = ks.map((k, i) => ({ i, k })).filter((g) => g.k >= 2);
	if (!gapsAt.length) return { failure: 'nogap' };
	const main = gapsAt.reduce((a, b) => (b.k > a.k ? b : a));
	// Walk ccw from the tooth after the main gap, counting positions.
	const pos: number[] = new Array<number>(teethRuns.length);
	const zero = (main.i + 1) % teethRuns.length;
	for (let m = 0, at = 0; m < teethRuns.length; m++) {
		const i = (zero + m) % teethRuns.length;
		pos[i] = at;
		at += ks[i]!;
	}
	const gaps = gapsAt.map((g) => ({ first: pos[g.i]! + 1, count: g.k - 1 })).sort((a, b) => a.first - b.first);
	const missing = gaps.reduce((a, g) => a + g.count, 0);
	const a = teethRuns[main.i]!;
	const mid = centre(a) + gapsAfter[main.i]! / 2;
	const gapPhi = (2 * Math.PI * (mid % n)) / n;

	// Confidence: spacings that sit on whole pitches, even tooth widths, a clean two-level profile,
	// and the profile's strongest cycle count agreeing with N.
	let hi = 0;
	let lo = 0;
	let nh = 0;
	let nl = 0;
	for (let i = 0; i < n; i++)
		if (on[i]) [hi, nh] = [hi + s[i]!, nh + 1];
		else [lo, nl] = [lo + s[i]!, nl + 1];
	const separation = (nh ? hi / nh : 0) - (nl ? lo / nl : 0);
	const fSpacing = clamp01(1 - (best.err - 0.12) / 0.3);
	const fWidth = clamp01(1 - (sd / duty - 0.08) / 0.4);
	const fLevels = clamp01((separation - 0.25) / 0.35);
	const harmonic = strongestHarmonic(s, 6, Math.min(200, Math.floor(n / 8)));
	const fCycles = harmonic === N ? 1 : 0.5;
	const confidence = fSpacing * fWidth * fLevels * fCycles * (best.sumOk ? 1 : 0.3);
	return { teeth: N, missing, gaps, gapPhi, duty, confidence, toothCount: teethRuns.length };
}
