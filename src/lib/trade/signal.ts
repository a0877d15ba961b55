// The signal check: will the ECU find the gap on this engine? The wheel of the phasing check turns
// past its sensor at the crank speed of crank-speed.ts (a mean speed, a swing per compression
// event, a steady acceleration); every tooth edge gets its time, and the ECU's gap rule (generic:
// a space is the gap when it is longer than `ratio` times the space before it, and optionally the
// space after it is shorter than `afterRatio` times the gap) is run over the spaces between the
// edges the ECU reads. Angles: crank degrees after cylinder 1's firing TDC; wheel degrees after
// tooth 0's leading edge (tooth 0 is the first after the gap), as in phasing.ts.
import { compressionEvents, crankMotion, swingShape, swingTable, type CrankMotion } from './crank-speed';
import { cycleDeg, firingTdcs } from './engine';
import type { PhasingInput } from './phasing';
import { gapsOf, pitchDeg, teethOf } from './pattern';
import { gridMargin, gridTurn, marginTerm, timeTable } from './signal-sweep';
import { tightBelow } from './sync-verdict';

/** One speed the engine turns at while the ECU must keep its sync. */
export interface SpeedCase {
	id: string;
	label: string;
	/** Mean crank speed when the simulation starts (at cylinder 1's TDC), rpm. */
	rpm: number;
	/** Speed swing per compression event, peak to peak, in percent of the mean speed. */
	swingPct: number;
	/** Steady change of the mean speed, rpm per second (negative: slowing down). */
	accelRpmPerS: number;
}

/** The ECU's gap rule (generic, our own names). */
export interface GapRule {
	/** A space is the gap when it is longer than `ratio` times the space before it. */
	ratio: number;
	/** Optionally, and the space after it is shorter than `afterRatio` times the gap. */
	afterRatio?: number;
}

export interface SensorSpec {
	kind: 'hall' | 'vr';
	/** The sensor's highest output frequency, Hz (data sheet). */
	maxHz?: number;
	/** VR: one point of the data sheet, `vrVolts` (peak) at `vrAtRpm` of this wheel ... */
	vrVolts?: number;
	vrAtRpm?: number;
	/** ... and the ECU's input threshold, volts (peak). */
	thresholdVolts?: number;
}

/** The wheel, its clocking and the engine: the phasing check's fields. */
export type WheelOnEngine = Pick<PhasingInput, 'pattern' | 'duty' | 'mount' | 'stroke' | 'intervals' | 'toothAtTdc' | 'edge'>;

export type SignalInput = WheelOnEngine & {
	cases: SpeedCase[];
	rule: GapRule;
	/** Engine cycles simulated (each case). */
	cycles: number;
	sensor: SensorSpec;
};

export interface ToothEdge {
	/** In the order the edges reach the sensor, from 0. */
	index: number;
	/** The tooth's position on the N grid (an extra tooth k + 0.5). */
	tooth: number;
	/** Where the edge is on the wheel, degrees after tooth 0's leading edge, 0 up to 360. */
	wheelDeg: number;
	/** When it reaches the sensor, crank degrees after cylinder 1's firing TDC, 0 up to the cycle (720 or 360). */
	crankDeg: number;
	/** Seconds after the simulation's start (cylinder 1's TDC, cycle 1). */
	t: number;
	kind: 'leading' | 'trailing';
}

/** The time between two edges the ECU reads. */
export interface Space {
	/** Where the space ends (the edge that closes it), crank degrees in the cycle. */
	crankDeg: number;
	ms: number;
	/** This space over the one before it. */
	ratio: number;
	/** A gap of the wheel (missing teeth), not whether the rule found it. */
	isGap: boolean;
	/** Whose compression event the space ends in (cylinder number from 1, firing order), or null. */
	cylinder: number | null;
}

export interface CaseResult {
	case: SpeedCase;
	/**
	 * The sync margin, a fraction: the worst over the simulated cycles of (gap ratio / rule ratio − 1)
	 * for each gap and (1 − ordinary space's ratio / rule ratio) for each ordinary space; with
	 * `afterRatio`, a gap also needs 1 − (space after / gap) / afterRatio and an ordinary space is safe by
	 * the better of its two terms. Negative: the rule fails somewhere.
	 */
	syncMargin: number;
	/** The smallest ratio a gap showed (NaN without a gap). */
	gapRatioMin: number;
	/** The largest ratio an ordinary space showed. */
	normalRatioMax: number;
	worst: { crankDeg: number; cylinder: number | null; what: 'gap-too-short' | 'space-too-long' };
	/** Gaps the rule did not find, per cycle (mean over the cycles). */
	missedPerCycle: number;
	/** Ordinary spaces the rule took for the gap, per cycle (mean over the cycles). */
	falsePerCycle: number;
	/** One cycle's spaces (the first), for the chart. */
	spaces: Space[];
}

export interface CompressionEvent {
	cylinder: number;
	/** Crank degrees in the cycle; `toDeg` may pass the cycle's end (wraps). */
	fromDeg: number;
	tdcDeg: number;
	toDeg: number;
}

export interface SignalCheck {
	cycleDeg: number;
	/** Where each cylinder's compression event slows the crank (for shading the chart). */
	compression: CompressionEvent[];
	cases: CaseResult[];
	/** The worst margin over the cases with the wheel clocked so `clockingDeg` (wheel degrees, toothAtTdc × pitch) sits at the sensor at TDC. */
	sweep: { clockingDeg: number; syncMargin: number }[];
	current: { toothAtTdc: number; syncMargin: number };
	/** The clocking with the largest margin; `keywayShiftDeg`: wheel degrees to add to the designer's keyway angle for it. */
	best: { toothAtTdc: number; syncMargin: number; keywayShiftDeg: number };
	sensor: {
		kind: 'hall' | 'vr';
		/** The fastest case's mean speed, rpm, and the tooth pitch frequency there, Hz (N × wheel rpm / 60). */
		topRpm: number;
		hz: number;
		maxHz: number | null;
		vr?: { crankingRpmAtThreshold: number; estimated: true };
	};
	warnings: { code: string; message: string }[];
}

// ---- The check ----

const norm = (a: number, period: number) => ((a % period) + period) % period;
const round = (x: number, places = 4) => Math.round(x * 10 ** places) / 10 ** places;

interface WheelEdge {
	tooth: number;
	wheelDeg: number;
	kind: 'leading' | 'trailing';
}

/** Every edge of the wheel, by wheel angle. */
function wheelEdges(input: Pick<SignalInput, 'pattern' | 'duty'>): WheelEdge[] {
	return teethOf(input.pattern, input.duty)
		.flatMap((t): WheelEdge[] => [
			{ tooth: t.position, wheelDeg: t.leadDeg, kind: 'leading' },
			{ tooth: t.position, wheelDeg: t.trailDeg, kind: 'trailing' }
		])
		.sort((a, b) => a.wheelDeg - b.wheelDeg);
}

/** The geometry every simulation of one input shares. */
interface Frame {
	factor: 1 | 2;
	pitch: number;
	cycle: number;
	/** Crank degrees per turn of the wheel. */
	wheelTurn: number;
	/** After this many crank degrees both the wheel and the engine are back where they started. */
	period: number;
	events: CompressionEvent[];
}

function frameOf(input: Pick<SignalInput, 'pattern' | 'mount' | 'stroke' | 'intervals'>): Frame {
	const factor = input.mount === 'cam' ? 2 : 1;
	const cycle = cycleDeg(input.stroke);
	const wheelTurn = 360 * factor;
	return {
		factor,
		pitch: pitchDeg(input.pattern.teeth),
		cycle,
		wheelTurn,
		period: Math.max(cycle, wheelTurn),
		events: compressionEvents({ stroke: input.stroke, intervals: input.intervals })
	};
}

/**
 * Crank angles (after cylinder 1's TDC, cycle 1) at which the given edges reach the sensor with
 * the wheel clocked `clockingDeg` (the wheel angle at the sensor at TDC), from `fromDeg` to `toDeg`.
 * An edge at wheel angle e reaches the sensor (e − clocking)·factor crank degrees after TDC
 * (phasing.ts: tooth toothAtTdc sits at the sensor at TDC, tooth 0 toothAtTdc pitches before).
 */
function edgeRun<E extends { wheelDeg: number }>(edges: readonly E[], clockingDeg: number, f: Frame, fromDeg: number, toDeg: number) {
	const inTurn = edges.map((e) => ({ edge: e, at: norm((e.wheelDeg - clockingDeg) * f.factor, f.wheelTurn) })).sort((a, b) => a.at - b.at);
	const out: { edge: E; theta: number }[] = [];
	for (let turn = Math.floor(fromDeg / f.wheelTurn); turn * f.wheelTurn < toDeg; turn++) {
		for (const e of inTurn) {
			const theta = e.at + turn * f.wheelTurn;
			if (theta >= fromDeg && theta < toDeg) out.push({ edge: e.edge, theta });
		}
	}
	return out;
}

/** The compression event a crank angle falls in (cylinder from 1), or null. */
function cylinderAt(thetaDeg: number, f: Frame): number | null {
	const at = norm(thetaDeg, f.cycle);
	for (const e of f.events) if (norm(at - e.fromDeg, f.cycle) < e.toDeg - e.fromDeg) return e.cylinder;
	return null;
}

interface Verdict {
	margin: number;
	gapRatioMin: number;
	normalRatioMax: number;
	worst: CaseResult['worst'];
	missed: number;
	falses: number;
}

/**
 * The read edges of one clocking: their crank angles within a wheel turn, ascending. The n-th edge
 * of the run (any whole n, negative before the start) is at `at[n mod count]` plus whole turns.
 */
function readTurn(readEdges: readonly WheelEdge[], clockingDeg: number, f: Frame): Float64Array {
	const at = new Float64Array(readEdges.length);
	for (let i = 0; i < readEdges.length; i++) at[i] = norm((readEdges[i]!.wheelDeg - clockingDeg) * f.factor, f.wheelTurn);
	return at.sort();
}

/**
 * The rule run over the spaces that end inside the windows (crank degrees), each judged with the
 * space before it and the one after it. Before the start the speed holds steady (crank-speed.ts),
 * so the first spaces of the run have their space before them.
 */
function judge(
	at: Float64Array,
	timeAt: (thetaDeg: number) => number,
	rule: GapRule,
	f: Frame,
	windows: readonly [number, number][],
	collect?: Space[]
): Verdict {
	const gapSpan = 1.5 * f.pitch * f.factor;
	const count = at.length;
	const thetaOf = (n: number) => {
		const turn = Math.floor(n / count);
		return at[n - turn * count]! + turn * f.wheelTurn;
	};
	let margin = Infinity;
	let gapRatioMin = Infinity;
	let normalRatioMax = -Infinity;
	let missed = 0;
	let falses = 0;
	let worstTheta = 0;
	let worstGap = true;
	const after = rule.afterRatio;
	for (const [from, to] of windows) {
		// The first edge at or after `from`.
		let n = Math.floor(from / f.wheelTurn) * count;
		while (thetaOf(n) < from) n++;
		let th1 = thetaOf(n - 1);
		let th2 = thetaOf(n);
		let t0 = timeAt(thetaOf(n - 2));
		let t1 = timeAt(th1);
		let t2 = timeAt(th2);
		for (; th2 < to; n++) {
			const th3 = thetaOf(n + 1);
			const t3 = timeAt(th3);
			const space = t2 - t1;
			const ratio = space / (t1 - t0);
			const next = (t3 - t2) / space;
			const isGap = th2 - th1 > gapSpan;
			if (Number.isFinite(ratio)) {
				const found = ratio > rule.ratio && (after === undefined || next < after);
				const term = marginTerm(ratio, next, isGap, rule);
				if (isGap) {
					if (ratio < gapRatioMin) gapRatioMin = ratio;
					if (!found) missed++;
				} else {
					if (ratio > normalRatioMax) normalRatioMax = ratio;
					if (found) falses++;
				}
				if (term < margin) {
					margin = term;
					worstTheta = th2;
					worstGap = isGap;
				}
				collect?.push({
					crankDeg: round(norm(th2, f.cycle), 3),
					ms: round(space * 1000, 4),
					ratio: round(ratio),
					isGap,
					cylinder: cylinderAt(th2, f)
				});
			}
			th1 = th2;
			th2 = th3;
			t0 = t1;
			t1 = t2;
			t2 = t3;
		}
	}
	return {
		margin,
		gapRatioMin: gapRatioMin === Infinity ? NaN : gapRatioMin,
		normalRatioMax,
		worst: {
			crankDeg: norm(worstTheta, f.cycle),
			cylinder: cylinderAt(worstTheta, f),
			what: worstGap ? 'gap-too-short' : 'space-too-long'
		},
		missed,
		falses
	};
}

export function signalCheck(input: SignalInput): SignalCheck {
	const f = frameOf(input);
	const profile = { stroke: input.stroke, intervals: input.intervals };
	const table = swingTable(profile);
	const motions = input.cases.map((c) => crankMotion(profile, c, table));
	const readEdges = wheelEdges(input).filter((e) => e.kind === input.edge);
	const end = input.cycles * f.cycle;
	const clocking0 = norm(input.toothAtTdc * f.pitch, 360);

	const turn0 = readTurn(readEdges, clocking0, f);
	const cases: CaseResult[] = input.cases.map((c, i) => {
		const spaces: Space[] = [];
		// The chart's cycle: the first, judged on its own for its spaces (the verdict is the whole run's).
		judge(turn0, motions[i]!.timeAt, input.rule, f, [[0, Math.min(f.period, end)]], spaces);
		const v = judge(turn0, motions[i]!.timeAt, input.rule, f, [[0, end]]);
		return {
			case: c,
			syncMargin: round(v.margin),
			gapRatioMin: round(v.gapRatioMin),
			normalRatioMax: round(v.normalRatioMax),
			worst: { ...v.worst, crankDeg: round(v.worst.crankDeg, 2) },
			missedPerCycle: round(v.missed / input.cycles, 3),
			falsePerCycle: round(v.falses / input.cycles, 3),
			spaces
		};
	});
	const fullRun: [number, number][] = [[0, end]];
	const currentMargin = Math.min(...cases.map((c) => c.syncMargin));

	// The sweep judges one period per case: with a steady speed every period is alike, and an
	// acceleration weighs most where the mean speed is lowest, the first period speeding up and the
	// last slowing down. The best it finds is then judged over the whole run, like the current one.
	// The sweep's step divides the pitch (a quarter, or finer so that steps stay at most 2° apart; an
	// even count, so an extra tooth's half pitch falls on it too): the read edges of every clocking
	// then lie on one grid of crank angles, whose times each case works out once.
	const perPitch = f.pitch > 8 ? 2 * Math.ceil(f.pitch / 4) : Math.max(1, Math.min(4, Math.floor(2 * f.pitch)));
	const step = f.pitch / perPitch;
	const origin = (readEdges[0]?.wheelDeg ?? 0) * f.factor;
	const span = Math.min(f.period, end);
	const lead = 2 * f.wheelTurn;
	const sweepCases = input.cases.map((c, i) => {
		const [from, to] = c.accelRpmPerS >= 0 ? [0, span] : [end - span, end];
		return { from, to, table: timeTable(motions[i]!.timeAt, origin, step * f.factor, from - lead, to + f.wheelTurn) };
	});
	const gapSpan = 1.5 * f.pitch * f.factor;
	const sweepMargin = (clockingDeg: number) => {
		const turn = gridTurn(readTurn(readEdges, clockingDeg, f), origin, step * f.factor, f.wheelTurn);
		let worst = Infinity;
		for (const c of sweepCases) worst = Math.min(worst, gridMargin(turn, c.table, input.rule, gapSpan, c.from, c.to));
		return worst;
	};
	const wholeRunMargin = (clockingDeg: number) => {
		const at = readTurn(readEdges, clockingDeg, f);
		return Math.min(...motions.map((m) => judge(at, m.timeAt, input.rule, f, fullRun).margin));
	};
	const sweep: SignalCheck['sweep'] = [];
	for (let k = 0; k * step < 360 - 1e-9; k++) sweep.push({ clockingDeg: round(k * step, 3), syncMargin: round(sweepMargin(k * step)) });

	// The best of the sweep, judged over the whole run like the current one; the current stays unless beaten.
	let best = { toothAtTdc: input.toothAtTdc, syncMargin: currentMargin, keywayShiftDeg: 0 };
	const ranked = [...sweep].sort((a, b) => b.syncMargin - a.syncMargin).slice(0, 3);
	for (const candidate of ranked) {
		// The whole run holds the sweep's window, so it can only do worse there than in the sweep.
		if (candidate.syncMargin <= best.syncMargin + 1e-9) continue;
		const margin = round(wholeRunMargin(candidate.clockingDeg));
		if (margin > best.syncMargin + 1e-9) {
			const shift = norm(candidate.clockingDeg - clocking0 + 180, 360) - 180;
			best = { toothAtTdc: round(candidate.clockingDeg / f.pitch, 3), syncMargin: margin, keywayShiftDeg: round(shift, 3) };
		}
	}

	return {
		cycleDeg: f.cycle,
		compression: f.events,
		cases,
		sweep,
		current: { toothAtTdc: input.toothAtTdc, syncMargin: currentMargin },
		best,
		sensor: sensorOf(input, motions, end),
		warnings: warningsOf(input, cases, best, motions, end)
	};
}

function sensorOf(input: SignalInput, motions: readonly CrankMotion[], end: number): SignalCheck['sensor'] {
	const f = input.mount === 'cam' ? 2 : 1;
	// The highest mean speed any case reaches over the run (an accelerating case ends above its start).
	const topRpm = Math.max(...input.cases.map((c, i) => Math.max(c.rpm, c.rpm + c.accelRpmPerS * (motions[i]!.timeAt(end) || 0))));
	// Tooth pitch frequency f = N·rpm/60 at the wheel's own speed (design.md, common practice).
	const hz = (input.pattern.teeth * topRpm) / f / 60;
	const out: SignalCheck['sensor'] = {
		kind: input.sensor.kind,
		topRpm: round(topRpm, 0),
		hz: round(hz, 1),
		maxHz: input.sensor.maxHz ?? null
	};
	const { vrVolts, vrAtRpm, thresholdVolts } = input.sensor;
	if (input.sensor.kind === 'vr' && vrVolts && vrAtRpm && thresholdVolts) {
		// A VR sensor's output rises in proportion to the speed (Faraday: v = −N·dΦ/dt = −N·ω·dΦ/dθ), so
		// one data-sheet point gives the speed where the output reaches the threshold. Estimated: the
		// data sheet's wheel and air gap are not this engine's.
		out.vr = { crankingRpmAtThreshold: round((thresholdVolts * vrAtRpm) / vrVolts, 0), estimated: true };
	}
	return out;
}

/** The slowest the crank turns in a case at its start: the mean speed at the bottom of the swing. */
export function lowestRpm(input: Pick<SignalInput, 'stroke' | 'intervals'>, c: SpeedCase): number {
	const u = swingShape(input);
	// u is lowest at each TDC (crank-speed.ts).
	return c.rpm * (1 + (c.swingPct / 100) * u(firingTdcs(input.intervals)[0]!));
}

const pct = (x: number) => `${round(x * 100, 1)} %`;

function warningsOf(input: SignalInput, cases: CaseResult[], best: SignalCheck['best'], motions: CrankMotion[], end: number) {
	const warnings: SignalCheck['warnings'] = [];
	const cylinderWords = (c: number | null) => (c === null ? '' : ` during cylinder ${c}’s compression`);
	if (!gapsOf(input.pattern).length) {
		warnings.push({ code: 'no-gap', message: 'This wheel has no gap: a rule that looks for a long space cannot find its place on it.' });
	}
	for (const c of cases) {
		if (c.syncMargin < 0) {
			const what = c.worst.what === 'gap-too-short' ? 'the gap does not stand out' : 'an ordinary space looks like the gap';
			warnings.push({
				code: 'no-sync',
				message: `${c.case.label}: ${what} at ${c.worst.crankDeg}° after cylinder 1’s TDC${cylinderWords(c.worst.cylinder)}; the ECU loses or never finds its sync there.`
			});
		} else if (c.syncMargin < tightBelow) {
			warnings.push({
				code: 'thin-margin',
				message: `${c.case.label}: a sync margin of ${pct(c.syncMargin)} leaves little for sensor noise, runout and a harder start than modelled (from memory, keep it above ${pct(tightBelow)}).`
			});
		}
	}
	if (best.keywayShiftDeg !== 0) {
		warnings.push({
			code: 'better-clocking',
			message: `Clocked with tooth ${best.toothAtTdc} at the sensor at TDC (the keyway ${best.keywayShiftDeg}° round on the wheel), the worst case keeps a sync margin of ${pct(best.syncMargin)}.`
		});
	}
	motions.forEach((m, i) => {
		if (Number.isNaN(m.timeAt(end))) {
			warnings.push({
				code: 'stalls',
				message: `${input.cases[i]!.label}: at ${input.cases[i]!.accelRpmPerS} rpm per second the engine stops before the cycles simulated end; only the spaces before that are judged.`
			});
		}
	});
	const sensor = sensorOf(input, motions, end);
	if (sensor.maxHz !== null && sensor.hz > sensor.maxHz) {
		warnings.push({
			code: 'sensor-too-slow',
			message: `At ${sensor.topRpm} rpm the teeth pass at ${round(sensor.hz, 0)} Hz, above the sensor’s ${sensor.maxHz} Hz: the signal drops out near the top.`
		});
	}
	if (sensor.vr) {
		const slowest = Math.min(...input.cases.map((c) => lowestRpm(input, c)));
		if (sensor.vr.crankingRpmAtThreshold > slowest) {
			warnings.push({
				code: 'vr-weak-cranking',
				message: `Estimated: the VR sensor’s output reaches the ECU’s threshold only at ${sensor.vr.crankingRpmAtThreshold} rpm, and the crank slows to about ${round(slowest, 0)} rpm at a TDC while cranking: the ECU may see no teeth there. A smaller air gap or a lower threshold helps.`
			});
		}
	}
	return warnings;
}

/**
 * Every tooth edge (leading and trailing) reaching the sensor over `cycles` engine cycles from
 * cylinder 1's TDC, with its time in the speed case given.
 */
export function toothEdges(input: WheelOnEngine, speed: SpeedCase, cycles = 1): ToothEdge[] {
	const f = frameOf(input);
	const motion = crankMotion({ stroke: input.stroke, intervals: input.intervals }, speed);
	const clocking = norm(input.toothAtTdc * f.pitch, 360);
	return edgeRun(wheelEdges(input), clocking, f, 0, cycles * f.cycle).map(({ edge, theta }, index) => ({
		index,
		tooth: edge.tooth,
		wheelDeg: round(edge.wheelDeg, 4),
		crankDeg: round(norm(theta, f.cycle), 4),
		t: motion.timeAt(theta),
		kind: edge.kind
	}));
}

// ---- Default speed cases ----

/**
 * Speed swing per compression event, peak to peak in percent of the mean speed, by how many
 * compression events a crank turn has (a single four-stroke ½, a twin or a single two-stroke 1, a
 * four 2 …): cranking and idle. From memory, rough on purpose: each is editable.
 */
export const swingDefaults: { eventsPerTurn: number; crankingPct: number; idlePct: number }[] = [
	{ eventsPerTurn: 0.5, crankingPct: 50, idlePct: 20 },
	{ eventsPerTurn: 1, crankingPct: 35, idlePct: 12 },
	{ eventsPerTurn: 2, crankingPct: 20, idlePct: 6 },
	{ eventsPerTurn: Infinity, crankingPct: 10, idlePct: 3 }
];

/** Idle speed, rpm (from memory: most engines idle between 800 and 1,200). */
export const idleRpm = 1000;

/**
 * The four cases the check runs when none is given: cranking (steady, the starter's speed), idle,
 * a free rev (half the rev limit, speeding up hard) and the rev limit (the cut slowing it down).
 * Swing shrinks with speed as the flywheel's stored energy grows; the rates are from memory (a
 * light engine in free air gains several thousand rpm per second; the cut at the limit takes it
 * back at about that), scaled with the square of the speed at the limit, so the speed lost per turn
 * stays about the same share whatever the limit.
 */
export function defaultCases(layout: Pick<SignalInput, 'stroke' | 'intervals'>, crankingRpm: number, revLimitRpm: number): SpeedCase[] {
	const eventsPerTurn = (layout.intervals.length * 360) / cycleDeg(layout.stroke);
	const swing = swingDefaults.find((s) => eventsPerTurn <= s.eventsPerTurn + 1e-9)!;
	const light = eventsPerTurn <= 1;
	const freeRpm = Math.max(idleRpm + 500, Math.round(revLimitRpm / 200) * 100);
	return [
		{ id: 'cranking', label: 'Cranking', rpm: crankingRpm, swingPct: swing.crankingPct, accelRpmPerS: 0 },
		{ id: 'idle', label: 'Idle', rpm: idleRpm, swingPct: swing.idlePct, accelRpmPerS: 0 },
		{ id: 'free-rev', label: 'Free rev', rpm: freeRpm, swingPct: swing.idlePct / 2, accelRpmPerS: light ? 8000 : 5000 },
		{
			id: 'rev-limit',
			label: 'Rev limit',
			rpm: revLimitRpm,
			swingPct: swing.idlePct / 4,
			accelRpmPerS: -Math.round(5000 * (revLimitRpm / 8000) ** 2)
		}
	];
}
