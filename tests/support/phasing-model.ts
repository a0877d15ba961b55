// A model of the running engine for the phasing tests, written apart from src/lib/trade/phasing.ts.
import type { PhasingInput } from '../../src/lib/trade/phasing';

/** What the model needs of a phasing input (the pattern with the wheel's names, the engine, the window). */
export type ModelInput = Pick<
	PhasingInput,
	'pattern' | 'duty' | 'mount' | 'stroke' | 'intervals' | 'toothAtTdc' | 'windowFromBtdc' | 'windowToBtdc'
>;

/**
 * An independent model of the running engine (geometry, not phasing.ts's formulas): walk the crank
 * through one engine cycle in small steps; at crank angle θ after TDC 1 the point of the wheel at
 * the sensor is toothAtTdc·p + θ/factor wheel degrees after tooth 0's leading edge. Material is
 * there when that point lies within `duty` of a pitch after a present tooth's leading edge (plus
 * the half-pitch extra tooth of N+1). A run without material longer than an ordinary space is a
 * gap. Clearance: the crank degrees from each cylinder's spark window to the nearest gap sample.
 */
export function modelClearances(i: ModelInput, step = 0.01): { gapRuns: number; clearances: number[] } {
	const factor = i.mount === 'cam' ? 2 : 1;
	const N = i.pattern.teeth;
	const pitch = 360 / N;
	const gone = new Set<number>(
		i.pattern.kind === 'missing'
			? Array.from({ length: i.pattern.missing }, (_, k) => N - 1 - k)
			: i.pattern.kind === 'custom'
				? i.pattern.missingPositions
				: i.pattern.kind === 'single'
					? Array.from({ length: N - 1 }, (_, k) => k + 1)
					: []
	);
	const material = (w: number) => {
		const at = (((w % 360) + 360) % 360) / pitch;
		const k = Math.floor(at);
		if (!gone.has(k) && at - k < i.duty) return true;
		if (i.pattern.kind === 'extra' && at - i.pattern.extraAfter - 0.5 >= 0 && at - i.pattern.extraAfter - 0.5 < i.duty) return true;
		return false;
	};
	const cycle = i.stroke === 4 ? 720 : 360;
	const steps = Math.round(cycle / step);
	const empty = Array.from({ length: steps }, (_, s) => !material(i.toothAtTdc * pitch + (s * step) / factor));
	// Runs of empty samples (wrapping round the cycle), kept when longer than an ordinary space.
	const ordinary = (1 - i.duty) * pitch * factor;
	const inGap = new Array<boolean>(steps).fill(false);
	let runs = 0;
	const start = empty.findIndex((e) => !e);
	if (start >= 0) {
		for (let s = 0; s < steps;) {
			const at = (start + s) % steps;
			if (!empty[at]) {
				s++;
				continue;
			}
			let len = 0;
			while (s + len < steps && empty[(start + s + len) % steps]) len++;
			if (len * step > ordinary + 2 * step * factor) {
				runs++;
				for (let j = 0; j < len; j++) inGap[(start + s + j) % steps] = true;
			}
			s += len;
		}
	}
	let tdc = 0;
	const tdcs = [0, ...i.intervals.slice(0, -1).map((v) => (tdc += v))];
	const clearances = tdcs.map((t) => {
		const w0 = t - i.windowFromBtdc;
		const w1 = t - i.windowToBtdc;
		let best = Infinity;
		for (let s = 0; s < steps; s++) {
			if (!inGap[s]) continue;
			const theta = s * step;
			for (const shift of [-cycle, 0, cycle]) {
				const x = theta + shift;
				best = Math.min(best, x < w0 ? w0 - x : x > w1 ? x - w1 : 0);
			}
		}
		return best;
	});
	return { gapRuns: runs / (i.stroke === 4 && factor === 1 ? 2 : 1), clearances };
}
