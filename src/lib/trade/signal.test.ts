import { describe, expect, it } from 'vitest';
import { defaultCases, signalCheck, toothEdges, type SignalInput, type SpeedCase } from './signal';
import { syncVerdict } from './sync-verdict';

const steady = (rpm: number): SpeedCase => ({ id: 's', label: 'Steady', rpm, swingPct: 0, accelRpmPerS: 0 });
const wheel36 = {
	pattern: { kind: 'missing' as const, teeth: 36, missing: 1 },
	duty: 0.5,
	mount: 'crank' as const,
	stroke: 4 as const,
	intervals: [720],
	toothAtTdc: 9,
	edge: 'leading' as const
};
const check = (over: Partial<SignalInput>) =>
	signalCheck({ ...wheel36, cases: [steady(1000)], rule: { ratio: 1.5 }, cycles: 2, sensor: { kind: 'hall' }, ...over });

describe('constant speed (geometry: the gap spans M + 1 pitches, design.md)', () => {
	for (const [teeth, missing, edge, mount] of [
		[36, 1, 'leading', 'crank'],
		[60, 2, 'trailing', 'crank'],
		[24, 2, 'leading', 'cam'],
		[12, 3, 'trailing', 'cam']
	] as const) {
		it(`${teeth}-${missing}, ${edge} edge, on the ${mount}: the gap space is (M + 1) tooth spaces`, () => {
			const r = check({ pattern: { kind: 'missing', teeth, missing }, edge, mount, toothAtTdc: 3.25, rule: { ratio: 1.5 } });
			const [c] = r.cases;
			const normal = c!.spaces.filter((s) => !s.isGap);
			const gaps = c!.spaces.filter((s) => s.isGap);
			// Tooth space at 1000 rpm: pitch·factor crank degrees at 6000°/s.
			const toothMs = (((360 / teeth) * (mount === 'cam' ? 2 : 1)) / 6000) * 1000;
			for (const s of normal) expect(s.ms).toBeCloseTo(toothMs, 3);
			// A crank wheel passes its gap twice in a four-stroke cycle, a cam wheel once.
			expect(gaps.length).toBe(mount === 'cam' ? 1 : 2);
			for (const g of gaps) {
				expect(g.ms).toBeCloseTo((missing + 1) * toothMs, 3);
				expect(g.ratio).toBeCloseTo(missing + 1, 6);
			}
			// The margin by its definition: the gap (M + 1)/1.5 − 1 against an ordinary space 1 − 1/1.5.
			expect(c!.syncMargin).toBeCloseTo(Math.min((missing + 1) / 1.5 - 1, 1 - 1 / 1.5), 4);
			expect(c!.missedPerCycle).toBe(0);
			expect(c!.falsePerCycle).toBe(0);
		});
	}

	it('a rule asking more than the gap gives: both passes of a crank wheel’s gap missed each cycle', () => {
		const [c] = check({ rule: { ratio: 2.5 } }).cases;
		expect(c!.missedPerCycle).toBe(2);
		expect(c!.syncMargin).toBeCloseTo(2 / 2.5 - 1, 4);
		expect(c!.worst.what).toBe('gap-too-short');
	});

	it('with the space after the gap: its term 1 − (½)/0.6 is the smallest (worked by hand)', () => {
		const [c] = check({ rule: { ratio: 1.5, afterRatio: 0.6 } }).cases;
		// Gap: min(2/1.5 − 1, 1 − 0.5/0.6) = 0.1667; ordinary: max(1 − 1/1.5, 1/0.6 − 1) = 0.667.
		expect(c!.syncMargin).toBeCloseTo(1 - 0.5 / 0.6, 4);
		const [tight] = check({ rule: { ratio: 1.5, afterRatio: 0.45 } }).cases;
		expect(tight!.missedPerCycle).toBe(2);
	});
});

describe('constant acceleration: edge times from θ = ω₀t + ½αt², solved in the test', () => {
	it('60-2 on the crank, 1500 rpm gaining 8000 rpm/s, every edge of two cycles to 1 ns', () => {
		const input = { ...wheel36, pattern: { kind: 'missing' as const, teeth: 60, missing: 2 }, toothAtTdc: 17.5 };
		const edges = toothEdges(input, { id: 'a', label: 'A', rpm: 1500, swingPct: 0, accelRpmPerS: 8000 }, 2);
		expect(edges.length).toBe(58 * 2 * 2 * 2); // teeth × edges × turns per cycle × cycles
		const [w0, alpha] = [1500 * 6, 8000 * 6];
		let cycle = 0;
		let last = -1;
		for (const e of edges) {
			if (e.crankDeg < last) cycle++;
			last = e.crankDeg;
			const theta = e.crankDeg + cycle * 720;
			const t = (-w0 + Math.sqrt(w0 * w0 + 2 * alpha * theta)) / alpha;
			expect(Math.abs(e.t - t)).toBeLessThan(1e-9);
		}
		// Tooth 17.5 sits at the sensor at TDC: tooth 18's leading edge comes half a pitch (3°) later.
		expect(edges[0]).toMatchObject({ tooth: 17, kind: 'trailing', wheelDeg: 17 * 6 + 3, crankDeg: 0 });
		expect(edges[1]).toMatchObject({ tooth: 18, kind: 'leading', crankDeg: 3 });
	});
});

/**
 * The margin worked out here, independently of the module: the speed written out from the model's
 * definition (crank-speed.ts header) in other terms, integrated in time with RK4, the edges' times
 * found where θ(t) crosses them, then the spaces, ratios and terms of the margin's definition.
 */
function oracleMargins(input: {
	teeth: number;
	missing: number;
	toothAtTdc: number;
	intervals: number[];
	rpm: number;
	swingPct: number;
	ratio: number;
}) {
	const cycle = 720;
	const tdcs = input.intervals.reduce<number[]>((acc, i, k) => (k === 0 ? [0] : [...acc, acc.at(-1)! + input.intervals[k - 1]!]), []);
	const width = Math.min(180, ...input.intervals);
	const mean = (tdcs.length * width) / (2 * cycle);
	const speed = (theta: number) => {
		let dip = 0;
		for (const tdc of tdcs) {
			const d = ((((theta - tdc) % cycle) + 1.5 * cycle) % cycle) - cycle / 2;
			if (Math.abs(d) < width / 2) dip += Math.cos((Math.PI * d) / width) ** 2;
		}
		return 6 * input.rpm * (1 + (input.swingPct / 100) * (mean - dip));
	};
	// Leading edges, crank degrees after TDC: tooth k reaches the sensor (k − toothAtTdc)·pitch after it.
	const pitch = 360 / input.teeth;
	const present = Array.from({ length: input.teeth - input.missing }, (_, k) => k);
	const angles: number[] = [];
	for (let turn = 0; turn < 4; turn++) for (const k of present) angles.push((k - input.toothAtTdc) * pitch + turn * 360);
	angles.sort((a, b) => a - b);
	// The motion is periodic in the cycle: integrate from θ = −360 with t = 0 there and judge the
	// spaces ending in [0, 720).
	const times: number[] = [];
	const dt = 2e-6 * (1000 / input.rpm);
	let [t, theta] = [0, angles[0]! - 1e-9];
	let next = 0;
	while (next < angles.length) {
		const k1 = speed(theta);
		const k2 = speed(theta + (dt / 2) * k1);
		const k3 = speed(theta + (dt / 2) * k2);
		const k4 = speed(theta + dt * k3);
		const after = theta + (dt / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
		while (next < angles.length && after >= angles[next]!) {
			times.push(t + (dt * (angles[next]! - theta)) / (after - theta));
			next++;
		}
		[t, theta] = [t + dt, after];
	}
	let gapMin = Infinity;
	let normalMax = -Infinity;
	for (let j = 2; j < angles.length; j++) {
		if (angles[j]! < 0 || angles[j]! >= cycle) continue;
		const ratio = (times[j]! - times[j - 1]!) / (times[j - 1]! - times[j - 2]!);
		if (angles[j]! - angles[j - 1]! > 1.5 * pitch) gapMin = Math.min(gapMin, ratio);
		else normalMax = Math.max(normalMax, ratio);
	}
	return { gapMin, normalMax, margin: Math.min(gapMin / input.ratio - 1, 1 - normalMax / input.ratio) };
}

describe('a speed swing of known amplitude: margins against RK4 written in the test (to 2e-4)', () => {
	for (const c of [
		{ teeth: 36, missing: 1, toothAtTdc: 9, intervals: [720], rpm: 200, swingPct: 50, ratio: 1.5 },
		{ teeth: 36, missing: 1, toothAtTdc: 33, intervals: [720], rpm: 200, swingPct: 60, ratio: 1.5 },
		{ teeth: 60, missing: 2, toothAtTdc: 20, intervals: [270, 450], rpm: 250, swingPct: 35, ratio: 1.8 },
		{ teeth: 12, missing: 1, toothAtTdc: 4.5, intervals: [180, 180, 180, 180], rpm: 300, swingPct: 20, ratio: 1.4 }
	]) {
		it(`${c.teeth}-${c.missing}, intervals ${c.intervals.join('/')}, ${c.swingPct} % swing`, () => {
			const want = oracleMargins(c);
			const r = signalCheck({
				...wheel36,
				pattern: { kind: 'missing', teeth: c.teeth, missing: c.missing },
				intervals: c.intervals,
				toothAtTdc: c.toothAtTdc,
				cases: [{ id: 'x', label: 'X', rpm: c.rpm, swingPct: c.swingPct, accelRpmPerS: 0 }],
				rule: { ratio: c.ratio },
				cycles: 2,
				sensor: { kind: 'hall' }
			});
			const got = r.cases[0]!;
			expect(Math.abs(got.gapRatioMin - want.gapMin)).toBeLessThan(2e-4);
			expect(Math.abs(got.normalRatioMax - want.normalMax)).toBeLessThan(2e-4);
			expect(Math.abs(got.syncMargin - want.margin)).toBeLessThan(2e-4);
		});
	}

	it('a big single’s worst ordinary space is in its own compression (the model slows the crank there)', () => {
		// Tooth 18 at TDC: the gap passes at 180° and 540°, where the model's speed is steady.
		const r = check({ cases: [{ id: 'c', label: 'Cranking', rpm: 200, swingPct: 60, accelRpmPerS: 0 }], toothAtTdc: 18 });
		expect(r.cases[0]!.worst).toMatchObject({ what: 'space-too-long', cylinder: 1 });
		// Slowing down into TDC: the longest ordinary space ends before TDC (in the second half of the cycle).
		expect(r.cases[0]!.worst.crankDeg).toBeGreaterThan(540);
	});
});

describe('the sweep and the sensor', () => {
	it('the sweep covers the wheel, the current clocking is on it, the best is no worse than the current', () => {
		const cases = defaultCases(wheel36, 200, 8000);
		const r = check({ cases, cycles: 3 });
		expect(r.sweep[0]!.clockingDeg).toBe(0);
		expect(r.sweep.at(-1)!.clockingDeg).toBeLessThan(360);
		expect(r.current.syncMargin).toBe(Math.min(...r.cases.map((c) => c.syncMargin)));
		expect(r.best.syncMargin).toBeGreaterThanOrEqual(r.current.syncMargin);
		// The best clocking, applied, gives the margin promised (over the whole run).
		const applied = check({ cases, cycles: 3, toothAtTdc: r.best.toothAtTdc });
		expect(applied.current.syncMargin).toBeCloseTo(r.best.syncMargin, 4);
		// Keyway shift: wheel degrees between the two clockings, the short way round (the tooth is rounded to 3 places).
		const shift = (((((r.best.toothAtTdc - 9) * 10 + 180) % 360) + 360) % 360) - 180;
		expect(Math.abs(r.best.keywayShiftDeg - shift)).toBeLessThan(0.01);
	});

	it('one line between tight and safe: the words and the warning agree on a 12 % and a 20 % margin', () => {
		// At constant speed a 36-1's gap is 2 spaces, so a ratio r leaves min(2/r − 1, 1 − 1/r) (geometry):
		// r = 1.785 gives 12.0 %, r = 1.65 gives 21.2 %.
		const tight = check({ rule: { ratio: 1.785 } });
		expect(tight.cases[0]!.syncMargin).toBeCloseTo(2 / 1.785 - 1, 4);
		expect(syncVerdict(tight.cases[0]!.syncMargin)).toBe('tight');
		expect(tight.warnings.map((w) => w.code)).toContain('thin-margin');
		const safe = check({ rule: { ratio: 1.65 } });
		expect(syncVerdict(safe.cases[0]!.syncMargin)).toBe('safe');
		expect(safe.warnings.map((w) => w.code)).not.toContain('thin-margin');
	});

	it('Hall frequency at the top speed: f = N·rpm/60 (common practice), half on the cam', () => {
		const crank = check({ cases: [steady(6000)], sensor: { kind: 'hall', maxHz: 3000 } });
		expect(crank.sensor).toMatchObject({ topRpm: 6000, hz: 3600, maxHz: 3000 });
		expect(crank.warnings.map((w) => w.code)).toContain('sensor-too-slow');
		expect(check({ cases: [steady(6000)], mount: 'cam' }).sensor.hz).toBe(1800);
	});

	it('VR: the output scales with speed, so 2 V at 1000 rpm reaches a 0.3 V threshold at 150 rpm (estimated)', () => {
		const r = check({
			cases: [{ id: 'c', label: 'Cranking', rpm: 200, swingPct: 50, accelRpmPerS: 0 }],
			sensor: { kind: 'vr', vrVolts: 2, vrAtRpm: 1000, thresholdVolts: 0.3 }
		});
		expect(r.sensor.vr).toEqual({ crankingRpmAtThreshold: 150, estimated: true });
		// At the bottom of a 50 % swing a single slows to 200·(1 − 0.5·(1 − 1/8)) = 112.5 rpm, under 150.
		expect(r.warnings.map((w) => w.code)).toContain('vr-weak-cranking');
	});
});

describe('default speed cases (from memory, editable)', () => {
	it('cranking, idle, free rev, rev limit; a single swings more than a four', () => {
		const s = defaultCases({ stroke: 4, intervals: [720] }, 200, 9000);
		const f = defaultCases({ stroke: 4, intervals: [180, 180, 180, 180] }, 200, 9000);
		expect(s.map((c) => c.id)).toEqual(['cranking', 'idle', 'free-rev', 'rev-limit']);
		expect(s[0]!.rpm).toBe(200);
		expect(s[3]!.rpm).toBe(9000);
		expect(s[2]!.accelRpmPerS).toBeGreaterThan(0);
		expect(s[3]!.accelRpmPerS).toBeLessThan(0);
		for (let i = 0; i < 4; i++) expect(s[i]!.swingPct).toBeGreaterThan(f[i]!.swingPct);
	});
});
