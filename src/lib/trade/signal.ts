// The signal check: will the ECU find the gap on this engine? The wheel of the phasing check turns
// past its sensor at the crank speed of crank-speed.ts (a mean speed, a swing per compression
// event, a steady acceleration); every tooth edge gets its time, and the ECU's gap rule (generic:
// a space is the gap when it is longer than `ratio` times the space before it, and optionally the
// space after it is shorter than `afterRatio` times the gap) is run over the spaces between the
// edges the ECU reads. Angles: crank degrees after cylinder 1's firing TDC; wheel degrees after
// tooth 0's leading edge (tooth 0 is the first after the gap), as in phasing.ts.
import type { PhasingInput } from './phasing';

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
