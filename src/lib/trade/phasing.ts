// Phasing: where the engine is when a tooth reaches the sensor, in the numbers a tuner enters.
// Conventions: tooth 0 is the first after the gap; `toothAtTdc` is the tooth (fractions allowed)
// under the sensor with cylinder 1 at TDC, given as such or worked out from angles measured on the
// engine (toothAtTdcFrom). A wheel on the cam turns at half crank speed, so one wheel degree is two
// crank degrees.
import { cycleDeg, firingTdcs, type Stroke } from './engine';
import { gapsOf, pitchDeg, type Pattern } from './pattern';

export interface PhasingInput {
	pattern: Pattern;
	duty: number;
	mount: 'crank' | 'cam';
	stroke: Stroke;
	intervals: number[];
	toothAtTdc: number;
	/** Which tooth edge the ECU reads. */
	edge: 'leading' | 'trailing';
	revLimitRpm: number;
	crankingRpm: number;
	sensorMaxHz: number;
	/** The spark window each cylinder keeps the gap clear of, degrees BTDC: from `windowFromBtdc` down to `windowToBtdc`. */
	windowFromBtdc: number;
	windowToBtdc: number;
	/** Finest timing step wanted, crank degrees (optional). */
	resolutionDeg?: number;
}

export interface PhasingResult {
	pitchDeg: number;
	resolutionDeg: number;
	firstToothOffsetDeg: number;
	pitchFrequencyHz: number;
	/** How long the shortest gap takes to pass the sensor at cranking speed; null when the pattern has no gap. */
	gapAtCrankingMs: number | null;
	gapClearanceDeg: { cylinder: number; tdcDeg: number; clearanceDeg: number }[];
	warnings: { code: string; message: string }[];
}

const norm = (a: number, period: number) => ((a % period) + period) % period;
const round = (x: number, places = 3) => Math.round(x * 10 ** places) / 10 ** places;

/** Crank degrees between two intervals on a circle of `period` (0 when they overlap). */
function separation(a0: number, a1: number, b0: number, b1: number, period: number): number {
	let best = Infinity;
	for (const shift of [-period, 0, period]) {
		const s0 = b0 + shift;
		const s1 = b1 + shift;
		if (a0 <= s1 && s0 <= a1) return 0;
		best = Math.min(best, Math.abs(s0 - a1), Math.abs(a0 - s1));
	}
	return best;
}

export function phasing(input: PhasingInput): PhasingResult {
	const factor = input.mount === 'cam' ? 2 : 1;
	const pitch = pitchDeg(input.pattern.teeth);
	const toothWidth = input.duty * pitch;
	// Tooth 0's leading edge met the sensor toothAtTdc pitches of wheel before TDC.
	const leadOffset = input.toothAtTdc * pitch * factor;
	const firstToothOffsetDeg = input.edge === 'leading' ? leadOffset : leadOffset - toothWidth * factor;
	const wheelRpmAt = (crankRpm: number) => crankRpm / factor;
	// Tooth pitch frequency f = N·rpm/60 (common practice), at the wheel's own speed.
	const pitchFrequencyHz = (input.pattern.teeth * wheelRpmAt(input.revLimitRpm)) / 60;

	const cycle = cycleDeg(input.stroke);
	const wheelTurn = 360 * factor; // crank degrees per turn of the wheel
	const gaps = gapsOf(input.pattern).map((g) => {
		// The gap's open space, wheel degrees from tooth 0's leading edge, then crank degrees after TDC 1.
		const from = (g.first - 1) * pitch + toothWidth;
		const to = (g.first + g.count) * pitch;
		return { from: (from - input.toothAtTdc * pitch) * factor, to: (to - input.toothAtTdc * pitch) * factor };
	});
	const tdcs = firingTdcs(input.intervals);
	// The shortest gap is the one the ECU is likeliest to miss while cranking; no gap, nothing to time.
	const shortestGap = Math.min(...gaps.map((g) => g.to - g.from));
	const gapAtCrankingMs = gaps.length ? ((shortestGap / factor / 360) * 60_000) / wheelRpmAt(input.crankingRpm) : null;

	const clearances = tdcs.map((tdc, i) => {
		const w0 = tdc - input.windowFromBtdc;
		const w1 = tdc - input.windowToBtdc;
		let clearance = Infinity;
		// The wheel repeats every wheelTurn; the engine's cycle every `cycle`: look at every pass of each gap in a cycle.
		for (const g of gaps) {
			for (let turn = 0; turn * wheelTurn < cycle; turn++) {
				clearance = Math.min(
					clearance,
					separation(w0, w1, norm(g.from + turn * wheelTurn, cycle), norm(g.from + turn * wheelTurn, cycle) + (g.to - g.from), cycle)
				);
			}
		}
		return { cylinder: i + 1, tdcDeg: tdc, clearanceDeg: gaps.length ? round(clearance) : NaN };
	});

	const warnings: PhasingResult['warnings'] = [];
	for (const c of clearances) {
		if (c.clearanceDeg === 0) {
			warnings.push({
				code: 'gap-in-spark-window',
				message: `The gap passes the sensor inside cylinder ${c.cylinder}'s spark window (${input.windowFromBtdc}° to ${input.windowToBtdc}° BTDC): the ECU re-synchronises there and timing can jump. Clock the wheel so the gap comes earlier.`
			});
		}
	}
	if (pitchFrequencyHz > input.sensorMaxHz) {
		warnings.push({
			code: 'sensor-too-slow',
			message: `At ${input.revLimitRpm} rpm the teeth pass at ${round(pitchFrequencyHz, 0)} Hz, above the sensor's ${input.sensorMaxHz} Hz: the signal will drop out near the rev limit. Use fewer teeth or a faster sensor.`
		});
	}
	if (input.mount === 'crank' && input.stroke === 4) {
		warnings.push({
			code: 'no-cam-phase',
			message:
				'A crank-only wheel on a four-stroke cannot tell compression from exhaust: wasted spark and batch (or semi-sequential) injection only, unless a cam signal is added.'
		});
	}
	const resolution = pitch * factor;
	if (input.resolutionDeg !== undefined && resolution > input.resolutionDeg) {
		warnings.push({
			code: 'too-few-teeth',
			message: `One tooth every ${round(resolution)} crank degrees is coarser than the ${input.resolutionDeg}° asked for: use more teeth.`
		});
	}

	return {
		pitchDeg: round(pitch),
		resolutionDeg: round(resolution),
		firstToothOffsetDeg: round(norm(firstToothOffsetDeg, wheelTurn)),
		pitchFrequencyHz: round(pitchFrequencyHz, 1),
		gapAtCrankingMs: gapAtCrankingMs === null ? null : round(gapAtCrankingMs, 2),
		gapClearanceDeg: clearances,
		warnings
	};
}

/**
 * Where to put the keyway on the wheel (the designer's keywayAngle, wheel degrees from tooth 0's
 * leading edge) so the first-tooth offset lands on `targetDeg` BTDC, given where the key sits
 * with cylinder 1 at TDC: `keyFromSensorDeg` wheel degrees the key still has to turn, in the
 * sense of rotation, before it reaches the sensor.
 */
export function clockingFor(targetDeg: number, keyFromSensorDeg: number, mount: 'crank' | 'cam'): number {
	const factor = mount === 'cam' ? 2 : 1;
	return round(norm(targetDeg / factor + keyFromSensorDeg, 360));
}

/**
 * The wheel as measured on the engine, instead of the tooth under the sensor. All with cylinder 1
 * at TDC, angles round the wheel's shaft in the sense a point of the wheel travels:
 */
export interface MeasuredAngles {
	/**
	 * Where the sensor sits: crank degrees before the engine's fixed TDC mark (pointer). A point of
	 * the wheel passes the sensor, and this many crank degrees of turning later reaches the mark;
	 * read off a degree wheel or tape zeroed at the mark, BTDC positive. Negative: after the mark.
	 */
	sensorFromTdcDeg: number;
	/** Where the keyway is cut on the wheel: wheel degrees from tooth 0's leading edge (the designer's keywayAngle). */
	keywayDeg: number;
	/** Where the shaft's key sits, crank degrees before the TDC mark like the sensor; 0 = in line with the mark. */
	keyFromTdcDeg: number;
	mount: 'crank' | 'cam';
}

/**
 * The tooth under the sensor with cylinder 1 at TDC (fractions allowed, 0 up to `teeth`), from the
 * measured angles. Geometry: a wheel angle counts up in the order points reach the sensor, so the
 * point w wheel degrees past the keyway sits w further before the mark than the key does; the
 * one at the sensor has w = (sensor − key) / factor + keyway, factor 2 on the cam.
 */
export function toothAtTdcFrom(m: MeasuredAngles & { teeth: number }): number {
	const factor = m.mount === 'cam' ? 2 : 1;
	const atSensor = norm((m.sensorFromTdcDeg - m.keyFromTdcDeg) / factor + m.keywayDeg, 360);
	// Rounded off the float noise, so a whole tooth stays whole and 35.9999999 of 36 comes back to 0.
	const tooth = round(atSensor / pitchDeg(m.teeth), 9);
	return tooth >= m.teeth ? 0 : tooth;
}

/** With cylinder 1 at TDC, wheel degrees the key still turns before it reaches the sensor (clockingFor's keyFromSensorDeg). */
export function keyFromSensorFrom(m: Omit<MeasuredAngles, 'keywayDeg'>): number {
	const factor = m.mount === 'cam' ? 2 : 1;
	const d = round(norm((m.keyFromTdcDeg - m.sensorFromTdcDeg) / factor, 360), 9);
	return d >= 360 ? 0 : d;
}
