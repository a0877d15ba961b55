// The clocking sweep's inner loop (signal.ts). Every clocking the sweep tries puts the read edges
// on one grid of crank angles, so the times come from a table read by index: the sweep judges
// hundreds of clockings per change of the /signal page, and closures and rounding per edge were
// most of the check's time.
import type { GapRule } from './signal';

/**
 * One space's share of the sync margin: how far the gap stays above the ratio (and the space after
 * it under the second ratio), or an ordinary space below it (and its next under the second ratio).
 */
export function marginTerm(ratio: number, next: number, isGap: boolean, rule: GapRule): number {
	const after = rule.afterRatio;
	return isGap
		? Math.min(ratio / rule.ratio - 1, after === undefined ? Infinity : 1 - next / after)
		: Math.max(1 - ratio / rule.ratio, after === undefined || !Number.isFinite(next) ? -Infinity : next / after - 1);
}

/** A motion's times on the grid `origin` + i·`step` crank degrees, for i from `start` on. */
export interface TimeTable {
	origin: number;
	step: number;
	start: number;
	times: Float64Array;
}

export function timeTable(timeAt: (thetaDeg: number) => number, origin: number, step: number, from: number, to: number): TimeTable {
	const start = Math.floor((from - origin) / step) - 1;
	const end = Math.ceil((to - origin) / step) + 1;
	const times = new Float64Array(end - start + 1);
	for (let i = start; i <= end; i++) times[i - start] = timeAt(origin + i * step);
	return { origin, step, start, times };
}

/** What the sweep knows of one wheel turn at one clocking: the read edges' crank angles, ascending. */
export interface GridTurn {
	at: Float64Array;
	/** Each edge's grid index, `at` = origin + index·step (the table's grid). */
	index: Int32Array;
	/** Crank degrees per turn of the wheel and grid steps per turn. */
	wheelTurn: number;
	stepsPerTurn: number;
}

export function gridTurn(at: Float64Array, origin: number, step: number, wheelTurn: number): GridTurn {
	const index = new Int32Array(at.length);
	for (let j = 0; j < at.length; j++) index[j] = Math.round((at[j]! - origin) / step);
	return { at, index, wheelTurn, stepsPerTurn: Math.round(wheelTurn / step) };
}

/**
 * The worst margin over the spaces that end in [from, to): the same rule and the same edges as
 * signal.ts's `judge`, each space with the one before and the one after it.
 */
export function gridMargin(turn: GridTurn, table: TimeTable, rule: GapRule, gapSpan: number, from: number, to: number): number {
	const { at, index, wheelTurn, stepsPerTurn } = turn;
	const count = at.length;
	const times = table.times;
	// Edge n is (j, k): at[j] + k·wheelTurn, time times[index[j] + k·stepsPerTurn − start].
	let k = Math.floor(from / wheelTurn);
	let j = 0;
	while (at[j]! + k * wheelTurn < from) {
		if (++j === count) {
			j = 0;
			k++;
		}
	}
	// Two edges back for the spaces before the first.
	let jb = j - 2;
	let kb = k;
	while (jb < 0) {
		jb += count;
		kb--;
	}
	const timeOf = (jj: number, kk: number) => times[index[jj]! + kk * stepsPerTurn - table.start]!;
	const thetaOf = (jj: number, kk: number) => at[jj]! + kk * wheelTurn;
	let t0 = timeOf(jb, kb);
	if (++jb === count) {
		jb = 0;
		kb++;
	}
	let th1 = thetaOf(jb, kb);
	let t1 = timeOf(jb, kb);
	let th2 = thetaOf(j, k);
	let t2 = timeOf(j, k);
	let margin = Infinity;
	while (th2 < to) {
		if (++j === count) {
			j = 0;
			k++;
		}
		const th3 = at[j]! + k * wheelTurn;
		const t3 = times[index[j]! + k * stepsPerTurn - table.start]!;
		const space = t2 - t1;
		const ratio = space / (t1 - t0);
		if (Number.isFinite(ratio)) {
			const term = marginTerm(ratio, (t3 - t2) / space, th2 - th1 > gapSpan, rule);
			if (term < margin) margin = term;
		}
		th1 = th2;
		th2 = th3;
		t0 = t1;
		t1 = t2;
		t2 = t3;
	}
	return margin;
}
