import type { EdgeLog, EdgeLogDesign, EdgeLogPattern, EdgeLogReading } from './edge-log';
import { gapsOf, patternName } from './pattern';

// Reading an edge log: each space is compared with its neighbours (never a mean over the log, which
// a speed swing of tens of percent while cranking would make meaningless), counted in pitches, and
// the gap is the long space that comes back every N pitches. Counting in pitches rather than in
// edges is what keeps a dropped edge (one space two pitches long) from shifting everything after it.

/** Rows listed for the missing and extra edges; the counts go on past them. */
export const listedAtMost = 100;
/** A space under this share of its neighbours is a part of one, split by an extra edge. */
const short = 0.6;
/** Neighbours looked at on each side: eight spaces, enough that two gaps among them are outvoted. */
const reach = 4;

/**
 * The typical space around each one, itself left out: the lower middle of its neighbours, so that
 * on a wheel of few teeth (4-1: two tooth spaces to a gap) the gaps among them do not count.
 */
function neighbourSpaces(s: ArrayLike<number>): Float64Array {
	const n = s.length;
	const out = new Float64Array(n);
	const sorted = new Float64Array(2 * reach);
	for (let i = 0; i < n; i++) {
		let m = 0;
		for (let j = Math.max(0, i - reach); j <= Math.min(n - 1, i + reach); j++) {
			if (j === i) continue;
			const v = s[j]!;
			let k = m++;
			for (; k > 0 && sorted[k - 1]! > v; k--) sorted[k] = sorted[k - 1]!;
			sorted[k] = v;
		}
		out[i] = m ? sorted[(m - 1) >> 1]! : s[i]!;
	}
	return out;
}

/**
 * The tooth space expected at each space: the mean of the nearest ordinary tooth space before it and
 * the nearest after it (ordinary: within 0.7 to 1.4 of its neighbours), so a gap is measured against
 * the teeth on both sides of it and a speed changing across it cancels to first order. On a wheel of
 * few teeth a swing moves the neighbours' middle too far for that (5-2 at 25 %: a gap 3.5 spaces long).
 */
function bridgedSpaces(s: ArrayLike<number>): Float64Array {
	const n = s.length;
	const around = neighbourSpaces(s);
	const ordinary = (i: number) => s[i]! >= 0.7 * around[i]! && s[i]! <= 1.4 * around[i]!;
	const before = new Float64Array(n).fill(NaN);
	const after = new Float64Array(n).fill(NaN);
	for (let i = 1; i < n; i++) before[i] = ordinary(i - 1) ? s[i - 1]! : before[i - 1]!;
	for (let i = n - 2; i >= 0; i--) after[i] = ordinary(i + 1) ? s[i + 1]! : after[i + 1]!;
	const out = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		const b = before[i]!;
		const a = after[i]!;
		out[i] = Number.isNaN(b) ? (Number.isNaN(a) ? around[i]! : a) : Number.isNaN(a) ? b : (a + b) / 2;
	}
	return out;
}

/** How far a span of `x` pitches is from a whole number of them (at least one). */
const offWhole = (x: number) => (Number.isFinite(x) ? Math.abs(x - Math.max(1, Math.round(x))) : Infinity);
/** In pitches: a swing of ±15 % across a gap puts its length that far off a whole number. */
const clearly = 0.15;

interface Cleaned {
	spaces: number[];
	/** Original edge index closing each space. */
	ends: number[];
	rows: number[];
	/** Rows of the edges taken out as noise. */
	extraRows: number[];
}

/** Short spaces joined to the neighbour that makes a whole number of pitches with them: an extra edge gone. */
function withoutSplits(log: EdgeLog): Cleaned {
	const sp = log.spacesUs;
	const ref = bridgedSpaces(sp);
	const out: Cleaned = { spaces: [], ends: [], rows: [], extraRows: [] };
	let i = 0;
	while (i < sp.length) {
		const r0 = ref[i]!;
		let s = sp[i]!;
		let end = i + 1;
		let row = log.rows[i]!;
		i++;
		if (s < short * r0) {
			const last = out.spaces.length - 1;
			const back = last >= 0 ? out.spaces[last]! + s : Infinity;
			const ahead = i < sp.length ? s + sp[i]! : Infinity;
			// Of two edges too close together the later is taken as the extra one (ringing after a
			// true edge), unless that leaves clearly fewer whole pitches than taking the earlier.
			if (offWhole(back / r0) + clearly < offWhole(ahead / r0)) {
				out.extraRows.push(out.rows[last]!);
				out.spaces[last] = back;
				out.ends[last] = end;
				out.rows[last] = row;
				continue;
			}
			// Joined ahead, and on while still short (a burst of several edges).
			do {
				out.extraRows.push(row);
				s += sp[i]!;
				end = i + 1;
				row = log.rows[i]!;
				i++;
			} while (s < short * r0 && i < sp.length);
		}
		out.spaces.push(s);
		out.ends.push(end);
		out.rows.push(row);
	}
	return out;
}

/** The most frequent value, the larger one on a tie when `larger`. */
function mode(values: Iterable<number>, larger = false): number | null {
	const counts = new Map<number, number>();
	for (const v of values) counts.set(v, (counts.get(v) ?? 0) + 1);
	let best: number | null = null;
	let bestCount = 0;
	for (const [v, c] of counts) {
		if (c > bestCount || (c === bestCount && best !== null && (larger ? v > best : v < best))) [best, bestCount] = [v, c];
	}
	return best;
}

const mod = (a: number, n: number) => ((a % n) + n) % n;
/** The longest space counted in pitches: past it, a pause in the log, not a part of the wheel. */
const maxPitches = 1e6;

/** Pitch positions x in [lo, hi] where a gap starts (x ≡ phase, mod N): counted, not walked, so a pause costs nothing. */
const gapStartsIn = (lo: number, hi: number, phase: number, teeth: number) =>
	hi < lo ? 0 : Math.floor((hi - phase) / teeth) - Math.floor((lo - 1 - phase) / teeth);

/** Pitch positions x in [lo, hi] inside a gap (1 to M after its start). */
function gapPositionsIn(lo: number, hi: number, phase: number, teeth: number, missing: number): number {
	// Positions up to y inside a gap, from a fixed origin.
	const upTo = (y: number) => Math.floor((y - phase) / teeth) * missing + Math.min(mod(y - phase, teeth), missing);
	return hi < lo ? 0 : upTo(hi) - upTo(lo - 1);
}
const round = (x: number, digits: number) => Math.round(x * 10 ** digits) / 10 ** digits;

/** The design as N-M, or why the reader (one gap per turn) cannot compare with it. */
function designNM(design: EdgeLogDesign): { teeth: number; missing: number; name: string } | string {
	if (!('kind' in design)) return { ...design, name: `${design.teeth}-${design.missing}` };
	if (design.kind === 'missing') return { teeth: design.teeth, missing: design.missing, name: patternName(design) };
	const gaps = gapsOf(design);
	if (design.kind === 'custom' && gaps.length === 1)
		return { teeth: design.teeth, missing: gaps[0]!.count, name: `${design.teeth}-${gaps[0]!.count}` };
	return `the design (${patternName(design)}) has ${gaps.length ? `${gaps.length} gaps` : 'no gap'} to a turn; the log reading finds one gap to a turn`;
}

function compared(found: EdgeLogPattern | null, design: EdgeLogDesign): { matches: boolean; words: string } {
	const d = designNM(design);
	if (typeof d === 'string') return { matches: false, words: d };
	if (!found) {
		return d.missing === 0
			? { matches: true, words: `no gap in the log, and none in the design (${d.teeth} teeth)` }
			: { matches: false, words: `no gap found in the log; the design is ${d.name}` };
	}
	const shown = `${found.teeth}-${found.missing}`;
	if (found.teeth === d.teeth && found.missing === d.missing) return { matches: true, words: `the log shows ${shown}, as the design` };
	const differences = [
		found.teeth !== d.teeth ? `${found.teeth} tooth positions to the design’s ${d.teeth}` : '',
		found.missing !== d.missing ? `${found.missing} missing to the design’s ${d.missing}` : ''
	].filter(Boolean);
	return { matches: false, words: `the log shows ${shown}; the design is ${d.name} (${differences.join(', ')})` };
}

/** Least squares of u = c + a·cos θ + b·sin θ: the once-per-turn sine through the spaces. */
class SineFit {
	private readonly s = new Float64Array(9);
	add(theta: number, u: number) {
		const c = Math.cos(theta);
		const n = Math.sin(theta);
		const s = this.s;
		s[0]! += 1;
		s[1]! += c;
		s[2]! += n;
		s[3]! += c * c;
		s[4]! += c * n;
		s[5]! += n * n;
		s[6]! += u;
		s[7]! += u * c;
		s[8]! += u * n;
	}
	/** [c, a, b], or null when the angles do not span a turn. */
	solve(): [number, number, number] | null {
		const [n, c, s, cc, cs, ss, u, uc, us] = this.s as unknown as number[];
		const m = [
			[n!, c!, s!, u!],
			[c!, cc!, cs!, uc!],
			[s!, cs!, ss!, us!]
		];
		for (let col = 0; col < 3; col++) {
			let pivot = col;
			for (let r = col + 1; r < 3; r++) if (Math.abs(m[r]![col]!) > Math.abs(m[pivot]![col]!)) pivot = r;
			if (Math.abs(m[pivot]![col]!) < 1e-9 * Math.max(1, n!)) return null;
			[m[col], m[pivot]] = [m[pivot]!, m[col]!];
			for (let r = 0; r < 3; r++) {
				if (r === col) continue;
				const f = m[r]![col]! / m[col]![col]!;
				for (let k = col; k < 4; k++) m[r]![k]! -= f * m[col]![k]!;
			}
		}
		return [m[0]![3]! / m[0]![0]!, m[1]![3]! / m[1]![1]!, m[2]![3]! / m[2]![2]!];
	}
}

/**
 * The pattern, the noise, the speed swing and the runout in a log; compared with `design` when one
 * is given. The pattern needs two gaps seen at a steady interval and at least two tooth spaces
 * between gaps (N − M ≥ 3); the runout and swing need a whole turn.
 */
export function readEdgeLog(log: EdgeLog, design?: EdgeLogDesign): EdgeLogReading {
	const notes = [...log.notes];
	const listed = listedAtMost;
	const clean = withoutSplits(log);
	const sp = clean.spaces;
	const m = sp.length;
	const ref = bridgedSpaces(sp);
	const pitches = new Float64Array(m);
	// Pitch count and time (µs from the log's first edge) of each cleaned edge; edge k + 1 closes space k.
	const at = new Float64Array(m + 1);
	const time = new Float64Array(m + 1);
	for (let j = 0; j < m; j++) {
		// A pause in the log (the engine stopped) is as many pitches as it lasted, within reason.
		const ratio = sp[j]! / ref[j]!;
		pitches[j] = Number.isFinite(ratio) ? Math.min(maxPitches, Math.max(1, Math.round(ratio))) : 1;
		at[j + 1] = at[j]! + pitches[j]!;
		time[j + 1] = time[j]! + sp[j]!;
	}

	const base: EdgeLogReading = {
		kind: log.kind,
		unit: log.unit,
		from: log.from,
		edges: log.edges,
		pattern: null,
		matchesDesign: null,
		designDifference: null,
		missingEdges: { count: 0, at: [] },
		extraEdges: { count: clean.extraRows.length, rows: clean.extraRows.slice(0, listed) },
		speedSwingPct: null,
		runout: null,
		turns: 0,
		meanRpm: null,
		notes
	};
	const finish = (reading: EdgeLogReading): EdgeLogReading => {
		if (design)
			Object.assign(
				reading,
				(({ matches, words }) => ({ matchesDesign: matches, designDifference: words }))(compared(reading.pattern, design))
			);
		return reading;
	};

	// The gap: the most frequent long space (a dropped edge makes one too, but not every turn) ...
	const gapPitches = mode(
		(function* () {
			for (let j = 0; j < m; j++) if (pitches[j]! >= 2) yield pitches[j]!;
		})(),
		true
	);
	if (gapPitches === null) {
		notes.push('No space stands out as a gap: a wheel without one, or a log shorter than a turn.');
		return finish(base);
	}
	// A long space half-way between the gap and the gap with a dropped edge beside it is settled by
	// the other gaps of the log rather than by rounding: on a wheel of few teeth a swing moves every
	// gap off a whole count (8-3 at 18 %: the gaps read 4.26 spaces, one beside a dropped edge 4.51;
	// 8-4 at 16 %: 4.55, and one with a dropped edge 5.49). An N-1 gap is as long as a dropped edge
	// and is left to the turn to tell apart, below.
	const gapRatios: number[] = [];
	for (let j = 0; j < m; j++) if (pitches[j] === gapPitches) gapRatios.push(sp[j]! / ref[j]!);
	gapRatios.sort((x, y) => x - y);
	const typicalGap = gapRatios[gapRatios.length >> 1]!;
	for (let j = 0; gapPitches >= 3 && j < m; j++) {
		const ratio = sp[j]! / ref[j]!;
		const below = Math.floor(ratio);
		// Only a near tie between the gap's count and one more (written so a NaN, from spaces of no time, is passed by).
		if (!(below >= gapPitches && below <= gapPitches + 1 && Math.abs(ratio - below - 0.5) <= clearly)) continue;
		// Of the two counts, the one whose length at the gaps' pace is nearer.
		const atGapPace = (count: number) => Math.abs(ratio - (typicalGap * count) / gapPitches);
		pitches[j] = atGapPace(below) <= atGapPace(below + 1) ? below : below + 1;
	}
	for (let j = 0; j < m; j++) at[j + 1] = at[j]! + pitches[j]!;
	const starts: number[] = [];
	for (let j = 0; j < m; j++) if (pitches[j] === gapPitches) starts.push(at[j]!);
	// ... and N: of the distances between them, the one whose turns explain the long spaces best.
	// A dropped edge half-way round makes a distance of half a turn, a gap that swallowed one a
	// distance of two turns; neither has a gap at its place in most of its turns.
	let longCount = 0;
	for (let j = 0; j < m; j++) if (pitches[j]! >= gapPitches) longCount++;
	const fitOf = (teeth: number) => {
		const phase = mode(starts.map((p) => mod(p, teeth)))!;
		const firstGap = mod(phase - at[0]!, teeth) + at[0]!;
		const expected = at[m]! >= firstGap + gapPitches ? Math.floor((at[m]! - gapPitches - firstGap) / teeth) + 1 : 0;
		// Gaps seen where they belong, a dropped edge beside one included (that space is longer than the gap).
		let seen = 0;
		let explained = 0;
		for (let j = 0; j < m; j++) {
			if (pitches[j]! < gapPitches) continue;
			const here = gapStartsIn(at[j]!, at[j + 1]! - gapPitches, phase, teeth);
			seen += here;
			if (here) explained++;
		}
		return { teeth, phase, seen, expected, score: seen / Math.max(1, expected) - (longCount - explained) / longCount };
	};
	// The 40 most frequent distances are tried (a noisy log has many, all rare but the turn and its multiples).
	const counts = new Map<number, number>();
	for (let k = 1; k < starts.length; k++) counts.set(starts[k]! - starts[k - 1]!, (counts.get(starts[k]! - starts[k - 1]!) ?? 0) + 1);
	const distances = [...counts]
		.filter(([d]) => d > gapPitches)
		.sort((a, b) => b[1] - a[1] || a[0] - b[0])
		.slice(0, 40)
		.map(([d]) => d);
	const fits = distances.map(fitOf);
	const chosen = fits.reduce<(typeof fits)[number] | null>((a, b) => (a === null || b.score > a.score + 1e-9 ? b : a), null);
	if (chosen === null) {
		notes.push('Only one gap in the log: at least two turns are needed to find the pattern.');
		return finish(base);
	}
	const { teeth, phase, seen, expected } = chosen;
	const missing = gapPitches - 1;
	if (seen < 2 || seen < 0.75 * expected) {
		notes.push(`Long spaces come irregularly (${starts.length} of them), not once a turn: no pattern found.`);
		return finish(base);
	}

	const inGap = (pitch: number) => {
		const k = mod(pitch - phase, teeth);
		return k >= 1 && k <= missing;
	};
	const tooth0 = phase + gapPitches;
	const missingAt: { row: number; count: number }[] = [];
	let missingCount = 0;
	let pauses = 0;
	const extraRows = [...clean.extraRows];
	for (let j = 0; j < m; j++) {
		const gapInside = gapPositionsIn(at[j]! + 1, at[j + 1]! - 1, phase, teeth, missing);
		const dropped = pitches[j]! - 1 - gapInside;
		if (dropped > 0) {
			missingCount += dropped;
			missingAt.push({ row: clean.rows[j]!, count: dropped });
			// More than a turn without an edge is no dropped edge: say so, for the first few.
			if (dropped >= teeth && ++pauses <= 3)
				notes.push(
					`Row ${clean.rows[j]}: no edge for ${round(sp[j]! / 1e6, 3)} s (${dropped} edges' worth): the engine or the logger paused.`
				);
		}
		// An edge where the gap is: noise, or an edge split off a tooth that the rounding kept.
		if (inGap(at[j + 1]!)) extraRows.push(clean.rows[j]!);
	}
	extraRows.sort((a, b) => a - b);

	// Tooth 0 edges: where whole turns start and end.
	const zeros: number[] = [];
	for (let k = 1; k <= m; k++) if (mod(at[k]! - tooth0, teeth) === 0 && at[k]! - gapPitches >= at[0]!) zeros.push(k);
	if (!zeros.length) {
		notes.push('No edge after a gap survives in the log: no pattern found.');
		return finish(base);
	}
	const first = zeros[0]!;
	const pattern: EdgeLogPattern = { teeth, missing, gapAt: clean.ends[first - 1]!, gapRow: clean.rows[first - 1]! };
	const whole: [number, number][] = [];
	for (let z = 1; z < zeros.length; z++) if (at[zeros[z]!]! - at[zeros[z - 1]!]! === teeth) whole.push([zeros[z - 1]!, zeros[z]!]);

	const perTurn = whole.map(([a, b]) => {
		const mean = teeth / (time[b]! - time[a]!);
		let lo = Infinity;
		let hi = -Infinity;
		for (let j = a; j < b; j++) {
			const v = pitches[j]! / sp[j]!;
			lo = Math.min(lo, v);
			hi = Math.max(hi, v);
		}
		return round((100 * (hi - lo)) / mean, 2);
	});

	// The runout is read from each tooth's speed over the speed expected there, fitted over whole
	// engine cycles where it can (an even number of turns): a four-stroke's once-per-cycle swing then
	// cancels. Speeds rather than spaces, and the expected speed taken from two turns at a time,
	// because a space is one over a speed: a swing of ±a leaves a²/2 once per turn in the spaces.
	const fitted = whole.length > 1 && whole.length % 2 ? whole.slice(0, -1) : whole;
	const cycles = fitted.length > 1 ? fitted.flatMap((turn, k) => (k % 2 ? [] : [[turn[0], fitted[k + 1]![1]] as const])) : fitted;
	// The expected pitch time, between the middles of the cycles, so a steady speed change is no wobble.
	const mids = cycles.map(([a, b]) => (time[a]! + time[b]!) / 2);
	const pitchTimes = cycles.map(([a, b]) => (time[b]! - time[a]!) / (at[b]! - at[a]!));
	const fit = new SineFit();
	let c = 0;
	for (const [a, b] of fitted) {
		for (let j = a; j < b; j++) {
			const mid = (time[j]! + time[j + 1]!) / 2;
			while (c < mids.length - 2 && mids[c + 1]! < mid) c++;
			const w = mids.length > 1 ? Math.min(1, Math.max(0, (mid - mids[c]!) / (mids[c + 1]! - mids[c]!))) : 0;
			const pitchTime = mids.length > 1 ? pitchTimes[c]! * (1 - w) + pitchTimes[c + 1]! * w : pitchTimes[0]!;
			fit.add((mod(at[j]! + pitches[j]! / 2 - tooth0, teeth) * 2 * Math.PI) / teeth, (pitches[j]! * pitchTime) / sp[j]!);
		}
	}
	const sine = fitted.length ? fit.solve() : null;

	const meanRpm = ((at[m]! - at[0]!) / teeth / (time[m]! / 1e6)) * 60;
	if (meanRpm < 20 || meanRpm > 30000) notes.push(`A mean speed of ${Math.round(meanRpm)} rpm: is the unit right (${log.unit})?`);
	return finish({
		...base,
		pattern,
		missingEdges: { count: missingCount, at: missingAt.slice(0, listed) },
		extraEdges: { count: extraRows.length, rows: extraRows.slice(0, listed) },
		speedSwingPct: perTurn.length
			? { perTurn, mean: round(perTurn.reduce((x, y) => x + y, 0) / perTurn.length, 2), max: perTurn.reduce((x, y) => Math.max(x, y), 0) }
			: null,
		runout: sine
			? {
					amplitudePct: round((100 * Math.hypot(sine[1], sine[2])) / sine[0], 2),
					phaseDeg: round(mod((Math.atan2(-sine[2], -sine[1]) * 180) / Math.PI, 360), 1)
				}
			: null,
		turns: zeros.length ? (at[zeros[zeros.length - 1]!]! - at[first]!) / teeth : 0,
		meanRpm: round(meanRpm, 1)
	});
}
