import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { edgeLogCsv, expectedReading, wheelEdges, type WheelRun } from '$support/edge-logs';
import { parseEdgeLog, readEdgeLog } from './edge-log';

// Any wheel the reader promises to find (N − M ≥ 3, two gaps in the log), at any speed, with a swing
// of up to 30 % (less on wheels of few teeth, below) and jitter of up to 2 % of a pitch: the pattern
// and the gap's edge come back as the generator (tests/support/edge-logs.ts, no imports from src) made them.
const runs = fc
	.record({
		teeth: fc.integer({ min: 4, max: 120 }),
		missingShare: fc.double({ min: 0, max: 1, noNaN: true }),
		rpm: fc.integer({ min: 100, max: 9000 }),
		turns: fc.integer({ min: 3, max: 6 }),
		startShare: fc.double({ min: 0, max: 0.999, noNaN: true }),
		swingPct: fc.double({ min: 0, max: 30, noNaN: true }),
		swingOrder: fc.constantFrom(0.5, 1),
		swingPhaseDeg: fc.integer({ min: 0, max: 359 }),
		jitter: fc.double({ min: 0, max: 0.02, noNaN: true }),
		seed: fc.integer({ min: 1, max: 1_000_000 }),
		unit: fc.constantFrom('s' as const, 'us' as const, 'space' as const)
	})
	.map(({ teeth, missingShare, startShare, unit, ...rest }) => {
		const missing = Math.min(1 + Math.floor(missingShare * Math.min(4, teeth - 3)), teeth - 3);
		// Under 8 % of speed change across the gap: more, and the gap's length in pitches is no longer
		// plain (6-3 at 22 % once a turn: a gap of 4 pitches 4.5 tooth spaces long; 10-5 at 16 %: a
		// gap of 6 read 5.5, and a turn of 9 or of 10 pitches fits the times as well), for an ECU as for us.
		const swingPct = Math.min(rest.swingPct, (8 * teeth) / (missing + 1));
		const run: WheelRun = { ...rest, swingPct, teeth, missing, startPosition: Math.floor(startShare * teeth) };
		return { run, unit };
	});

describe('readEdgeLog over random valid wheels (fast-check)', () => {
	it('finds N, M and the first gap’s edge', () => {
		fc.assert(
			fc.property(runs, ({ run, unit }) => {
				const edges = wheelEdges(run);
				const parsed = parseEdgeLog(edgeLogCsv(edges, unit));
				expect(parsed.ok).toBe(true);
				if (!parsed.ok) return;
				const expected = expectedReading(run, edges, unit);
				const reading = readEdgeLog(parsed.value, { teeth: run.teeth, missing: run.missing });
				expect(reading.pattern).toEqual({ teeth: run.teeth, missing: run.missing, gapAt: expected.gapAt, gapRow: expected.gapRow });
				expect(reading.matchesDesign).toBe(true);
				expect(reading.missingEdges.count + reading.extraEdges.count).toBe(0);
			}),
			{ numRuns: 200 }
		);
	}, 60_000);

	// Noise a few teeth apart (the reader compares a space with four neighbours each side) and at most
	// once in three turns, over 7 to 10 turns (with three turns and a dropped edge beside one of the
	// two gaps, nothing tells that gap from the other): a dropped edge is found at the row after it, a
	// spike at its own row, and neither moves the pattern.
	it('finds dropped and doubled edges at their rows', () => {
		const noisy = runs.chain(({ run: short, unit }) => {
			// And a swing of at most 5 % across a gap: with a dropped edge beside it, a gap at 10 % on a
			// wheel of few teeth reads half-way between two counts (9-4 at 14 %: 6.5 spaces for 6), and
			// nothing in the log says which.
			const run = { ...short, turns: short.turns + 4, swingPct: Math.min(short.swingPct ?? 0, (5 * short.teeth) / (short.missing + 1)) };
			const edges = (run.teeth - run.missing) * run.turns;
			return fc
				.uniqueArray(fc.integer({ min: 0, max: Math.floor(edges / 6) - 1 }), { maxLength: Math.floor(run.turns / 3) })
				.chain((slots) => fc.tuple(fc.constant(slots), fc.array(fc.boolean(), { minLength: slots.length, maxLength: slots.length })))
				.map(([slots, isDrop]) => ({
					run: {
						...run,
						jitter: Math.min(run.jitter ?? 0, 0.01),
						drop: slots.filter((_, k) => isDrop[k]).map((x) => x * 6 + 2),
						double: slots.filter((_, k) => !isDrop[k]).map((x) => x * 6 + 2)
					},
					unit
				}));
		});
		fc.assert(
			fc.property(noisy, ({ run, unit }) => {
				const edges = wheelEdges(run);
				const parsed = parseEdgeLog(edgeLogCsv(edges, unit));
				if (!parsed.ok) throw new Error(JSON.stringify(parsed.refusals));
				const expected = expectedReading(run, edges, unit);
				const reading = readEdgeLog(parsed.value);
				expect(reading.pattern).toMatchObject({ teeth: run.teeth, missing: run.missing, gapAt: expected.gapAt });
				expect(reading.missingEdges.at).toEqual(expected.missing);
				expect(reading.extraEdges.rows).toEqual(expected.extraRows);
			}),
			{
				numRuns: 150,
				// Found by this property: a gap beside a dropped edge (8-3) or with one (8-4) half-way
				// between two counts of spaces, settled by the log's other gaps.
				examples: [
					[
						{
							run: {
								rpm: 100,
								turns: 7,
								swingPct: 17.68,
								swingOrder: 1,
								swingPhaseDeg: 0,
								jitter: 0,
								seed: 1,
								teeth: 8,
								missing: 3,
								startPosition: 0,
								drop: [8],
								double: []
							},
							unit: 'us'
						}
					],
					[
						{
							run: {
								rpm: 1778,
								turns: 7,
								swingPct: 16,
								swingOrder: 1,
								swingPhaseDeg: 146,
								jitter: 0,
								seed: 2,
								teeth: 8,
								missing: 4,
								startPosition: 0,
								drop: [8],
								double: []
							},
							unit: 'us'
						}
					]
				]
			}
		);
	}, 60_000);
});
