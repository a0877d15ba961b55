import { describe, expect, it } from 'vitest';
import { sensorTrace } from './signal-sensor';

const wheel = {
	pattern: { kind: 'missing' as const, teeth: 36, missing: 1 },
	duty: 0.5,
	mount: 'crank' as const,
	stroke: 4 as const,
	intervals: [720],
	toothAtTdc: 0.25,
	edge: 'leading' as const
};
const steady = (rpm: number) => ({ id: 's', label: 'Steady', rpm, swingPct: 0, accelRpmPerS: 0 });

describe('the sensor trace', () => {
	it('Hall: one rise per tooth present, at its leading edge (geometry: tooth k meets the sensor (k − 0.25)·10° after TDC)', () => {
		const trace = sensorTrace({ ...wheel, sensor: { kind: 'hall' } }, steady(600), 1);
		const rises = trace.filter((p, i) => i > 0 && trace[i - 1]!.v === 0 && p.v === 1 && trace[i - 1]!.t === p.t);
		expect(rises.length).toBe(35);
		// At 600 rpm the crank turns 3600°/s; tooth 1's leading edge comes 7.5° after TDC.
		expect(rises[0]!.t).toBeCloseTo(7.5 / 3600, 9);
		// TDC finds the sensor 2.5° into tooth 0 (0° to 5°): the trace starts high.
		expect(trace[0]).toEqual({ t: 0, v: 1 });
	});

	it('VR: crosses zero going down at each tooth’s centre, and doubles with the speed (Faraday)', () => {
		const slow = sensorTrace({ ...wheel, sensor: { kind: 'vr' } }, steady(600), 1);
		const fast = sensorTrace({ ...wheel, sensor: { kind: 'vr', vrVolts: 4, vrAtRpm: 600 } }, steady(1200), 1);
		const downs: number[] = [];
		for (let i = 1; i < slow.length; i++) {
			const [a, b] = [slow[i - 1]!, slow[i]!];
			if (a.v > 0 && b.v <= 0) downs.push(a.t + ((b.t - a.t) * a.v) / (a.v - b.v));
		}
		expect(downs.length).toBe(35);
		// Tooth 0's centre (2.5°) is at the sensor at TDC, where the trace starts at 0; tooth 1's (12.5°)
		// passes 12.5 − 2.5 = 10° after TDC: 10/3600 s at 600 rpm. 34 more to tooth 0's again at 360°.
		expect(downs[0]!).toBeCloseTo(10 / 3600, 6);
		const peak = (tr: { v: number }[]) => Math.max(...tr.map((p) => p.v));
		// Relative units at the case's own speed: a lone tooth's peak is 1 (neighbours add a little).
		expect(peak(slow)).toBeGreaterThan(0.95);
		expect(peak(slow)).toBeLessThan(1.1);
		// In volts: 4 V at 600 rpm, twice the speed gives twice the voltage.
		expect(peak(fast) / peak(slow)).toBeCloseTo(8, 1);
	});
});
