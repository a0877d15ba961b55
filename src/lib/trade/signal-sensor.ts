// The sensor's output over time, for the picture: idealised, not a prediction of a real sensor's
// wave shape.
// - Hall-effect: a logic level, 1 while a tooth faces the sensor and 0 over a space (many Hall
//   sensors pull low on a tooth instead: the ECU's set-up says which), switching at the edges.
// - VR: Faraday's law, v = −N·dΦ/dt = −N·ω·dΦ/dθ: the voltage scales with the crank speed times the
//   change of flux with angle. Each tooth's flux is taken as a bell (Gaussian) centred on the tooth,
//   so dΦ/dθ is positive as the tooth comes in, crosses zero at the tooth's centre and is negative as
//   it leaves (the polarity depends on the wiring). Volts when the data sheet's point is given
//   (`vrVolts` at `vrAtRpm`, for a lone tooth's peak), else relative to the peak at the case's mean speed.
import { crankMotion } from './crank-speed';
import { pitchDeg, teethOf } from './pattern';
import type { SensorSpec, SpeedCase, WheelOnEngine } from './signal';

const norm = (a: number, period: number) => ((a % period) + period) % period;

export interface TracePoint {
	/** Seconds from cylinder 1's TDC. */
	t: number;
	v: number;
}

/** Samples per tooth pitch of the VR trace: enough for a smooth curve on a phone's width. */
const vrSamplesPerPitch = 16;

export function sensorTrace(input: WheelOnEngine & { sensor: SensorSpec }, speed: SpeedCase, turns: number): TracePoint[] {
	const factor = input.mount === 'cam' ? 2 : 1;
	const pitch = pitchDeg(input.pattern.teeth);
	const motion = crankMotion({ stroke: input.stroke, intervals: input.intervals }, speed);
	const clocking = norm(input.toothAtTdc * pitch, 360);
	const endDeg = turns * 360 * factor;
	// The wheel angle at the sensor at crank angle θ (phasing.ts: tooth toothAtTdc at the sensor at TDC).
	const wheelAt = (theta: number) => clocking + theta / factor;
	const teeth = teethOf(input.pattern, input.duty);

	if (input.sensor.kind === 'hall') {
		const onTooth = (w: number) => teeth.some((t) => norm(w - t.leadDeg, 360) < t.trailDeg - t.leadDeg);
		const edges = teeth
			.flatMap((t) => [t.leadDeg, t.trailDeg])
			.map((e) => norm((e - clocking) * factor, 360 * factor))
			.sort((a, b) => a - b);
		let level = onTooth(wheelAt(0)) ? 1 : 0;
		const out: TracePoint[] = [{ t: 0, v: level }];
		for (let turn = 0; turn * 360 * factor < endDeg; turn++) {
			for (const e of edges) {
				const theta = e + turn * 360 * factor;
				if (theta <= 0 || theta >= endDeg) continue;
				const t = motion.timeAt(theta);
				out.push({ t, v: level });
				level = 1 - level;
				out.push({ t, v: level });
			}
		}
		out.push({ t: motion.timeAt(endDeg), v: level });
		return out;
	}

	// VR: the bell's width a third of the tooth's, so neighbouring teeth barely overlap.
	const sigma = Math.max((input.duty * pitch) / 3, pitch / 20);
	const centres = teeth.map((t) => (t.leadDeg + t.trailDeg) / 2);
	// A lone tooth's dΦ/dθ peaks at w = σ from its centre, at e^(−1/2)/σ: scaled to 1 there.
	const unit = sigma * Math.exp(0.5);
	const { vrVolts, vrAtRpm } = input.sensor;
	const [refRpm, refVolts] = vrVolts && vrAtRpm ? [vrAtRpm, vrVolts] : [speed.rpm, 1];
	const out: TracePoint[] = [];
	const steps = Math.ceil((turns * 360 * vrSamplesPerPitch) / pitch);
	for (let i = 0; i <= steps; i++) {
		const theta = (i / steps) * endDeg;
		const w = wheelAt(theta);
		let dPhi = 0;
		for (const c of centres) {
			// Distance to the tooth's centre round the wheel, negative while it is still coming.
			let x = norm(w - c, 360);
			if (x > 180) x -= 360;
			if (Math.abs(x) < 5 * sigma) dPhi += (-x / (sigma * sigma)) * Math.exp((-x * x) / (2 * sigma * sigma));
		}
		out.push({ t: motion.timeAt(theta), v: refVolts * (motion.rpmAt(theta) / refRpm) * dPhi * unit });
	}
	return out;
}
