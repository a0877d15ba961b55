import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { cycleDeg, firingTdcs, layoutChoices, layouts, legacyVTwin, vTwin } from './engine';
import { modelClearances } from '../../../tests/support/phasing-model';
import { clockingFor, keyFromSensorFrom, phasing, toothAtTdcFrom, type PhasingInput } from './phasing';

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
		expect(
			phasing(input({ pattern: { kind: 'missing', teeth: 12, missing: 1 }, resolutionDeg: 10 })).warnings.map((w) => w.code)
		).toContain('too-few-teeth');
	});

	it('suggests the keyway angle that puts the first-tooth offset on target', () => {
		// Target 90° BTDC with the key 30° before the sensor at TDC (it reaches the sensor 30° later):
		// tooth 0 must have passed the sensor 90° ago, so the keyway sits 120° after tooth 0's leading edge.
		expect(clockingFor(90, 30, 'crank')).toBe(120);
		expect(clockingFor(90, 30, 'cam')).toBe(75);
	});
});

describe('tooth at TDC from measured angles', () => {
	const teeth = 36;
	// Worked example by geometry: keyway cut at tooth 0's leading edge, key in line with the TDC
	// mark, sensor 90° before the mark. At TDC tooth 0's leading edge sits at the mark, so it passed
	// the sensor 90° ago: the point at the sensor is 90° of wheel after it, tooth 9 of a 10° pitch,
	// the same 90° BTDC as the tooth-input worked example above.
	it('36-1, keyway at tooth 0, key at the mark, sensor 90° before it: tooth 9, 90° BTDC', () => {
		const toothAtTdc = toothAtTdcFrom({ sensorFromTdcDeg: 90, keywayDeg: 0, keyFromTdcDeg: 0, teeth, mount: 'crank' });
		expect(toothAtTdc).toBe(9);
		expect(phasing(input({ toothAtTdc })).firstToothOffsetDeg).toBe(90);
	});

	it('the keyway and the key move the tooth at the sensor by their angles', () => {
		// Keyway 45° after tooth 0: with the key at the mark, tooth 0 sits 45° past the mark, 135° past the sensor.
		expect(toothAtTdcFrom({ sensorFromTdcDeg: 90, keywayDeg: 45, keyFromTdcDeg: 0, teeth, mount: 'crank' })).toBe(13.5);
		// Key 30° before the mark: the whole wheel sits 30° earlier, tooth 0's leading edge 60° past the sensor.
		expect(toothAtTdcFrom({ sensorFromTdcDeg: 90, keywayDeg: 0, keyFromTdcDeg: 30, teeth, mount: 'crank' })).toBe(6);
	});

	it('a cam wheel halves the crank degrees into wheel degrees', () => {
		// Sensor 180 crank degrees before the mark = 90° round the cam: tooth 9, and 180° BTDC on the crank.
		const toothAtTdc = toothAtTdcFrom({ sensorFromTdcDeg: 180, keywayDeg: 0, keyFromTdcDeg: 0, teeth, mount: 'cam' });
		expect(toothAtTdc).toBe(9);
		expect(phasing(input({ toothAtTdc, mount: 'cam' })).firstToothOffsetDeg).toBe(180);
		// Key 60 crank degrees before the mark (30° of cam), keyway 30° of wheel: (180 − 60) / 2 + 30 = 90°, tooth 9 again.
		expect(toothAtTdcFrom({ sensorFromTdcDeg: 180, keywayDeg: 30, keyFromTdcDeg: 60, teeth, mount: 'cam' })).toBe(9);
	});

	it('wraps round the wheel', () => {
		// Sensor 30° after the mark: tooth 0 passed it 330° ago, tooth 33.
		expect(toothAtTdcFrom({ sensorFromTdcDeg: -30, keywayDeg: 0, keyFromTdcDeg: 0, teeth, mount: 'crank' })).toBe(33);
		// 20° + 350° = 370°: one pitch past a full turn, tooth 1.
		expect(toothAtTdcFrom({ sensorFromTdcDeg: 20, keywayDeg: 350, keyFromTdcDeg: 0, teeth, mount: 'crank' })).toBe(1);
		// A full turn exactly is tooth 0, never tooth 36.
		expect(toothAtTdcFrom({ sensorFromTdcDeg: 360, keywayDeg: 0, keyFromTdcDeg: 0, teeth, mount: 'crank' })).toBe(0);
		expect(toothAtTdcFrom({ sensorFromTdcDeg: 0.1 + 0.2, keywayDeg: -0.3, keyFromTdcDeg: 0, teeth, mount: 'crank' })).toBe(0);
		expect(toothAtTdcFrom({ sensorFromTdcDeg: 720, keywayDeg: 0, keyFromTdcDeg: 0, teeth, mount: 'cam' })).toBe(0);
	});

	it('says where the key sits from the sensor, as clockingFor takes it', () => {
		// Sensor 90° before the mark, key at the mark: the key reaches the sensor 270° later.
		expect(keyFromSensorFrom({ sensorFromTdcDeg: 90, keyFromTdcDeg: 0, mount: 'crank' })).toBe(270);
		expect(clockingFor(90, 270, 'crank')).toBe(0);
		expect(keyFromSensorFrom({ sensorFromTdcDeg: 90, keyFromTdcDeg: 0, mount: 'cam' })).toBe(315);
	});

	// Property: clocking the wheel as clockingFor suggests, for wherever the sensor and the key are
	// measured, brings the first-tooth offset onto the target (the two conventions agree).
	it('clockingFor and toothAtTdcFrom agree: the suggested keyway gives the target offset', () => {
		fc.assert(
			fc.property(
				fc.integer({ min: 2, max: 720 }),
				fc.constantFrom('crank' as const, 'cam' as const),
				fc.double({ min: -720, max: 720, noNaN: true }),
				fc.double({ min: -720, max: 720, noNaN: true }),
				fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true }),
				(n, mount, sensorFromTdcDeg, keyFromTdcDeg, share) => {
					const wheelTurn = mount === 'cam' ? 720 : 360;
					const target = share * wheelTurn;
					const keywayDeg = clockingFor(target, keyFromSensorFrom({ sensorFromTdcDeg, keyFromTdcDeg, mount }), mount);
					const toothAtTdc = toothAtTdcFrom({ sensorFromTdcDeg, keywayDeg, keyFromTdcDeg, teeth: n, mount });
					expect(toothAtTdc).toBeGreaterThanOrEqual(0);
					expect(toothAtTdc).toBeLessThan(n);
					const offset = phasing(input({ pattern: { kind: 'missing', teeth: n, missing: 1 }, mount, toothAtTdc })).firstToothOffsetDeg;
					// Circular difference; clockingFor rounds to 0.001° of wheel, phasing to 0.001° of crank.
					const diff = Math.abs(((((offset - target) % wheelTurn) + wheelTurn * 1.5) % wheelTurn) - wheelTurn / 2);
					expect(diff).toBeLessThan(0.01);
				}
			)
		);
	});
});

describe('engine layouts', () => {
	// Engine cycle definition (common practice): intervals add up to 720° (4-stroke) or 360° (2-stroke).
	it.each(layouts)('$label: intervals add up to one cycle', (l) => {
		expect(l.intervals.reduce((a, b) => a + b, 0)).toBe(l.stroke === 4 ? 720 : 360);
	});

	it('a 90° V-twin fires at 450° and 270°; a 270° twin at 270° then 450°', () => {
		expect(vTwin(90).intervals).toEqual([450, 270]);
		expect(firingTdcs(layouts.find((l) => l.id === 'twin-270')!.intervals)).toEqual([0, 270]);
	});

	// Engine layout definition (common practice): on one crankpin the second cylinder's TDC comes V
	// crank degrees after the first's, on the next turn for a four-stroke: intervals 360 + V, 360 − V.
	it('a V-twin of any V angle: 52° fires at 412° then 308°, 45° at 405° then 315°, 52.5° too', () => {
		expect(vTwin(52)).toMatchObject({ id: 'v-twin', stroke: 4, intervals: [412, 308], label: 'V-twin, 52° V, one crankpin' });
		expect(firingTdcs(vTwin(52).intervals)).toEqual([0, 412]);
		expect(vTwin(45).intervals).toEqual([405, 315]);
		expect(vTwin(52.5).intervals).toEqual([412.5, 307.5]);
		fc.assert(
			fc.property(fc.double({ min: 15, max: 120, noNaN: true }), (v) => {
				const [a, b] = vTwin(v).intervals as [number, number];
				expect(a + b).toBeCloseTo(cycleDeg(4), 9);
				expect(a - b).toBeCloseTo(2 * v, 9);
			})
		);
	});

	it('the earlier V-twin ids still read, as V angles; the select offers one V-twin', () => {
		expect([45, 60, 75, 90].map((v) => legacyVTwin(`v-twin-${v}`))).toEqual([45, 60, 75, 90]);
		expect(legacyVTwin('v-twin')).toBeNull();
		expect(legacyVTwin('twin-270')).toBeNull();
		expect(layoutChoices.filter((l) => l.id.startsWith('v-twin')).map((l) => l.id)).toEqual(['v-twin']);
	});
});

describe('every gap of the real pattern against each spark window (numerical model)', () => {
	const cases: [string, Partial<PhasingInput>][] = [
		// The case: 36-1-1 with the second gap (position 17) inside the window: tooth 19 at TDC.
		['36-1-1, gap at 17 inside the window', { pattern: { kind: 'custom', teeth: 36, missingPositions: [17, 35] }, toothAtTdc: 19 }],
		['36-1-1, both clear', { pattern: { kind: 'custom', teeth: 36, missingPositions: [17, 35] }, toothAtTdc: 9 }],
		[
			'36-2-2-2 style, three gaps, V-twin',
			{ pattern: { kind: 'custom', teeth: 36, missingPositions: [10, 11, 22, 23, 34, 35] }, intervals: [315, 405], toothAtTdc: 1.5 }
		],
		[
			'60-2 on the cam, four cylinders',
			{ pattern: { kind: 'missing', teeth: 60, missing: 2 }, mount: 'cam', intervals: [180, 180, 180, 180], toothAtTdc: 13.25 }
		],
		[
			'12-3 two-stroke twin',
			{ pattern: { kind: 'missing', teeth: 12, missing: 3 }, stroke: 2, intervals: [180, 180], toothAtTdc: 2.5, duty: 0.4 }
		]
	];
	it.each(cases)('%s', (_, over) => {
		const i = input(over);
		const r = phasing(i);
		const model = modelClearances(i);
		expect(r.gapClearanceDeg).toHaveLength(model.clearances.length);
		r.gapClearanceDeg.forEach((c, k) =>
			expect(Math.abs(c.clearanceDeg - model.clearances[k]!), `cylinder ${c.cylinder}`).toBeLessThanOrEqual(0.05)
		);
	});

	it('the issue’s 36-1-1 case: the gap at position 17 passes inside the window (clearance 0); a 36-1 reading would have said 125° or more', () => {
		const i = input({ pattern: { kind: 'custom', teeth: 36, missingPositions: [17, 35] }, toothAtTdc: 19 });
		expect(modelClearances(i).clearances).toEqual([0]);
		expect(phasing(i).gapClearanceDeg[0]!.clearanceDeg).toBe(0);
		expect(phasing(i).warnings.map((w) => w.code)).toContain('gap-in-spark-window');
		expect(modelClearances(input({ toothAtTdc: 19 })).clearances[0]).toBeGreaterThan(100);
	});

	it('an N+1 cam wheel has no gap: no cranking time, no clearance', () => {
		const i = input({ pattern: { kind: 'extra', teeth: 24, extraAfter: 3 }, mount: 'cam', duty: 0.4 });
		expect(modelClearances(i).gapRuns).toBe(0);
		const r = phasing(i);
		expect(r.gapAtCrankingMs).toBeNull();
		expect(r.gapClearanceDeg.every((c) => Number.isNaN(c.clearanceDeg))).toBe(true);
	});

	it('with gaps of different lengths the cranking time is the shortest gap’s', () => {
		// 36 teeth, gaps of one and of two positions, duty 0.5: open spaces 1.5 and 2.5 pitches (15° and 25°).
		// At 200 rpm a crank degree takes 60000 / (200 · 360) ms: 15° -> 12.5 ms.
		const r = phasing(input({ pattern: { kind: 'custom', teeth: 36, missingPositions: [11, 34, 35] } }));
		expect(r.gapAtCrankingMs).toBe(12.5);
	});

	it('drops the "TDC between teeth" warning: nothing in it for a tuner to act on', () => {
		const r = phasing(input({ toothAtTdc: 9.3, intervals: [315, 405] }));
		expect(r.warnings.map((w) => w.code)).not.toContain('tdc-between-teeth');
	});
});
