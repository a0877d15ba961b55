import { describe, expect, it } from 'vitest';
import { edgeLogCsv, expectedReading, wheelEdges, type WheelRun } from '$support/edge-logs';
import { edgeLogLimits, parseEdgeLog, readEdgeLog, type EdgeLog, type EdgeLogDesign } from './edge-log';

const parsed = (text: string): EdgeLog => {
	const p = parseEdgeLog(text);
	if (!p.ok) throw new Error(JSON.stringify(p.refusals));
	return p.value;
};
const refused = (text: string) => {
	const p = parseEdgeLog(text);
	return p.ok ? null : p.refusals;
};
const read = (text: string, design?: EdgeLogDesign) => readEdgeLog(parsed(text), design);

describe('parseEdgeLog: the format', () => {
	it('takes the unit from the header and gives spaces in µs (unit factors: SI prefixes)', () => {
		for (const [header, factor] of [
			['time_s', 1e6],
			['time (ms)', 1e3],
			['t_us', 1],
			['Zeit µs', 1],
			['time μs', 1]
		] as const) {
			const log = parsed(`${header}\n1\n3\n6\n`);
			expect(log.kind).toBe('times');
			expect(log.from).toBe('header');
			expect(log.spacesUs).toEqual([2 * factor, 3 * factor]);
		}
		const spaces = parsed('space_ms,tooth\n2,1\n3,2\n2,3\n');
		expect(spaces).toMatchObject({ kind: 'spaces', unit: 'ms', spacesUs: [2000, 3000, 2000], edges: 4, rows: [2, 3, 4] });
		// `space` alone: microseconds, what tooth loggers write (documented in docs/edge-log-format.md).
		expect(parsed('space\n200\n400\n200\n')).toMatchObject({ kind: 'spaces', unit: 'us', spacesUs: [200, 400, 200] });
	});

	it('reads rows as an editor counts them: blank lines and # comments skipped, a second column ignored', () => {
		const log = parsed('# scope export\ntime_us\n\n100;7\n200\t8\n# pause\n300 9\r\n400,10\n');
		expect(log.rows).toEqual([5, 7, 8]);
		expect(log.spacesUs).toEqual([100, 100, 100]);
	});

	it('without a header: times climb, spaces rise and fall; under 2 is seconds, 20 and over microseconds', () => {
		expect(parsed('0.001\n0.002\n0.0031\n0.0041\n')).toMatchObject({ kind: 'times', unit: 's', from: 'inferred' });
		expect(parsed('1000\n1100\n1300\n1400\n')).toMatchObject({ kind: 'times', unit: 'us' });
		expect(parsed('100\n100\n200\n100\n100\n200\n100\n')).toMatchObject({ kind: 'spaces', unit: 'us' });
		expect(parsed('100\n100\n200\n100\n').notes.join(' ')).toMatch(/tooth spaces/);
		expect(refused('5\n10\n15\n20\n')![0]!.message).toMatch(/cannot tell the unit.*milliseconds/);
	});

	it('names the row of what is wrong, on the field log', () => {
		const bad = (rows: string[]) => refused(rows.join('\n'))!;
		const times = Array.from({ length: 20 }, (_, i) => String(1000 + 100 * i));
		expect(bad(['time_us', ...times.slice(0, 15), '12x', ...times.slice(16)])).toEqual([
			{ field: 'log', message: 'row 17: not a number (“12x”); one edge time or tooth space per row, a point for decimals' }
		]);
		expect(bad(['time_us', '1000', '900', '1100'])).toEqual([{ field: 'log', message: 'row 3: time goes backwards (900 after 1000)' }]);
		expect(bad(['space_us', '100', '-5', '100'])[0]!.message).toBe('row 3: a tooth space cannot be negative (-5)');
		// A header only on the first row: a word later is a bad row, not a second header.
		expect(bad(['100', '200', 'time_us', '300'])[0]!.message).toMatch(/^row 3: not a number/);
		expect(bad([])[0]!.message).toMatch(/^no rows/);
		expect(bad(['time_us', '1', '2'])[0]!.message).toMatch(/^only 2 rows/);
		expect(bad(['time_us', '5', '5', '5'])[0]!.message).toMatch(/every space is zero/);
	});

	it('refuses numbers past any clock', () => {
		expect(refused('time_us\n1\n1e400\n')![0]!.message).toBe('row 3: too large a number (“1e400”)');
		expect(refused('time_us\n-9e15\n9e15\n')![0]!.message).toMatch(/^row 2: too large a number/);
	});

	it('caps the rows and the size', () => {
		const rows = Array.from({ length: edgeLogLimits.rows + 1 }, (_, i) => String(i * 100 + 100));
		expect(refused(rows.join('\n'))![0]!.message).toBe(`row ${edgeLogLimits.rows + 1}: more than 200,000 rows; split the log`);
		expect(refused('1'.repeat(edgeLogLimits.bytes + 1))![0]!.message).toMatch(/at most 4 MiB/);
	});
});

describe('readEdgeLog: logs of known wheels (tests/support/edge-logs.ts)', () => {
	const log = (run: WheelRun, unit: 'us' | 's' | 'ms' | 'space' = 'us') => {
		const edges = wheelEdges(run);
		return { text: edgeLogCsv(edges, unit), expected: expectedReading(run, edges, unit), edges };
	};

	// Geometry (design.md): at constant speed the gap's space is (M + 1) tooth spaces; rpm = 60 / turn time.
	it('a 36-1 at a steady 1000 rpm: N, M, the gap, the speed', () => {
		const { text, expected, edges } = log({ teeth: 36, missing: 1, rpm: 1000, turns: 6, startPosition: 5 });
		const spaces = edges.slice(1).map((e, i) => e.timeUs - edges[i]!.timeUs);
		expect(Math.max(...spaces) / Math.min(...spaces)).toBeCloseTo(2, 9);
		const r = read(text, { teeth: 36, missing: 1 });
		expect(r.pattern).toEqual({ teeth: 36, missing: 1, gapAt: expected.gapAt, gapRow: expected.gapRow });
		// Positions 5 … 34 logged first (30 edges), then the gap: tooth 0 is edge 30, on row 32 under the header.
		expect(r.pattern!.gapAt).toBe(30);
		expect(r.pattern!.gapRow).toBe(32);
		expect(r.meanRpm).toBeCloseTo(1000, 0);
		expect(r.turns).toBe(5);
		expect(r.speedSwingPct!.max).toBeLessThan(0.01);
		expect(r.runout!.amplitudePct).toBeLessThan(0.01);
		expect(r.missingEdges.count + r.extraEdges.count).toBe(0);
		expect(r).toMatchObject({ matchesDesign: true, designDifference: 'the log shows 36-1, as the design' });
	});

	it('a 60-2 cranking at 200 rpm with a 40 % swing per compression (once per cycle) and jitter, in seconds and as spaces', () => {
		const run: WheelRun = {
			teeth: 60,
			missing: 2,
			rpm: 200,
			turns: 8,
			startPosition: 41,
			swingPct: 40,
			swingOrder: 0.5,
			jitter: 0.02,
			seed: 7
		};
		for (const unit of ['s', 'space'] as const) {
			const { text, expected } = log(run, unit);
			const r = read(text);
			expect(r.pattern).toEqual({ teeth: 60, missing: 2, gapAt: expected.gapAt, gapRow: expected.gapRow });
			expect(r.missingEdges.count + r.extraEdges.count).toBe(0);
			// The swing over one turn of a half-order sine of 40 % peak to peak is most of the 40 %
			// (half a period of it per turn), plus 2 % jitter on each edge: the generator's numbers.
			expect(r.speedSwingPct!.mean).toBeGreaterThan(25);
			expect(r.speedSwingPct!.max).toBeLessThan(55);
			expect(r.meanRpm).toBeGreaterThan(190);
			expect(r.meanRpm).toBeLessThan(215);
		}
	});

	it('noise: dropped and doubled edges found at their rows, the pattern still read', () => {
		const run: WheelRun = {
			teeth: 36,
			missing: 1,
			rpm: 3000,
			turns: 10,
			startPosition: 12,
			jitter: 0.01,
			drop: [40, 41, 130, 200],
			double: [75, 250, 251]
		};
		const { text, expected } = log(run);
		const r = read(text, { teeth: 36, missing: 1 });
		expect(r.pattern).toMatchObject({ teeth: 36, missing: 1, gapAt: expected.gapAt });
		expect(r.missingEdges).toEqual({ count: 4, at: expected.missing });
		expect(r.extraEdges).toEqual({ count: 3, rows: expected.extraRows });
	});

	it('a dropped edge next to the gap counts as dropped, not as a wider gap', () => {
		// Truth index 23 is position 35 - 1 = 34 of the first turn when starting at position 11: the tooth before the gap.
		const run: WheelRun = { teeth: 36, missing: 1, rpm: 2000, turns: 6, startPosition: 11, drop: [23] };
		const { text, expected } = log(run);
		const r = read(text);
		expect(r.pattern).toMatchObject({ teeth: 36, missing: 1 });
		expect(r.missingEdges).toEqual({ count: 1, at: expected.missing });
	});

	// The runout's size and place are the generator's inputs; tolerance ±0.15 percentage points and ±6°
	// (jitter of 0.5 % of a pitch and a half-order swing left in the data on purpose).
	it('runout of known size and place, under a cranking swing and a steady acceleration', () => {
		for (const [pct, deg] of [
			[1.5, 120],
			[3, 300],
			[0.8, 10]
		] as const) {
			const run: WheelRun = {
				teeth: 36,
				missing: 1,
				rpm: 900,
				turns: 20,
				startPosition: 3,
				swingPct: 20,
				swingOrder: 0.5,
				accelRpmPerS: 200,
				runoutPct: pct,
				runoutPhaseDeg: deg,
				jitter: 0.005,
				seed: 3
			};
			const r = read(log(run).text);
			expect(Math.abs(r.runout!.amplitudePct - pct)).toBeLessThan(0.15);
			expect(Math.abs(((r.runout!.phaseDeg - deg + 540) % 360) - 180)).toBeLessThan(6);
		}
	});

	it('says how the log differs from the design', () => {
		const { text } = log({ teeth: 60, missing: 2, rpm: 1500, turns: 4 });
		expect(read(text, { teeth: 36, missing: 1 })).toMatchObject({
			matchesDesign: false,
			designDifference: 'the log shows 60-2; the design is 36-1 (60 tooth positions to the design’s 36, 2 missing to the design’s 1)'
		});
		expect(read(text, { kind: 'custom', teeth: 60, missingPositions: [58, 59] }).matchesDesign).toBe(true);
		expect(read(text, { kind: 'extra', teeth: 24, extraAfter: 3 }).designDifference).toMatch(/has no gap to a turn/);
		expect(read(text).matchesDesign).toBeNull();
	});

	it('a pause in the log (the engine stopped for a minute) costs nothing and moves nothing', () => {
		const edges = wheelEdges({ teeth: 36, missing: 1, rpm: 2000, turns: 6, startPosition: 2 });
		const times = edges.map((e, i) => e.timeUs + (i >= 100 ? 60e6 : 0));
		const r = read(['time_us', ...times.map((t) => t.toFixed(2))].join('\n'));
		expect(r.pattern).toMatchObject({ teeth: 36, missing: 1, gapAt: 33 });
		// 60 s at 2000 rpm: 2000 turns' worth of pitches in one space, counted as dropped edges at its row.
		expect(r.missingEdges.at).toHaveLength(1);
		expect(r.missingEdges.at[0]!.row).toBe(102);
		expect(r.missingEdges.count).toBeGreaterThan(60_000);
		expect(r.notes.join(' ')).toMatch(/^Row 102: no edge for 60\.\d+ s/);
	});

	it('a log without a gap or shorter than two turns: no pattern, said why', () => {
		expect(read(edgeLogCsv(wheelEdges({ teeth: 24, missing: 0, rpm: 1000, turns: 3 }), 'us'), { teeth: 24, missing: 0 })).toMatchObject({
			pattern: null,
			matchesDesign: true
		});
		const once = read(edgeLogCsv(wheelEdges({ teeth: 36, missing: 1, rpm: 1000, turns: 1, startPosition: 10 }), 'us'));
		expect(once.pattern).toBeNull();
		expect(once.notes.join(' ')).toMatch(/at least two turns/);
	});
});
