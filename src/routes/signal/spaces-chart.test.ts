import { describe, expect, it } from 'vitest';
import { frame, spacesChart, tracePath, traceFrame, yMaxOf, type ChartSpace } from './spaces-chart';

// The oracle: a 36-1 crank wheel at constant speed over a four-stroke cycle, laid out here by hand.
// Geometry (common practice): every space is one pitch of 10°, the gap two pitches, so the gap's
// space is 2× the one before and the space after it 0.5× the gap. Positions are read off a plot
// whose plotting area runs from x = 40 to 632 and y = 232 (zero) up to 12 (the scale's top), the
// frame the chart states.
function wheel36m1(): ChartSpace[] {
	const spaces: ChartSpace[] = [];
	let at = 0;
	let before = 10;
	for (let turn = 0; turn < 2; turn++)
		for (let tooth = 0; tooth < 35; tooth++) {
			const len = tooth === 0 ? 20 : 10;
			at += len;
			spaces.push({ atDeg: at, ratio: len / before, gap: tooth === 0 });
			before = len;
		}
	return spaces;
}

describe('spacesChart', () => {
	it('states the frame the oracle reads', () => {
		expect([frame.left, frame.width - frame.right, frame.height - frame.bottom, frame.top]).toEqual([40, 632, 232, 12]);
	});

	it('puts the gap bar at the height of ratio 2 and the ordinary bars at 1 (36-1, constant speed)', () => {
		const chart = spacesChart({ cycleDeg: 720, spaces: wheel36m1(), ratio: 1.5, bands: [] });
		// Scale top: tallest 2 with a tenth of room, rounded up to a half = 2.5.
		expect(chart.yMax).toBe(2.5);
		const yOf = (v: number) => 232 - (v / 2.5) * 220;
		const gaps = chart.bars.filter((b) => b.gap);
		expect(gaps).toHaveLength(2);
		for (const g of gaps) expect(g.y).toBeCloseTo(yOf(2), 9);
		// The space after the gap: half the one before it.
		expect(chart.bars[1]!.y).toBeCloseTo(yOf(0.5), 9);
		expect(chart.bars[5]!.y).toBeCloseTo(yOf(1), 9);
		expect(chart.bars[5]!.height).toBeCloseTo(232 - yOf(1), 9);
		expect(chart.ratioY).toBeCloseTo(yOf(1.5), 9);
		// Only the gaps stand above the ratio.
		expect(chart.bars.filter((b) => b.over).map((b) => b.gap)).toEqual([true, true]);
	});

	it('ends each bar where its space ends in the cycle', () => {
		const chart = spacesChart({ cycleDeg: 720, spaces: wheel36m1(), ratio: 1.5, bands: [] });
		// The first gap ends 20° into the cycle: x = 40 + 20/720 × 592.
		const first = chart.bars[0]!;
		expect(first.x + first.width).toBeCloseTo(40 + (20 / 720) * 592, 9);
		const last = chart.bars[chart.bars.length - 1]!;
		expect(last.x + last.width).toBeCloseTo(632, 9);
	});

	it('shades a compression stroke, split at the cycle end when it wraps', () => {
		const chart = spacesChart({
			cycleDeg: 720,
			spaces: [],
			ratio: 2,
			bands: [
				{ fromDeg: 540, toDeg: 720, label: 'cyl 1' },
				{ fromDeg: -90, toDeg: 90, label: 'cyl 2' }
			]
		});
		const px = (deg: number) => 40 + (deg / 720) * 592;
		expect(chart.bands[0]).toMatchObject({ label: 'cyl 1' });
		expect(chart.bands[0]!.x).toBeCloseTo(px(540), 9);
		expect(chart.bands[0]!.width).toBeCloseTo(px(720) - px(540), 9);
		// -90..90 is 630..720 and 0..90.
		expect(chart.bands.slice(1).map((b) => [Number(b.x.toFixed(6)), Number(b.width.toFixed(6))])).toEqual([
			[Number(px(630).toFixed(6)), Number((px(720) - px(630)).toFixed(6))],
			[Number(px(0).toFixed(6)), Number((px(90) - px(0)).toFixed(6))]
		]);
	});

	it('keeps the detection ratio on the scale when no space reaches it', () => {
		expect(yMaxOf({ ratio: 3, spaces: [{ atDeg: 10, ratio: 1, gap: false }] })).toBe(3.5);
		// An unreadable ratio (a zero space before) draws as nothing rather than breaking the scale.
		expect(spacesChart({ cycleDeg: 360, spaces: [{ atDeg: 10, ratio: Infinity, gap: false }], ratio: 2, bands: [] }).bars[0]!.height).toBe(
			0
		);
	});
});

describe('tracePath', () => {
	it('spans the samples across the plot, Hall levels from the bottom up', () => {
		const { d, spanMs } = tracePath([
			{ tMs: 5, level: 0 },
			{ tMs: 5, level: 1 },
			{ tMs: 7, level: 1 },
			{ tMs: 7, level: 0 }
		]);
		expect(spanMs).toBe(2);
		const bottom = traceFrame.height - traceFrame.bottom;
		expect(d).toBe(`M40.00 ${bottom.toFixed(2)} L40.00 10.00 L632.00 10.00 L632.00 ${bottom.toFixed(2)}`);
	});

	it('centres a VR swing on zero', () => {
		const { yOfLevel } = tracePath([
			{ tMs: 0, level: -2 },
			{ tMs: 1, level: 1 }
		]);
		// Zero halfway between the top (10) and the bottom (116).
		expect(yOfLevel(0)).toBeCloseTo((10 + 116) / 2, 9);
		expect(yOfLevel(2)).toBeCloseTo(10, 9);
	});
});
