import { describe, expect, it } from 'vitest';
import { firingTdcs, layouts } from './engine';
import { clockingFor, phasing, type PhasingInput } from './phasing';

const input = (over: Partial<PhasingInput> = {}): PhasingInput => ({
	pattern: { kind: 'missing', teeth: 36, missing: 1 },
	duty: 0.5,
	mount: 'crank',
	stroke: 4,
	intervals: [720],
	toothAtTdc: 9,
	edge: 'leading',
	revLimitRpm: 12000,
	crankingRpm: 200,
	sensorMaxHz: 20000,
	windowFromBtdc: 45,
	windowToBtdc: 0,
	...over
});

describe('phasing', () => {
	// Worked example by geometry (common practice): 36-1 with tooth 9 at TDC -> 90° offset.
	it('36-1, tooth 9 at TDC: first-tooth offset 90° BTDC, pitch 10°', () => {
		const r = phasing(input());
		expect(r.firstToothOffsetDeg).toBe(90);
		expect(r.pitchDeg).toBe(10);
	});

	it('fractional teeth and the trailing edge', () => {
		expect(phasing(input({ toothAtTdc: 4.5 })).firstToothOffsetDeg).toBe(45);
		expect(phasing(input({ edge: 'trailing' })).firstToothOffsetDeg).toBe(85);
	});

	// Tooth pitch frequency f = N·rpm/60 (common practice).
	it('pitch frequency at the rev limit: 36 teeth at 12000 rpm = 7200 Hz; half that on the cam', () => {
		expect(phasing(input()).pitchFrequencyHz).toBe(7200);
		expect(phasing(input({ mount: 'cam' })).pitchFrequencyHz).toBe(3600);
		expect(phasing(input({ sensorMaxHz: 5000 })).warnings.map((w) => w.code)).toContain('sensor-too-slow');
	});

	it('a cam wheel doubles the degrees; a crank wheel on a 4-stroke is warned it cannot see the cam phase', () => {
		expect(phasing(input({ mount: 'cam' })).firstToothOffsetDeg).toBe(180);
		expect(phasing(input()).warnings.map((w) => w.code)).toContain('no-cam-phase');
		expect(phasing(input({ mount: 'cam' })).warnings.map((w) => w.code)).not.toContain('no-cam-phase');
	});

	it('gap duration at cranking speed: 15° of wheel at 200 rpm is 12.5 ms', () => {
		// Gap 36-1, duty 0.5: (1 + 1)·10° − 5° = 15°; 200 rpm = 1200°/s.
		expect(phasing(input()).gapAtCrankingMs).toBe(12.5);
	});

	it('gap clearance: tooth 9 at TDC puts the gap 105° to 90° BTDC, 45° clear of a 45°–0° window', () => {
		const r = phasing(input());
		expect(r.gapClearanceDeg).toEqual([{ cylinder: 1, tdcDeg: 0, clearanceDeg: 45 }]);
		const tight = phasing(input({ toothAtTdc: 3 }));
		expect(tight.gapClearanceDeg[0]!.clearanceDeg).toBe(0);
		expect(tight.warnings.map((w) => w.code)).toContain('gap-in-spark-window');
	});

	it('a 180° twin and a 360° twin on the same wheel clear the gap differently', () => {
		// Tooth 18 at TDC: the gap passes 195° to 180° BTDC of cylinder 1, on both crank turns, so
		// at 165°–180° and 525°–540° after cylinder 1's firing TDC.
		const t180 = phasing(input({ intervals: [180, 540], toothAtTdc: 18 }));
		const t360 = phasing(input({ intervals: [360, 360], toothAtTdc: 18 }));
		// 180° twin: cylinder 2 fires at 180°, its window 135°–180° meets the gap.
		expect(t180.gapClearanceDeg.map((c) => c.clearanceDeg)).toEqual([135, 0]);
		// 360° twin: cylinder 2 fires at 360°, window 315°–360°: 135° clear.
		expect(t360.gapClearanceDeg.map((c) => c.clearanceDeg)).toEqual([135, 135]);
		expect(t180.warnings.map((w) => w.code)).toContain('gap-in-spark-window');
		expect(t360.warnings.map((w) => w.code)).not.toContain('gap-in-spark-window');
	});

	it('asks for more teeth when the resolution is too coarse', () => {
		expect(phasing(input({ pattern: { kind: 'missing', teeth: 12, missing: 1 }, resolutionDeg: 10 })).warnings.map((w) => w.code)).toContain('too-few-teeth');
	});

	it('suggests the keyway angle that puts the first-tooth offset on target', () => {
		// Target 90° BTDC with the key 30° past the sensor at TDC: the keyway at 120° in the designer.
		expect(clockingFor(90, 30, 'crank')).toBe(120);
		expect(clockingFor(90, 30, 'cam')).toBe(75);
	});
});

describe('engine layouts', () => {
	// Engine cycle definition (common practice): intervals add up to 720° (4-stroke) or 360° (2-stroke).
	it.each(layouts)('$label: intervals add up to one cycle', (l) => {
		expect(l.intervals.reduce((a, b) => a + b, 0)).toBe(l.stroke === 4 ? 720 : 360);
	});

	it('a 90° V-twin fires at 450° and 270°; a 270° twin at 270° then 450°', () => {
		expect(layouts.find((l) => l.id === 'v-twin-90')!.intervals).toEqual([450, 270]);
		expect(firingTdcs(layouts.find((l) => l.id === 'twin-270')!.intervals)).toEqual([0, 270]);
	});
});
