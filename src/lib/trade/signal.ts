// The signal check: will the ECU find the gap on this engine? The wheel of the phasing check turns
// past its sensor at the crank speed of crank-speed.ts (a mean speed, a swing per compression
// event, a steady acceleration); every tooth edge gets its time, and the ECU's gap rule (generic:
// a space is the gap when it is longer than `ratio` times the space before it, and optionally the
// space after it is shorter than `afterRatio` times the gap) is run over the spaces between the
// edges the ECU reads. Angles: crank degrees after cylinder 1's firing TDC; wheel degrees after
// tooth 0's leading edge (tooth 0 is the first after the gap), as in phasing.ts.
import { compressionEvents, crankMotion, swingShape, type CrankMotion } from './crank-speed';
import { cycleDeg, firingTdcs } from './engine';
import type { PhasingInput } from './phasing';
import { gapsOf, pitchDeg, teethOf } from './pattern';

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

export type SignalInput = Pick<PhasingInput, 'pattern' | 'duty' | 'mount' | 'stroke' | 'intervals' | 'toothAtTdc' | 'edge'> & {
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
	margin: number;
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
	sweep: { clockingDeg: number; margin: number }[];
	current: { toothAtTdc: number; margin: number };
	/** The clocking with the largest margin; `keywayShiftDeg`: wheel degrees to add to the designer's keyway angle for it. */
	best: { toothAtTdc: number; margin: number; keywayShiftDeg: number };
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

function frameOf(input: SignalInput): Frame {
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
 * The rule run over the spaces that end inside the windows (crank degrees). `thetas` are the read
 * edges' crank angles in order, starting at least two edges before the first window and ending at
 * least one after the last (the space before and after each space judged).
 */
function judge(
	thetas: Float64Array,
	motion: CrankMotion,
	rule: GapRule,
	f: Frame,
	windows: readonly [number, number][],
	collect?: Space[]
): Verdict {
	const gapSpan = 1.5 * f.pitch * f.factor;
	const v: Verdict = {
		margin: Infinity,
		gapRatioMin: Infinity,
		normalRatioMax: -Infinity,
		worst: { crankDeg: 0, cylinder: null, what: 'gap-too-short' },
		missed: 0,
		falses: 0
	};
	const after = rule.afterRatio;
	for (const [from, to] of windows) {
		let j = 2;
		while (j < thetas.length - 1 && thetas[j]! < from) j++;
		let t0 = motion.timeAt(thetas[j - 2]!);
		let t1 = motion.timeAt(thetas[j - 1]!);
		let t2 = motion.timeAt(thetas[j]!);
		for (; j < thetas.length - 1 && thetas[j]! < to; j++) {
			const t3 = motion.timeAt(thetas[j + 1]!);
			const space = t2 - t1;
			const ratio = space / (t1 - t0);
			const next = (t3 - t2) / space;
			const isGap = thetas[j]! - thetas[j - 1]! > gapSpan;
			if (Number.isFinite(ratio)) {
				const found = ratio > rule.ratio && (after === undefined || next < after);
				let term: number;
				if (isGap) {
					term = Math.min(ratio / rule.ratio - 1, after === undefined ? Infinity : 1 - next / after);
					v.gapRatioMin = Math.min(v.gapRatioMin, ratio);
					if (!found) v.missed++;
				} else {
					term = Math.max(1 - ratio / rule.ratio, after === undefined || !Number.isFinite(next) ? -Infinity : next / after - 1);
					v.normalRatioMax = Math.max(v.normalRatioMax, ratio);
					if (found) v.falses++;
				}
				if (term < v.margin) {
					v.margin = term;
					v.worst = {
						crankDeg: norm(thetas[j]!, f.cycle),
						cylinder: cylinderAt(thetas[j]!, f),
						what: isGap ? 'gap-too-short' : 'space-too-long'
					};
				}
				collect?.push({
					crankDeg: round(norm(thetas[j]!, f.cycle), 3),
					ms: round(space * 1000, 4),
					ratio: round(ratio),
					isGap,
					cylinder: cylinderAt(thetas[j]!, f)
				});
			}
			t0 = t1;
			t1 = t2;
			t2 = t3;
		}
	}
	if (v.gapRatioMin === Infinity) v.gapRatioMin = NaN;
	return v;
}

/** The read edges' crank angles for one clocking, with room before and after the simulated span. */
function readThetas(readEdges: readonly WheelEdge[], clockingDeg: number, f: Frame, endDeg: number): Float64Array {
	// Two wheel turns before the start and one past the end: even a one-tooth wheel has its spaces either side.
	return Float64Array.from(edgeRun(readEdges, clockingDeg, f, -2 * f.wheelTurn, endDeg + f.wheelTurn), (e) => e.theta);
}

export function signalCheck(input: SignalInput): SignalCheck {
	const f = frameOf(input);
	const profile = { stroke: input.stroke, intervals: input.intervals };
	const motions = input.cases.map((c) => crankMotion(profile, c));
	const readEdges = wheelEdges(input).filter((e) => e.kind === input.edge);
	const end = input.cycles * f.cycle;
	const clocking0 = norm(input.toothAtTdc * f.pitch, 360);

	const thetas0 = readThetas(readEdges, clocking0, f, end);
	const cases: CaseResult[] = input.cases.map((c, i) => {
		const spaces: Space[] = [];
		// The chart's cycle: the first, judged on its own for its spaces (the verdict is the whole run's).
		judge(thetas0, motions[i]!, input.rule, f, [[0, Math.min(f.period, end)]], spaces);
		const v = judge(thetas0, motions[i]!, input.rule, f, [[0, end]]);
		return {
			case: c,
			margin: round(v.margin),
			gapRatioMin: round(v.gapRatioMin),
			normalRatioMax: round(v.normalRatioMax),
			worst: { ...v.worst, crankDeg: round(v.worst.crankDeg, 2) },
			missedPerCycle: round(v.missed / input.cycles, 3),
			falsePerCycle: round(v.falses / input.cycles, 3),
			spaces
		};
	});
	const worstOf = (clockingDeg: number, windows: readonly [number, number][]) => {
		const thetas = readThetas(readEdges, clockingDeg, f, end);
		return Math.min(...motions.map((m) => judge(thetas, m, input.rule, f, windows).margin));
	};
	const fullWindow: [number, number][] = [[0, end]];
	const currentMargin = Math.min(...cases.map((c) => c.margin));

	// The sweep reads the first and the last period: with a steady speed every period is alike, and an
	// acceleration weighs most at the lowest mean speed, which is at one end of the run.
	const steady = input.cases.every((c) => c.accelRpmPerS === 0);
	const sweepWindows: [number, number][] =
		steady || end <= 2 * f.period
			? [[0, Math.min(end, steady ? f.period : end)]]
			: [
					[0, f.period],
					[end - f.period, end]
				];
	const step = Math.min(1, f.pitch / 4);
	const sweep: SignalCheck['sweep'] = [];
	for (let k = 0; k * step < 360 - 1e-9; k++)
		sweep.push({ clockingDeg: round(k * step, 3), margin: round(worstOf(k * step, sweepWindows)) });

	// The best of the sweep, judged over the whole run like the current one; the current stays unless beaten.
	let best = { toothAtTdc: input.toothAtTdc, margin: currentMargin, keywayShiftDeg: 0 };
	const ranked = [...sweep].sort((a, b) => b.margin - a.margin).slice(0, 3);
	for (const candidate of ranked) {
		const margin = round(worstOf(candidate.clockingDeg, fullWindow));
		if (margin > best.margin + 1e-9) {
			const shift = norm(candidate.clockingDeg - clocking0 + 180, 360) - 180;
			best = { toothAtTdc: round(candidate.clockingDeg / f.pitch, 3), margin, keywayShiftDeg: round(shift, 3) };
		}
	}

	return {
		cycleDeg: f.cycle,
		compression: f.events,
		cases,
		sweep,
		current: { toothAtTdc: input.toothAtTdc, margin: currentMargin },
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
		if (c.margin < 0) {
			const what = c.worst.what === 'gap-too-short' ? 'the gap does not stand out' : 'an ordinary space looks like the gap';
			warnings.push({
				code: 'no-sync',
				message: `${c.case.label}: ${what} at ${c.worst.crankDeg}° after cylinder 1’s TDC${cylinderWords(c.worst.cylinder)}; the ECU loses or never finds its sync there.`
			});
		} else if (c.margin < 0.1) {
			warnings.push({
				code: 'thin-margin',
				message: `${c.case.label}: a sync margin of ${pct(c.margin)} leaves little for sensor noise, runout and a harder start than modelled (from memory, keep it above 10 %).`
			});
		}
	}
	if (best.keywayShiftDeg !== 0) {
		warnings.push({
			code: 'better-clocking',
			message: `Clocked with tooth ${best.toothAtTdc} at the sensor at TDC (the keyway ${best.keywayShiftDeg}° round on the wheel), the worst case keeps a margin of ${pct(best.margin)}.`
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
export function toothEdges(input: Omit<SignalInput, 'cases' | 'rule' | 'sensor' | 'cycles'>, speed: SpeedCase, cycles = 1): ToothEdge[] {
	const f = frameOf({ ...input, cases: [], rule: { ratio: 2 }, cycles, sensor: { kind: 'hall' } });
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
