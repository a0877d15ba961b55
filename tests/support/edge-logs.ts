// Edge logs made from known wheels, the edge-log reader's oracle: no imports from src. A wheel of
// N positions with M missing in a row turns past a sensor; its speed is integrated from
// dφ/dt = ω̄(t)·(1 + a·sin(k·φ + ψ)), ω̄(t) = ω₀ + α·t (RK4 in the angle, steps of a twentieth of a
// pitch), so a speed swing and a steady acceleration are both in the times. Runout moves each edge
// by A·sin(θ − φ₀) (an eccentric wheel seen by a fixed sensor, small-angle geometry), which makes
// each space p·(1 + (2A·sin(p/2)/p)·cos(θ_mid − φ₀)) long: A is set from the wanted amplitude.

export interface WheelRun {
	teeth: number;
	missing: number;
	rpm: number;
	turns: number;
	/** Position (0 = first tooth after the gap) of the first edge logged. */
	startPosition?: number;
	/** Speed swing, (max − min) over mean in percent, a sine of `swingOrder` swings per turn. */
	swingPct?: number;
	/** 1: once a turn; 0.5: once per four-stroke cycle (a single cylinder's compression). */
	swingOrder?: number;
	swingPhaseDeg?: number;
	accelRpmPerS?: number;
	/** Amplitude of the once-per-turn wobble of the spaces, percent of a space. */
	runoutPct?: number;
	/** Wheel angle from tooth 0's edge where the spaces are longest. */
	runoutPhaseDeg?: number;
	/** Each edge moved by up to ± this share of a pitch's time (uniform, seeded). */
	jitter?: number;
	/** Indices in the list of true edges that the sensor misses. */
	drop?: number[];
	/** Indices in the list of true edges followed by a spike a tenth of a space later. */
	double?: number[];
	seed?: number;
}

export interface LoggedEdge {
	timeUs: number;
	/** True edges: the wheel position (0 … N − 1) and the count of positions from tooth 0 of turn 0. */
	position: number | null;
	global: number | null;
}

/** Seeded uniform numbers in [0, 1): mulberry32. */
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

/** Every edge the sensor reports, in time order (µs from the start of the run). */
export function wheelEdges(run: WheelRun): LoggedEdge[] {
	const { teeth: n, missing: m } = run;
	const p = (2 * Math.PI) / n;
	const a = (run.swingPct ?? 0) / 200;
	const order = run.swingOrder ?? 1;
	const psi = ((run.swingPhaseDeg ?? 0) * Math.PI) / 180;
	const w0 = (run.rpm * 2 * Math.PI) / 60 / 1e6; // rad per µs
	const alpha = ((run.accelRpmPerS ?? 0) * 2 * Math.PI) / 60 / 1e12; // rad per µs²
	const rel = (run.runoutPct ?? 0) / 100;
	const shift = (rel * p) / (2 * Math.sin(p / 2));
	const phi0 = ((run.runoutPhaseDeg ?? 0) * Math.PI) / 180;
	const rand = random(run.seed ?? 1);

	const dtdphi = (phi: number, t: number) => 1 / ((w0 + alpha * t) * (1 + a * Math.sin(order * phi + psi)));
	let phi = 0;
	let t = 0;
	const h = p / 20;
	const advance = (to: number) => {
		while (phi < to) {
			const step = Math.min(h, to - phi);
			const k1 = dtdphi(phi, t);
			const k2 = dtdphi(phi + step / 2, t + (step / 2) * k1);
			const k3 = dtdphi(phi + step / 2, t + (step / 2) * k2);
			const k4 = dtdphi(phi + step, t + step * k3);
			t += (step / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
			phi += step;
		}
	};

	const start = run.startPosition ?? 0;
	const truth: LoggedEdge[] = [];
	// The run starts a pitch before the first logged edge, so that edge has a time after zero.
	const first = start - 1;
	for (let g = start; g < start + run.turns * n; g++) {
		const position = ((g % n) + n) % n;
		if (position >= n - m) continue;
		const angle = (g - first) * p + shift * Math.sin(g * p - phi0);
		advance(angle);
		truth.push({ timeUs: t, position, global: g });
	}
	const pitchUs = 60e6 / run.rpm / n;
	for (const e of truth) e.timeUs += (rand() * 2 - 1) * (run.jitter ?? 0) * pitchUs;

	const dropped = new Set(run.drop ?? []);
	const doubled = new Set(run.double ?? []);
	const out: LoggedEdge[] = [];
	truth.forEach((e, i) => {
		if (!dropped.has(i)) out.push(e);
		if (doubled.has(i) && i + 1 < truth.length) {
			out.push({ timeUs: e.timeUs + 0.1 * (truth[i + 1]!.timeUs - e.timeUs), position: null, global: null });
		}
	});
	return out;
}

export type LogUnit = 's' | 'ms' | 'us' | 'space';

/** The edges as a log file: one value a row, `header` on the first row (none when null). */
export function edgeLogCsv(edges: LoggedEdge[], unit: LogUnit, header: string | null = defaultHeader[unit]): string {
	const rows =
		unit === 'space'
			? edges.slice(1).map((e, i) => (e.timeUs - edges[i]!.timeUs).toFixed(2))
			: edges.map((e) => (unit === 's' ? (e.timeUs / 1e6).toFixed(9) : unit === 'ms' ? (e.timeUs / 1e3).toFixed(6) : e.timeUs.toFixed(2)));
	return [...(header === null ? [] : [header]), ...rows].join('\n') + '\n';
}

const defaultHeader: Record<LogUnit, string> = { s: 'time_s', ms: 'time_ms', us: 'time_us', space: 'space_us' };

/**
 * What the reader should find, worked out from the wheel's own edges: the index and row of the
 * first tooth-0 edge with the whole gap before it in the log, the rows of the edges after dropped
 * ones (with how many were dropped there) and the rows of the spikes, rows counted as in the file.
 */
export function expectedReading(run: WheelRun, edges: LoggedEdge[], unit: LogUnit, header = true) {
	const rowOfEdge = (i: number) => (unit === 'space' ? i : i + 1) + (header ? 1 : 0);
	const firstGlobal = edges.find((e) => e.global !== null)!.global!;
	const gapAt = edges.findIndex((e) => e.position === 0 && e.global! - run.missing - 1 >= firstGlobal);
	const missing = new Map<number, number>();
	let lastGlobal: number | null = null;
	edges.forEach((e, i) => {
		if (e.global === null) return;
		// Positions skipped since the last edge, less the gap's.
		if (lastGlobal !== null) {
			let skipped = 0;
			for (let g = lastGlobal + 1; g < e.global; g++) if (((g % run.teeth) + run.teeth) % run.teeth < run.teeth - run.missing) skipped++;
			if (skipped) missing.set(rowOfEdge(i), skipped);
		}
		lastGlobal = e.global;
	});
	return {
		gapAt,
		gapRow: rowOfEdge(gapAt),
		missing: [...missing].map(([row, count]) => ({ row, count })),
		extraRows: edges.flatMap((e, i) => (e.global === null ? [rowOfEdge(i)] : []))
	};
}
