// The signal page's pictures as plain numbers: where each tooth space's bar, the detection ratio's
// line, the gap and the compression bands sit in the SVG's own units, and the sensor trace's path.
// Pure (no Svelte, no DOM), so the unit tests read the geometry without a browser.

/** One tooth space: where it ends in the cycle (crank degrees) and its length over the space before it. */
export interface ChartSpace {
	atDeg: number;
	ratio: number;
	/** The wheel's gap (by the design, not by what the ECU decided). */
	gap: boolean;
}

/** A stretch of the cycle to shade: a cylinder's compression stroke, where the crank slows. */
export interface ChartBand {
	fromDeg: number;
	toDeg: number;
	label: string;
}

export interface ChartInput {
	cycleDeg: number;
	spaces: readonly ChartSpace[];
	/** The detection ratio: a space longer than this times the one before counts as the gap. */
	ratio: number;
	bands: readonly ChartBand[];
}

/** The plot's frame in SVG units: wide and short, so on a phone's width the bars stay apart and the labels readable. */
export const frame = { width: 640, height: 260, left: 40, right: 8, top: 12, bottom: 28 } as const;
const plotWidth = frame.width - frame.left - frame.right;
const plotBottom = frame.height - frame.bottom;
const plotHeight = plotBottom - frame.top;

export interface Bar {
	x: number;
	y: number;
	width: number;
	height: number;
	gap: boolean;
	/** Above the detection ratio: the ECU would take this space for the gap. */
	over: boolean;
	ratio: number;
	atDeg: number;
}

export interface SpacesChart {
	yMax: number;
	bars: Bar[];
	ratioY: number;
	bands: { x: number; width: number; label: string }[];
	yTicks: { y: number; value: number }[];
	xTicks: { x: number; deg: number }[];
}

/** The scale's top: room above the tallest bar and the ratio line, rounded up to a half. */
export function yMaxOf(input: Pick<ChartInput, 'spaces' | 'ratio'>): number {
	const tallest = Math.max(input.ratio, ...input.spaces.map((s) => (Number.isFinite(s.ratio) ? s.ratio : 0)));
	return Math.max(1.5, Math.ceil(tallest * 1.1 * 2) / 2);
}

const xOf = (deg: number, cycleDeg: number) => frame.left + (deg / cycleDeg) * plotWidth;
const yOf = (value: number, yMax: number) => plotBottom - (Math.min(value, yMax) / yMax) * plotHeight;

/** Every shape of the chart of tooth spaces over one cycle. */
export function spacesChart(input: ChartInput): SpacesChart {
	const { cycleDeg } = input;
	const yMax = yMaxOf(input);
	const slot = plotWidth / Math.max(1, input.spaces.length);
	// Bars thin enough to stay apart, but never thinner than a hairline on a 60-2 over a four-stroke cycle.
	const width = Math.max(1, slot * 0.7);
	const bars = input.spaces.map((s) => {
		const ratio = Number.isFinite(s.ratio) ? Math.max(0, s.ratio) : 0;
		const y = yOf(ratio, yMax);
		// A space is drawn ending where it ends: its bar sits just left of its end.
		const x = xOf(s.atDeg, cycleDeg) - width;
		return { x, y, width, height: plotBottom - y, gap: s.gap, over: ratio > input.ratio, ratio, atDeg: s.atDeg };
	});
	const bands = input.bands.flatMap((b) => {
		// A compression that starts before the cycle's 0 wraps round to its end.
		const from = ((b.fromDeg % cycleDeg) + cycleDeg) % cycleDeg;
		const to = from + (b.toDeg - b.fromDeg);
		const parts: [number, number][] =
			to <= cycleDeg
				? [[from, to]]
				: [
						[from, cycleDeg],
						[0, to - cycleDeg]
					];
		return parts.map(([a, z]) => ({ x: xOf(a, cycleDeg), width: xOf(z, cycleDeg) - xOf(a, cycleDeg), label: b.label }));
	});
	const step = yMax <= 3 ? 0.5 : yMax <= 6 ? 1 : 2;
	const yTicks = [];
	for (let v = 0; v <= yMax + 1e-9; v += step) yTicks.push({ y: yOf(v, yMax), value: Number(v.toFixed(1)) });
	const xStep = cycleDeg > 360 ? 180 : 90;
	const xTicks = [];
	for (let d = 0; d <= cycleDeg; d += xStep) xTicks.push({ x: xOf(d, cycleDeg), deg: d });
	return { yMax, bars, ratioY: yOf(input.ratio, yMax), bands, yTicks, xTicks };
}

/** One sample of the sensor's output: time from the start, in ms, and the level (0–1 for Hall, volts for VR). */
export interface TraceSample {
	tMs: number;
	level: number;
}

export const traceFrame = { width: 640, height: 140, left: 40, right: 8, top: 10, bottom: 24 } as const;

/** The trace as an SVG path over the samples' span; its level scale is symmetric for a VR sensor's swing about zero. */
export function tracePath(samples: readonly TraceSample[]): { d: string; yOfLevel: (level: number) => number; spanMs: number } {
	const w = traceFrame.width - traceFrame.left - traceFrame.right;
	const bottom = traceFrame.height - traceFrame.bottom;
	const h = bottom - traceFrame.top;
	if (!samples.length) return { d: '', yOfLevel: () => bottom, spanMs: 0 };
	const t0 = samples[0]!.tMs;
	const spanMs = Math.max(1e-9, samples[samples.length - 1]!.tMs - t0);
	const low = Math.min(0, ...samples.map((s) => s.level));
	const high = Math.max(1e-9, ...samples.map((s) => s.level));
	const lo = low < 0 ? -Math.max(-low, high) : 0;
	const hi = low < 0 ? Math.max(-low, high) : high;
	const yOfLevel = (level: number) => bottom - ((level - lo) / (hi - lo)) * h;
	const d = samples
		.map((s, i) => `${i ? 'L' : 'M'}${(traceFrame.left + ((s.tMs - t0) / spanMs) * w).toFixed(2)} ${yOfLevel(s.level).toFixed(2)}`)
		.join(' ');
	return { d, yOfLevel, spanMs };
}
