// The crank's speed over the engine cycle, and from it the crank angle against time.
//
// Model (our own, simple on purpose): the speed is a mean speed times (1 + a·u(θ)), θ in crank
// degrees after cylinder 1's firing TDC. `a` is the swing, peak to peak, as a fraction of the mean
// speed. u is a dip centred on each cylinder's TDC (a raised cosine `eventWidthDeg` wide): the crank
// slows through the compression before TDC and speeds up after it. u averages 0 over the cycle
// (angle mean) and runs from its highest to its lowest over exactly 1, so the swing is what it says.
// The mean speed changes at a steady rate α (rpm per second) from the start (t = 0 at cylinder 1's
// TDC, cycle 1); before the start it holds steady, so the edges just before the start have times.
//
// Because the speed is a product of a function of time and one of angle, dθ/dt = ω̄(t)·s(θ)
// separates: ω̄₀·t + ½·α·t² = G(θ) with G(θ) = ∫₀^θ dφ / s(φ), so t follows from G by the
// quadratic formula. G is tabled once per cycle (Gauss–Legendre on one-degree cells) and read
// between the table's points by cubic Hermite (its slope 1/s is known exactly).
import { cycleDeg, firingTdcs, type Stroke } from './engine';

export interface EngineProfile {
	stroke: Stroke;
	/** Firing intervals, crank degrees, cylinder 1 first (engine.ts). */
	intervals: number[];
}

export interface MeanSpeed {
	/** Mean speed at the start, rpm. */
	rpm: number;
	/** Swing per compression event, peak to peak, percent of the mean speed. */
	swingPct: number;
	/** Steady change of the mean speed, rpm per second. */
	accelRpmPerS: number;
}

/**
 * Each compression event's width, crank degrees: half a turn about TDC (the compression stroke's
 * second half and the expansion's first, where the gas spring takes and gives back; from memory),
 * narrowed to the shortest firing interval so that two events never overlap.
 */
export const eventWidthDeg = (intervals: readonly number[]) => Math.min(180, ...intervals);

/** Where each cylinder's compression event slows the crank: crank degrees in the cycle, TDC in the middle. */
export function compressionEvents(profile: EngineProfile): { cylinder: number; fromDeg: number; tdcDeg: number; toDeg: number }[] {
	const w = eventWidthDeg(profile.intervals);
	const cycle = cycleDeg(profile.stroke);
	return firingTdcs(profile.intervals).map((tdc, i) => {
		const fromDeg = (((tdc - w / 2) % cycle) + cycle) % cycle;
		return { cylinder: i + 1, fromDeg, tdcDeg: tdc, toDeg: fromDeg + w };
	});
}

/**
 * The swing's shape u(θ) over the cycle: zero angle-mean, highest minus lowest exactly 1, lowest at
 * each cylinder's TDC. Periodic: any θ is taken round the cycle.
 */
export function swingShape(profile: EngineProfile): (thetaDeg: number) => number {
	const cycle = cycleDeg(profile.stroke);
	const w = eventWidthDeg(profile.intervals);
	const tdcs = firingTdcs(profile.intervals);
	// A raised cosine averages 1/2 over its width: the dips' angle-mean over the cycle.
	const mean = (tdcs.length * w) / (2 * cycle);
	return (theta) => {
		let dip = 0;
		for (const tdc of tdcs) {
			// Distance to this TDC, taken round the cycle into (−cycle/2, cycle/2].
			let d = (theta - tdc) % cycle;
			if (d > cycle / 2) d -= cycle;
			else if (d <= -cycle / 2) d += cycle;
			if (Math.abs(d) < w / 2) dip += (1 + Math.cos((2 * Math.PI * d) / w)) / 2;
		}
		return mean - dip;
	};
}

/** The crank's motion for one speed case. */
export interface CrankMotion {
	cycleDeg: number;
	/**
	 * Seconds from the start to crank angle θ (crank degrees after cylinder 1's TDC, cycle 1; negative
	 * before the start). NaN past the point where a deceleration would stop the engine.
	 */
	timeAt(thetaDeg: number): number;
	/** Crank speed at angle θ, rpm (NaN past a stop). */
	rpmAt(thetaDeg: number): number;
	/** About where a deceleration stops the engine, crank degrees (G taken as linear over the cycle), or Infinity. */
	stopsAtDeg: number;
}

// Three-point Gauss–Legendre on [−1, 1].
const gaussX = [-Math.sqrt(3 / 5), 0, Math.sqrt(3 / 5)];
const gaussW = [5 / 9, 8 / 9, 5 / 9];

/** The swing's shape sampled once per engine profile, for every speed case on it: at each cell's ends and Gauss points. */
export interface SwingTable {
	cycle: number;
	/** Cell width, crank degrees. */
	h: number;
	atNodes: Float64Array;
	atGauss: Float64Array;
}

export function swingTable(profile: EngineProfile): SwingTable {
	const cycle = cycleDeg(profile.stroke);
	const u = swingShape(profile);
	// One-degree cells: the shape varies over tens of degrees, so the Hermite reading between the
	// nodes stays far inside a thousandth of a degree.
	const cells = cycle;
	const h = cycle / cells;
	const atNodes = new Float64Array(cells + 1);
	const atGauss = new Float64Array(cells * 3);
	for (let k = 0; k <= cells; k++) atNodes[k] = u(k * h);
	for (let k = 0; k < cells; k++) for (let j = 0; j < 3; j++) atGauss[k * 3 + j] = u(k * h + (h / 2) * (1 + gaussX[j]!));
	return { cycle, h, atNodes, atGauss };
}

export function crankMotion(profile: EngineProfile, speed: MeanSpeed, table: SwingTable = swingTable(profile)): CrankMotion {
	const { cycle, h } = table;
	const cells = table.atNodes.length - 1;
	const a = speed.swingPct / 100;
	const u = swingShape(profile);
	const s = (theta: number) => 1 + a * u(theta);
	const w0 = speed.rpm * 6; // deg/s
	const alpha = speed.accelRpmPerS * 6; // deg/s²

	const g = new Float64Array(cells + 1);
	const slope = new Float64Array(cells + 1);
	for (let k = 0; k <= cells; k++) slope[k] = 1 / (1 + a * table.atNodes[k]!);
	for (let k = 0; k < cells; k++) {
		let sum = 0;
		for (let j = 0; j < 3; j++) sum += gaussW[j]! / (1 + a * table.atGauss[k * 3 + j]!);
		g[k + 1] = g[k]! + (sum * h) / 2;
	}
	const perCycle = g[cells]!;

	const G = (theta: number) => {
		const q = Math.floor(theta / cycle);
		const r = theta - q * cycle;
		const k = Math.min(cells - 1, Math.floor(r / h));
		const x = (r - k * h) / h;
		// Cubic Hermite on the cell, from the values and the exact slopes at its ends.
		const x2 = x * x;
		const x3 = x2 * x;
		const value =
			(2 * x3 - 3 * x2 + 1) * g[k]! + (x3 - 2 * x2 + x) * h * slope[k]! + (-2 * x3 + 3 * x2) * g[k + 1]! + (x3 - x2) * h * slope[k + 1]!;
		return q * perCycle + value;
	};

	// Under a deceleration the mean speed reaches 0 at G = −ω̄₀²/(2α): past it, no time.
	const gStop = alpha < 0 ? (w0 * w0) / (2 * -alpha) : Infinity;
	const stopsAtDeg = Number.isFinite(gStop) ? (gStop / perCycle) * cycle : Infinity;

	const timeAt = (theta: number) => {
		const gv = G(theta);
		if (gv <= 0 || alpha === 0) return gv / w0;
		const disc = w0 * w0 + 2 * alpha * gv;
		if (disc < 0) return NaN;
		// t = (−ω̄₀ + √disc)/α, written without the cancellation for a small α.
		return (2 * gv) / (w0 + Math.sqrt(disc));
	};
	const rpmAt = (theta: number) => {
		const t = timeAt(theta);
		const mean = t <= 0 ? w0 : w0 + alpha * t;
		return (mean * s(theta)) / 6;
	};
	return { cycleDeg: cycle, timeAt, rpmAt, stopsAtDeg };
}
