import { describe, expect, it } from 'vitest';
import { compressionEvents, crankMotion, eventWidthDeg, swingShape } from './crank-speed';

const single = { stroke: 4 as const, intervals: [720] };
const twin270 = { stroke: 4 as const, intervals: [270, 450] };
const four = { stroke: 4 as const, intervals: [180, 180, 180, 180] };

describe('the swing’s shape', () => {
	// What the model promises (crank-speed.ts's header), checked by sampling: the angle mean is 0,
	// highest minus lowest is 1 (so swingPct is peak to peak), lowest at each TDC.
	for (const [name, profile, tdcs] of [
		['single', single, [0]],
		['270° twin', twin270, [0, 270]],
		['flat-plane four', four, [0, 180, 360, 540]]
	] as const) {
		it(`${name}: zero mean, peak to peak 1, lowest at each TDC`, () => {
			const u = swingShape(profile);
			const samples = Array.from({ length: 7200 }, (_, i) => u(i / 10));
			// Midpoint sums of a periodic function converge fast: the mean to well under 1e-9.
			expect(Math.abs(samples.reduce((a, b) => a + b, 0) / samples.length)).toBeLessThan(1e-9);
			expect(Math.max(...samples) - Math.min(...samples)).toBeCloseTo(1, 9);
			for (const tdc of tdcs) expect(u(tdc)).toBeCloseTo(Math.min(...samples), 9);
		});
	}
	it('events are half a turn wide unless the firing intervals are shorter (from memory: the gas spring about TDC)', () => {
		expect(eventWidthDeg([720])).toBe(180);
		expect(eventWidthDeg([90, 90, 90, 90, 90, 90, 90, 90])).toBe(90);
		expect(compressionEvents(twin270)).toEqual([
			{ cylinder: 1, fromDeg: 630, tdcDeg: 0, toDeg: 810 },
			{ cylinder: 2, fromDeg: 180, tdcDeg: 270, toDeg: 360 }
		]);
	});
});

describe('crank angle against time', () => {
	it('steady speed, no swing: t = θ / (6·rpm) (1 rpm is 6°/s)', () => {
		const m = crankMotion(single, { rpm: 1500, swingPct: 0, accelRpmPerS: 0 });
		for (const theta of [0, 1, 359.5, 720, 7201.25]) expect(m.timeAt(theta)).toBeCloseTo(theta / 9000, 12);
	});

	it('steady acceleration, no swing: t from θ = ω₀t + ½αt² solved in the test', () => {
		const [rpm, accel] = [800, 6000];
		const m = crankMotion(four, { rpm, swingPct: 0, accelRpmPerS: accel });
		const [w0, alpha] = [rpm * 6, accel * 6];
		for (const theta of [10, 500, 3600, 7000]) {
			const t = (-w0 + Math.sqrt(w0 * w0 + 2 * alpha * theta)) / alpha;
			expect(m.timeAt(theta)).toBeCloseTo(t, 10);
			expect(m.rpmAt(theta)).toBeCloseTo(rpm + accel * t, 6);
		}
	});

	it('a deceleration that stops the engine leaves no time past the stop (θ_stop = ω₀²/(2|α|))', () => {
		const m = crankMotion(single, { rpm: 300, swingPct: 0, accelRpmPerS: -3000 });
		const stop = (1800 * 1800) / (2 * 18000);
		expect(m.stopsAtDeg).toBeCloseTo(stop, 6);
		expect(m.timeAt(stop * 0.99)).toBeGreaterThan(0);
		expect(m.timeAt(stop * 1.01)).toBeNaN();
	});

	it('with a swing: times agree with RK4 in time on the speed written here another way (to 1 µs over two cycles)', () => {
		// The model's speed written out again from its definition, the dip as cos²(πd/W) (= (1 + cos 2πd/W)/2).
		const [rpm, swing, accel] = [250, 40, 1500];
		const tdcs = [0, 270];
		const w = 180;
		const speed = (theta: number, t: number) => {
			let dip = 0;
			for (const tdc of tdcs) {
				const d = ((((theta - tdc) % 720) + 1080) % 720) - 360;
				if (Math.abs(d) < w / 2) dip += Math.cos((Math.PI * d) / w) ** 2;
			}
			const mean = (tdcs.length * w) / 2 / 720;
			return 6 * (rpm + accel * t) * (1 + (swing / 100) * (mean - dip));
		};
		const m = crankMotion(twin270, { rpm, swingPct: swing, accelRpmPerS: accel });
		const dt = 2e-5;
		let [t, theta] = [0, 0];
		const checks = [45, 271, 333.3, 719, 1000, 1439];
		let next = 0;
		while (next < checks.length) {
			const k1 = speed(theta, t);
			const k2 = speed(theta + (dt / 2) * k1, t + dt / 2);
			const k3 = speed(theta + (dt / 2) * k2, t + dt / 2);
			const k4 = speed(theta + dt * k3, t + dt);
			const after = theta + (dt / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
			// Crossing a checked angle inside the step: linear interpolation (the step is ~0.03°).
			while (next < checks.length && after >= checks[next]!) {
				const at = t + (dt * (checks[next]! - theta)) / (after - theta);
				expect(Math.abs(m.timeAt(checks[next]!) - at)).toBeLessThan(1e-6);
				next++;
			}
			[t, theta] = [t + dt, after];
		}
	});
});
