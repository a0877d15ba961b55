import { describe, expect, it } from 'vitest';
import { signalCheck } from '$lib/trade/signal';
import { checkSignal } from './signal';
import { checkSignalCases } from './signal-cases';

const wheel = { teeth: '36', missing: '1', toothAtTdc: '9', layout: 'single-4', ratio: '1.5' };
const steady = {
	...wheel,
	cranking: '250',
	crankingSwing: '0',
	crankingAccel: '0',
	idleRpm: '1200',
	idleSwing: '0',
	idleAccel: '0',
	freeRevSwing: '0',
	freeRevAccel: '0',
	revLimitSwing: '0',
	revLimitAccel: '0'
};

describe('checkSignalCases', () => {
	it('runs the signal check’s default cases when no case is given', () => {
		const mine = checkSignalCases(wheel);
		const theirs = checkSignal(wheel);
		expect(mine.ok && theirs.ok).toBe(true);
		if (mine.ok && theirs.ok) expect(mine.value.input).toEqual(theirs.value.input);
	});

	it('gives each case its own speed, swing and acceleration', () => {
		const checked = checkSignalCases(steady);
		expect(checked.ok).toBe(true);
		if (!checked.ok) return;
		const byId = Object.fromEntries(checked.value.input.cases.map((c) => [c.id, c]));
		expect([byId.cranking!.rpm, byId.idle!.rpm]).toEqual([250, 1200]);
		expect(checked.value.input.cases.map((c) => [c.swingPct, c.accelRpmPerS])).toEqual([
			[0, 0],
			[0, 0],
			[0, 0],
			[0, 0]
		]);
		// Geometry (common practice): at a steady speed a 36-1's gap is 2× the space before and an
		// ordinary space 1×; against a ratio of 1.5 both stand a third clear, in every case.
		for (const c of signalCheck(checked.value.input).cases) expect(c.syncMargin).toBeCloseTo(1 / 3, 3);
	});

	it('names the case’s own field in a refusal', () => {
		const checked = checkSignalCases({ ...steady, idleSwing: '200', freeRevAccel: 'fast' });
		expect(checked.ok).toBe(false);
		if (checked.ok) return;
		expect(checked.refusals.map((r) => r.field)).toEqual(['idleSwing', 'freeRevAccel']);
	});

	it('refuses a deceleration that stops the engine within the run, on that case’s acceleration', () => {
		const checked = checkSignalCases({ ...steady, crankingAccel: '-5000' });
		expect(checked.ok).toBe(false);
		if (!checked.ok) expect(checked.refusals[0]).toMatchObject({ field: 'crankingAccel' });
	});
});
