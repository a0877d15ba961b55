import { describe, expect, it } from 'vitest';
import { buildSheetParams, phasingParams } from './phasing';
import { photoParams } from './photo';
import type { Registry } from './registry';
import { checkSignal, signalParams } from './signal';
import { tapeRegistry } from './tape';
import { tdcRegistry } from './tdc';
import { timingCardRegistry } from './timing-card';
import { wheelParams } from './wheel-params';

const base = { teeth: '36', missing: '1', toothAtTdc: '9' };
const refused = (params: Record<string, string>) => {
	const r = checkSignal(params);
	return r.ok ? {} : Object.fromEntries(r.refusals.map((x) => [x.field, x.message]));
};

describe('the signal check’s parameters', () => {
	it('share each name’s label with every other tool (issue 15: one label per public name)', () => {
		const others: Registry[] = [wheelParams, phasingParams, buildSheetParams, tapeRegistry, timingCardRegistry, tdcRegistry, photoParams];
		for (const p of signalParams.params) {
			for (const other of others) if (other.get(p.name)) expect(other.label(p.name), p.name).toBe(p.label);
		}
	});

	it('without a speed given: cranking, idle, free rev and the rev limit, at the phasing check’s cranking speed and rev limit', () => {
		const r = checkSignal({ ...base, cranking: '180', rpm: '9000' });
		if (!r.ok) throw new Error(JSON.stringify(r.refusals));
		expect(r.value.given).toBe(false);
		expect(r.value.input.cases.map((c) => [c.id, c.rpm])).toEqual([
			['cranking', 180],
			['idle', 1000],
			['free-rev', 4500],
			['rev-limit', 9000]
		]);
		expect(r.value.input.cycles).toBe(10);
	});

	it('with a swing or an acceleration: one case at the rev limit’s speed', () => {
		const r = checkSignal({ ...base, rpm: '250', swing: '40' });
		if (!r.ok) throw new Error(JSON.stringify(r.refusals));
		expect(r.value.input.cases).toEqual([{ id: 'given', label: 'The speed given', rpm: 250, swingPct: 40, accelRpmPerS: 0 }]);
		const a = checkSignal({ ...base, accel: '-2000' });
		expect(a.ok && a.value.input.cases[0]).toMatchObject({ rpm: 8000, swingPct: 0, accelRpmPerS: -2000 });
	});

	it('the gap ratio: as given, or midway in proportion between 1 and M + 1 (√2 for 36-1, √3 for 60-2)', () => {
		const given = checkSignal({ ...base, ratio: '1.6', afterRatio: '0.7' });
		expect(given.ok && given.value.input.rule).toEqual({ ratio: 1.6, afterRatio: 0.7 });
		const d36 = checkSignal(base);
		expect(d36.ok && d36.value.input.rule).toEqual({ ratio: 1.41 });
		const d60 = checkSignal({ ...base, teeth: '60', missing: '2' });
		expect(d60.ok && d60.value.input.rule).toEqual({ ratio: 1.73 });
	});

	it('reads the wheel and engine as the phasing check does (measured angles, layout)', () => {
		const r = checkSignal({ teeth: '36', missing: '1', input: 'angles', sensorAngle: '90', layout: 'twin-270' });
		if (!r.ok) throw new Error(JSON.stringify(r.refusals));
		// 90° before the mark, key in line with it, keyway at 0: tooth 9 at TDC (phasing.ts toothAtTdcFrom).
		expect(r.value.input.toothAtTdc).toBe(9);
		expect(r.value.input.intervals).toEqual([270, 450]);
	});
});

describe('its refusals', () => {
	it('name the field: a wheel with no gap, a stalling deceleration, a half-given VR point, VR figures for a Hall sensor', () => {
		expect(Object.keys(refused({ ...base, pattern: 'extra', extraAfter: '3' }))).toEqual(['pattern']);
		expect(Object.keys(refused({ ...base, missing: '0' }))).toEqual(['missing']);
		expect(Object.keys(refused({ ...base, rpm: '200', accel: '-5000', cycles: '10' }))).toEqual(['accel']);
		expect(Object.keys(refused({ ...base, sensor: 'vr', vrVolts: '2' })).sort()).toEqual(['vrRpm', 'vrThreshold']);
		expect(Object.keys(refused({ ...base, vrVolts: '2' }))).toEqual(['vrVolts']);
		expect(Object.keys(refused({ ...base, swing: '95' }))).toEqual(['swing']);
		expect(Object.keys(refused({ ...base, ratio: '1' }))).toEqual(['ratio']);
		expect(Object.keys(refused({ ...base, cycles: '0' }))).toEqual(['cycles']);
		expect(Object.keys(refused({ teeth: '36', missing: '1' }))).toEqual(['toothAtTdc']);
	});

	// As src/lib/schemas/refusal-words.test.ts checks every other tool: words beside a label, no
	// parameter names (camelCase), no `name: ` prefix, no `key=value`.
	it('read as words for every parameter made bad', () => {
		const bads = ['abc', '-5', '99999', '1e400', ' ', '0'];
		for (const name of signalParams.names) {
			for (const bad of bads) {
				for (const extra of [{}, { sensor: 'vr' }]) {
					const r = checkSignal({ ...base, ...extra, [name]: bad });
					if (r.ok) continue;
					for (const x of r.refusals) {
						expect(x.message, `${name}=${bad}`).not.toMatch(/\b[a-z]+[A-Z][A-Za-z]*\b|^[\w.]+: |\b[a-z]+=[\w-]+/);
					}
				}
			}
		}
	});
});
