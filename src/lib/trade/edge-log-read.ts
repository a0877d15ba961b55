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

/** How far a span of `x` pitches is from a whole number of them (at least one). */
const offWhole = (x: number) => (Number.isFinite(x) ? Math.abs(x - Math.max(1, Math.round(x))) : Infinity);

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
	const ref = neighbourSpaces(sp);
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
			if (offWhole(back / r0) < offWhole(ahead / r0)) {
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
	const ref = neighbourSpaces(sp);
	const pitches = new Int32Array(m);
	// Pitch count and time (µs from the log's first edge) of each cleaned edge; edge k + 1 closes space k.
	const at = new Int32Array(m + 1);
	const time = new Float64Array(m + 1);
	for (let j = 0; j < m; j++) {
		pitches[j] = Math.max(1, Math.round(sp[j]! / ref[j]!));
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
	const starts: number[] = [];
	for (let j = 0; j < m; j++) if (pitches[j] === gapPitches) starts.push(at[j]!);
	// ... and N, the pitches from one to the next.
	const teeth = mode(
		starts.slice(1).map((p, k) => p - starts[k]!),
		false
	);
	if (teeth === null || teeth <= gapPitches) {
		notes.push('Only one gap in the log: at least two turns are needed to find the pattern.');
		return finish(base);
	}
	const missing = gapPitches - 1;
	const phase = mode(starts.map((p) => mod(p, teeth)))!;
	const firstGap = mod(phase - at[0]!, teeth) + at[0]!;
	const expected = at[m]! >= firstGap + gapPitches ? Math.floor((at[m]! - gapPitches - firstGap) / teeth) + 1 : 0;
	const seen = starts.filter((p) => mod(p - phase, teeth) === 0).length;
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
	const extraRows = [...clean.extraRows];
	for (let j = 0; j < m; j++) {
		let gapInside = 0;
		for (let x = at[j]! + 1; x < at[j + 1]!; x++) if (inGap(x)) gapInside++;
		const dropped = pitches[j]! - 1 - gapInside;
		if (dropped > 0) {
			missingCount += dropped;
			missingAt.push({ row: clean.rows[j]!, count: dropped });
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

	// Each space over the pitch time at its middle, the pitch time interpolated between the middles
	// of whole turns so that a steady speed change does not read as a wobble.
	const mids = whole.map(([a, b]) => (time[a]! + time[b]!) / 2);
	const pitchTimes = whole.map(([a, b]) => (time[b]! - time[a]!) / teeth);
	const fit = new SineFit();
	let t = 0;
	for (const [a, b] of whole) {
		for (let j = a; j < b; j++) {
			const mid = (time[j]! + time[j + 1]!) / 2;
			while (t < mids.length - 2 && mids[t + 1]! < mid) t++;
			const span = mids.length > 1 ? (mid - mids[t]!) / (mids[t + 1]! - mids[t]!) : 0;
			const w = Math.min(1, Math.max(0, span));
			const pitchTime = mids.length > 1 ? pitchTimes[t]! * (1 - w) + pitchTimes[t + 1]! * w : pitchTimes[0]!;
			fit.add((mod(at[j]! + pitches[j]! / 2 - tooth0, teeth) * 2 * Math.PI) / teeth, sp[j]! / (pitches[j]! * pitchTime));
		}
	}
	const sine = whole.length ? fit.solve() : null;

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
					phaseDeg: round(mod((Math.atan2(sine[2], sine[1]) * 180) / Math.PI, 360), 1)
				}
			: null,
		turns: zeros.length ? (at[zeros[zeros.length - 1]!]! - at[first]!) / teeth : 0,
		meanRpm: round(meanRpm, 1)
	});
}
