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
	/** Each tooth seen: its middle's unit-frame angle (radians, ccw) and its position (0 after the main gap). */
	seen: { phi: number; position: number }[];
	/** Stretches not read, unit-frame angles (radians, ccw from `from` to `to`). */
	unseen: { from: number; to: number }[];
	/** The parts of the confidence, for calibration. */
	factors: Record<string, number>;
}

export type ProfileFailure = { failure: 'few' | 'nogap' | 'gap-unseen' | 'unseen' };

/** 1 metal, 0 background, -1 not read. */
type State = 1 | 0 | -1;

interface Run {
	start: number;
	len: number;
	state: State;
}

/** Runs of the circular profile, starting at a change so none wraps. */
function runsOf(st: State[]): Run[] {
	const n = st.length;
	const first = st.findIndex((v, i) => v !== st[(i - 1 + n) % n]);
	if (first < 0) return [];
	const runs: Run[] = [];
	for (let i = 0; i < n;) {
		const start = (first + i) % n;
		let len = 0;
		while (i + len < n && st[(first + i + len) % n] === st[start]) len++;
		runs.push({ start, len, state: st[start]! });
		i += len;
	}
	return runs;
}

/** Joins neighbouring runs of the same state (after a change of state), keeping the circular order. */
function join(rs: Run[]): Run[] {
	const out: Run[] = [];
	for (const r of rs) {
		const last = out[out.length - 1];
		if (last && last.state === r.state) last.len += r.len;
		else out.push({ ...r });
	}
	if (out.length > 1 && out[0]!.state === out[out.length - 1]!.state) {
		const tail = out.pop()!;
		out[0] = { start: tail.start, len: tail.len + out[0]!.len, state: tail.state };
	}
	return out;
}

/**
 * Flips the shortest run under `min` samples into its neighbours until none is left: between two
 * runs of one state it takes theirs; a short stretch not read between a tooth and a space (a lit
 * or shadowed flank) is shared between them, half each, so a tooth's middle moves by a quarter of
 * it at most. Every step joins runs, so the loop ends.
 */
function clean(runs: Run[], min: number): Run[] {
	let rs = runs;
	for (;;) {
		if (rs.length < 4) return rs;
		let k = -1;
		for (let i = 0; i < rs.length; i++) if (rs[i]!.len < min && (k < 0 || rs[i]!.len < rs[k]!.len)) k = i;
		if (k < 0) return rs;
		const r = rs[k]!;
		const prev = rs[(k - 1 + rs.length) % rs.length]!;
		const next = rs[(k + 1) % rs.length]!;
		if (prev.state === next.state) rs = join(rs.map((x, i) => (i === k ? { ...x, state: prev.state } : x)));
		else if (r.state === -1) {
			const half = Math.floor(r.len / 2);
			const split: Run[] = [
				{ start: r.start, len: half, state: prev.state },
				{ start: r.start + half, len: r.len - half, state: next.state }
			];
			rs = join(rs.flatMap((x, i) => (i === k ? split.filter((y) => y.len > 0) : [x])));
		} else rs = join(rs.map((x, i) => (i === k ? { ...x, state: -1 as State } : x)));
	}
}

const medianOf = (a: number[]) => {
	const s = [...a].sort((x, y) => x - y);
	return s.length ? s[s.length >> 1]! : NaN;
};

/** Power of the profile at each whole number of cycles round the ring; the strongest one. */
export function strongestHarmonic(s: Float64Array, from: number, to: number): number {
	const n = s.length;
	let mean = 0;
	let m = 0;
	for (const v of s) if (!Number.isNaN(v)) [mean, m] = [mean + v, m + 1];
	mean /= m || 1;
	const cos = new Float64Array(n).map((_, i) => Math.cos((2 * Math.PI * i) / n));
	const sin = new Float64Array(n).map((_, i) => Math.sin((2 * Math.PI * i) / n));
	let best = from;
	let bestPower = -1;
	for (let h = from; h <= to; h++) {
		let re = 0;
		let im = 0;
		for (let i = 0, a = 0; i < n; i++, a = (a + h) % n) {
			const v = Number.isNaN(s[i]!) ? 0 : s[i]! - mean;
			re += v * cos[a]!;
			im += v * sin[a]!;
		}
		const p = re * re + im * im;
		if (p > bestPower) [best, bestPower] = [h, p];
	}
	return best;
}

const clamp01 = (v: number) => Math.max(0, Math.min(1, v));

/**
 * The level between metal and background at each angle: a little above half-way (55 %) from the
 * low to the high tenth of the profile within 30° each side, where both a tooth and a space lie in
 * that stretch; else the middle, 0.5. A little above: a cutting mat's bright line in a space read
 * as a sliver of tooth and joined the tooth beside it (t21; 60 % lost two other readings). A soft shadow under the wheel darkens the spaces between the teeth more
 * than the background outside the tips, so a space can read at 0.7 where the teeth read 1. Not the
 * lowest and highest: a flash leaves a thin dark line at one flank of every tooth, far under the
 * spaces, and half-way to it cut the spaces in pieces (a gold wheel on wood). Taken at 128 angles
 * round the ring and drawn straight between them (a sort per angle would cost more than the rest).
 */
export function localLevels(s: Float64Array): Float64Array {
	const n = s.length;
	const w = Math.round(n / 12);
	const steps = Math.min(n, 128);
	const at = new Float64Array(steps);
	const win: number[] = [];
	for (let k = 0; k < steps; k++) {
		const c = Math.round((k * n) / steps);
		win.length = 0;
		for (let d = -w; d <= w; d++) {
			const v = s[(c + d + n) % n]!;
			if (!Number.isNaN(v)) win.push(v);
		}
		win.sort((a, b) => a - b);
		const lo = win[Math.floor(0.1 * (win.length - 1))]!;
		const hi = win[Math.ceil(0.9 * (win.length - 1))]!;
		at[k] = win.length && hi - lo >= 0.3 ? Math.max(0.25, Math.min(0.85, lo + 0.55 * (hi - lo))) : 0.5;
	}
	const out = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		const x = (i * steps) / n;
		const k = Math.floor(x);
		out[i] = at[k]! * (1 - (x - k)) + at[(k + 1) % steps]! * (x - k);
	}
	return out;
}

/**
 * How far the teeth drift off whole pitches along each stretch of known spacings: the spacings'
 * running sum against the positions counted, less its mean. One spacing cannot tell a 36 from a 37
 * (2.7 % apart); twenty-five in a row drift by two thirds of a pitch. Where a cover hides part of
 * the ring, the sum of the positions no longer checks N, and this does.
 */
function driftOf(gaps: number[], ks: number[], known: boolean[], p: number): number {
	const m = gaps.length;
	// Start the walk after a spacing not known, so no stretch is cut in two by the wrap.
	const start =
		Math.max(
			0,
			known.findIndex((k) => !k)
		) + 1;
	let worst = 0;
	let stretch: number[] = [0];
	const close = () => {
		if (stretch.length > 2) {
			const mean = stretch.reduce((a, b) => a + b, 0) / stretch.length;
			for (const r of stretch) worst = Math.max(worst, Math.abs(r - mean));
		}
		stretch = [0];
	};
	for (let j = 0; j < m; j++) {
		const i = (start + j) % m;
		if (!known[i]) {
			close();
			continue;
		}
		stretch.push(stretch[stretch.length - 1]! + gaps[i]! / p - ks[i]!);
	}
	close();
	return worst;
}

export function readProfile(s: Float64Array): ProfileReading | ProfileFailure {
	const n = s.length;
	const level = localLevels(s);
	const st: State[] = [...s].map((v, i) => (Number.isNaN(v) ? -1 : v >= level[i]! ? 1 : 0));
	let runs = runsOf(st);
	if (!runs.length) return { failure: 'few' };
	runs = clean(runs, 3);
	runs = clean(runs, Math.max(3, 0.3 * medianOf(runs.filter((r) => r.state === 1).map((r) => r.len))));
	// A knot in the wood or a glint in a space reads above the level, but faint beside the teeth:
	// under 60 % of a tooth's height over the spaces. It is read as space; where one lies in a gap,
	// it may be a tooth in shadow, and the reading cannot be high.
	const meanOf = (r: Run) => {
		let sum = 0;
		for (let d = 0; d < r.len; d++) sum += s[(r.start + d) % n]!;
		return sum / r.len;
	};
	const toothLen = medianOf(runs.filter((r) => r.state === 1).map((r) => r.len));
	const toothLevel = medianOf(runs.filter((r) => r.state === 1).map(meanOf));
	const spaceLevel = medianOf(runs.filter((r) => r.state === 0).map(meanOf));
	const faint = (r: Run) => r.state === 1 && r.len < 1.2 * toothLen && meanOf(r) < spaceLevel + 0.6 * (toothLevel - spaceLevel);
	const faintAt = runs.filter(faint).map((r) => r.start + r.len / 2);
	if (faintAt.length) runs = join(runs.map((r) => (faint(r) ? { ...r, state: 0 as State } : r)));
	// A cutting mat's grid line or a glint crossing a gap reads as a thin run of metal; a tooth, however
	// the light falls on it, sits on the wheel's pitch. A run under 60 % of a tooth's width between two
	// spaces, whose spacings to the teeth either side both fall well off whole pitches while the two
	// together fall on one, is not a tooth: it reads as space and, like a faint run, keeps the reading
	// from high (it might still be a broken tooth).
	const centreOf = (r: Run) => r.start + r.len / 2;
	const spanOf = (a: Run, b: Run) => (((centreOf(b) - centreOf(a)) % n) + n) % n;
	const around = (x: number, d: number) => runs[(x + d + runs.length) % runs.length]!;
	const pitch0 = medianOf(
		runs.flatMap((r, x) => (r.state === 1 && around(x, 1).state === 0 && around(x, 2).state === 1 ? [spanOf(r, around(x, 2))] : []))
	);
	const offPitch = (v: number) => Math.abs(v - Math.round(v));
	const offGrid = (r: Run, x: number) => {
		if (r.state !== 1 || !(r.len < 0.6 * toothLen) || runs.length < 8) return false;
		if (around(x, -1).state !== 0 || around(x, 1).state !== 0 || around(x, -2).state !== 1 || around(x, 2).state !== 1) return false;
		const [da, db] = [spanOf(around(x, -2), r) / pitch0, spanOf(r, around(x, 2)) / pitch0];
		return offPitch(da) + offPitch(db) > 0.5 && offPitch(da + db) < 0.2;
	};
	const offGridAt = new Set(runs.filter(offGrid));
	if (offGridAt.size) {
		for (const r of offGridAt) faintAt.push(centreOf(r));
		runs = join(runs.map((r) => (offGridAt.has(r) ? { ...r, state: 0 as State } : r)));
	}
	// A run of metal wider than a pitch and far wider than the teeth is no single tooth: a bracket
	// or a finger of the metal's shade over the ring, or teeth run together in glare. What lies
	// there is not known.
	const wideAt = new Set(runs.filter((r) => r.state === 1 && r.len > Math.max(1.6 * toothLen, 0.9 * pitch0)));
	if (wideAt.size) runs = join(runs.map((r) => (wideAt.has(r) ? { ...r, state: -1 as State } : r)));
	// A tooth cut by a stretch not read (a finger's edge, its shadow) still shows the flank on its
	// read side: its middle lies half a tooth's width from that flank, the width the whole teeth
	// have. Cut on both sides, or showing more or much less than a tooth, it joins the stretch.
	const prevOf = (x: number) => runs[(x - 1 + runs.length) % runs.length]!;
	const nextOf = (x: number) => runs[(x + 1) % runs.length]!;
	const wholeWidth = medianOf(runs.filter((r, x) => r.state === 1 && prevOf(x).state === 0 && nextOf(x).state === 0).map((r) => r.len));
	const cut = new Map<Run, number>();
	for (;;) {
		const i = runs.findIndex((r, x) => {
			if (r.state !== 1 || (prevOf(x).state !== -1 && nextOf(x).state !== -1)) return false;
			const oneSide = prevOf(x).state === 0 || nextOf(x).state === 0;
			return !(oneSide && r.len >= 0.4 * wholeWidth && r.len <= 1.25 * wholeWidth);
		});
		if (i < 0 || runs.length < 3) break;
		runs = join(runs.map((r, x) => (x === i ? { ...r, state: -1 as State } : r)));
	}
	runs.forEach((r, x) => {
		if (r.state !== 1) return;
		if (prevOf(x).state === -1) cut.set(r, r.start + r.len - wholeWidth / 2);
		else if (nextOf(x).state === -1) cut.set(r, r.start + wholeWidth / 2);
	});
	const unseenLen = runs.filter((r) => r.state === -1).reduce((a, r) => a + r.len, 0);
	if (unseenLen > 0.35 * n) return { failure: 'unseen' };
	const teethRuns = runs.filter((r) => r.state === 1);
	// Three teeth at least: a 4-1 has no more (its reading is never high, see \`few\` below).
	if (teethRuns.length < 3) return { failure: 'few' };
	const centre = (r: Run) => cut.get(r) ?? r.start + r.len / 2;
	const idxOf = new Map(runs.map((r, i) => [r, i]));
	const gapsAfter = teethRuns.map((r, i) => {
		const next = teethRuns[(i + 1) % teethRuns.length]!;
		return (((centre(next) - centre(r)) % n) + n) % n || n;
	});
	// A spacing is known when nothing between the two teeth went unread.
	const known = teethRuns.map((r, i) => {
		const next = teethRuns[(i + 1) % teethRuns.length]!;
		for (let x = idxOf.get(r)!; x !== idxOf.get(next); x = (x + 1) % runs.length) if (runs[x]!.state === -1) return false;
		return true;
	});
	const knownGaps = gapsAfter.filter((_, i) => known[i]);
	if (knownGaps.length < Math.min(4, teethRuns.length)) return { failure: 'few' };
	const med = medianOf(knownGaps);
	const guess = Math.round(n / med);
	let best: { teeth: number; ks: number[]; err: number; drift: number; sumOk: boolean } | null = null;
	for (let N = Math.max(3, guess - 2); N <= guess + 2; N++) {
		const p = n / N;
		const ks = gapsAfter.map((g) => Math.max(1, Math.round(g / p)));
		const sumOk = ks.reduce((a, b) => a + b, 0) === N;
		const err = Math.max(...gapsAfter.map((g, i) => (known[i] ? Math.abs(g / p - ks[i]!) : 0)));
		const drift = driftOf(gapsAfter, ks, known, p);
		const worse = (x: { err: number; drift: number }) => Math.max(x.err, x.drift);
		if (!best || (sumOk && !best.sumOk) || (sumOk === best.sumOk && worse({ err, drift }) < worse(best)))
			best = { teeth: N, ks, err, drift, sumOk };
	}
	if (!best) return { failure: 'few' };
	const { teeth: N, ks } = best;
	const p = n / N;
	const full = teethRuns.filter((r, i) => !cut.has(r) && (known[i] || known[(i - 1 + teethRuns.length) % teethRuns.length]));
	const widths = full.map((r) => r.len / p);
	const duty = widths.reduce((a, b) => a + b, 0) / widths.length;
	const sd = Math.sqrt(widths.reduce((a, w) => a + (w - duty) ** 2, 0) / widths.length);
	const gapsAt = ks.map((k, i) => ({ i, k })).filter((g) => g.k >= 2 && known[g.i]);
	if (!gapsAt.length) return { failure: unseenLen ? 'gap-unseen' : 'nogap' };
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
	// Fewer than half the wheel's teeth seen: the spacings of a part of the ring agree with more
	// than one N (17 teeth of a 36-1 read as 37-1 through a finger and a flash's glare).
	if (teethRuns.length < 0.5 * (N - missing)) return { failure: 'unseen' };
	const a = teethRuns[main.i]!;
	const mid = centre(a) + gapsAfter[main.i]! / 2;
	const toPhi = (x: number) => (2 * Math.PI * (((x % n) + n) % n)) / n;
	const gapPhi = toPhi(mid);

	// Confidence: spacings that sit on whole pitches, even tooth widths, a clean two-level profile,
	// the profile's strongest cycle count agreeing with N, and how much of the ring was read.
	let hi = 0;
	let lo = 0;
	let nh = 0;
	let nl = 0;
	for (let i = 0; i < n; i++)
		if (st[i] === 1) [hi, nh] = [hi + s[i]!, nh + 1];
		else if (st[i] === 0) [lo, nl] = [lo + s[i]!, nl + 1];
	const separation = (nh ? hi / nh : 0) - (nl ? lo / nl : 0);
	const factors = {
		spacing: clamp01(1 - (best.err - 0.12) / 0.3),
		drift: clamp01(1 - (best.drift - 0.25) / 0.35),
		width: clamp01(1 - (sd / duty - 0.08) / 0.4),
		levels: clamp01((separation - 0.25) / 0.35),
		cycles: strongestHarmonic(s, Math.min(6, N), Math.min(200, Math.floor(n / 8))) === N ? 1 : 0.5,
		sum: best.sumOk ? 1 : 0.3,
		// How much of the ring was read, in teeth: a tooth beside a stretch not read takes its
		// spaces into that stretch, so the teeth not seen can far outnumber the angles not read (a
		// 36-1 read as 37-1 from 17 teeth with a quarter of the ring not read).
		read: clamp01(1 - Math.max(unseenLen / n, 1 - teethRuns.length / (N - missing)) / 0.35),
		// Most wheels have one gap; a tooth lost in glare or shadow reads as a second one, as regular
		// as a real one: a reading with more gaps is not high, whatever else it shows.
		gaps: gaps.length > 1 ? 0.7 : 1,
		// Under five teeth (a 4-1 shows three), the spacings are too few to check one another the
		// way a longer run of teeth does: any three runs a quarter turn apart read as a 4-1.
		few: teethRuns.length < 5 ? 0.6 : 1,
		faint: gapsAt.some((g) => {
			const from = centre(teethRuns[g.i]!);
			return faintAt.some((x) => (((x - from) % n) + n) % n < gapsAfter[g.i]!);
		})
			? 0.7
			: 1,
		spacingErr: best.err
	};
	const confidence =
		factors.spacing *
		factors.drift *
		factors.width *
		factors.levels *
		factors.cycles *
		factors.sum *
		factors.gaps *
		factors.few *
		factors.faint *
		(0.5 + 0.5 * factors.read);
	const seen = teethRuns.map((r, i) => ({ phi: toPhi(centre(r)), position: pos[i]! }));
	// A stretch not read reaches from the last tooth seen before it to the first after: what lies
	// between them, read as background or not, is not known.
	const unseen = runs
		.map((r, i) => ({ r, i }))
		.filter(({ r }) => r.state === -1)
		.map(({ r, i }) => {
			const before = runs[(i - 1 + runs.length) % runs.length]!;
			const after = runs[(i + 1) % runs.length]!;
			const from = before.state === 0 ? before.start : r.start;
			const to = after.state === 0 ? after.start + after.len : r.start + r.len;
			return { from: toPhi(from), to: toPhi(to) };
		});
	return { teeth: N, missing, gaps, gapPhi, duty, confidence, toothCount: N - missing, seen, unseen, factors };
}
