import { modelClearances } from '../support/phasing-model';
import { describe, expect, it } from 'vitest';
import { checkPhasing } from '../../src/lib/schemas/phasing';
import { phasingSent } from '../../src/routes/phasing/form-query';

const get = (params: Record<string, string>) => fetch(`${process.env.APP_URL}/api/v1/phasing?${new URLSearchParams(params)}`);

describe('GET /api/v1/phasing', () => {
	// Worked example by geometry (common practice): 36-1, tooth 9 at TDC -> 90° BTDC; f = N·rpm/60.
	it('the query of the issue: 36-1, tooth 9 at TDC, 12000 rpm single', async () => {
		const res = await get({ teeth: '36', missing: '1', toothAtTdc: '9', rpm: '12000', cylinders: '1', stroke: '4' });
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body).toMatchObject({
			pitchDeg: 10,
			firstToothOffsetDeg: 90,
			pitchFrequencyHz: 7200,
			gapClearanceDeg: [{ cylinder: 1, tdcDeg: 0, clearanceDeg: 45 }]
		});
		expect(body.warnings.map((w: { code: string }) => w.code)).toContain('no-cam-phase');
	});

	it('a 180° twin and a 360° twin on one wheel: only the 180° twin has the gap in a spark window', async () => {
		const t180 = await (await get({ teeth: '36', missing: '1', toothAtTdc: '18', layout: 'twin-180' })).json();
		const t360 = await (await get({ teeth: '36', missing: '1', toothAtTdc: '18', layout: 'twin-360' })).json();
		expect(t180.gapClearanceDeg.map((c: { clearanceDeg: number }) => c.clearanceDeg)).toEqual([135, 0]);
		expect(t360.gapClearanceDeg.map((c: { clearanceDeg: number }) => c.clearanceDeg)).toEqual([135, 135]);
		expect(t180.warnings.map((w: { code: string }) => w.code)).toContain('gap-in-spark-window');
		expect(t360.warnings.map((w: { code: string }) => w.code)).not.toContain('gap-in-spark-window');
	});

	it('takes the wheel’s other patterns with the wheel’s names: every gap of 36-1-1, no gap on 24+1 (model: tests/support/phasing-model.ts)', async () => {
		const model = modelClearances({
			pattern: { kind: 'custom', teeth: 36, missingPositions: [17, 35] },
			duty: 0.5,
			mount: 'crank',
			stroke: 4,
			intervals: [180, 540],
			toothAtTdc: 9,
			windowFromBtdc: 45,
			windowToBtdc: 0
		});
		const twoGaps = await (await get({ pattern: 'custom', teeth: '36', gaps: '17,35', toothAtTdc: '9', layout: 'twin-180' })).json();
		twoGaps.gapClearanceDeg.forEach((c: { clearanceDeg: number }, k: number) =>
			expect(Math.abs(c.clearanceDeg - model.clearances[k]!)).toBeLessThanOrEqual(0.05)
		);
		const cam = await (
			await get({ pattern: 'extra', teeth: '24', extraAfter: '3', duty: '0.4', mount: 'cam', toothAtTdc: '2', layout: 'four-inline' })
		).json();
		expect(cam.gapAtCrankingMs).toBeNull();
		const bad = await get({ pattern: 'custom', teeth: '36', gaps: '17,40', toothAtTdc: '9' });
		expect(bad.status).toBe(400);
		expect((await bad.json()).errors).toEqual({ gaps: 'gaps: positions 0 to 35 (got 40)' });
		const kind = await get({ pattern: 'odd', teeth: '36', toothAtTdc: '9' });
		expect((await kind.json()).errors).toEqual({ pattern: 'pattern: one of missing, custom, single, extra' });
	});

	it('suggests a clocking when given a target and where the key sits', async () => {
		const body = await (await get({ teeth: '36', missing: '1', toothAtTdc: '9', target: '90', keyFromSensor: '30' })).json();
		expect(body.clocking).toEqual({ targetDeg: 90, keyFromSensorDeg: 30, keywayAngleDeg: 120 });
	});

	it('refuses bad input naming the fields', async () => {
		const res = await get({ teeth: '36', missing: '1', toothAtTdc: '40', intervals: '270,400', stroke: '4' });
		expect(res.status).toBe(400);
		expect((await res.json()).errors).toEqual({
			toothAtTdc: 'toothAtTdc: 0 up to 36 (tooth 0 is the first after the gap)',
			intervals: 'intervals: must add up to 720° for a 4-stroke (one firing per cylinder per cycle)'
		});
		const none = await get({});
		expect(Object.keys((await none.json()).errors).sort()).toEqual(['teeth', 'toothAtTdc']);
	});

	// Worked example by geometry: keyway at tooth 0's leading edge, key in line with the TDC mark,
	// sensor 90° before the mark: tooth 0 passed the sensor 90° before TDC, tooth 9 is under it.
	it('input=angles: works out the tooth at TDC from the sensor, keyway and key angles', async () => {
		const res = await get({ teeth: '36', missing: '1', input: 'angles', sensorAngle: '90' });
		expect(res.status).toBe(200);
		expect(await res.json()).toMatchObject({
			input: 'angles',
			toothAtTdc: 9,
			firstToothOffsetDeg: 90,
			measured: { sensorAngleDeg: 90, keywayAngleDeg: 0, keyAngleDeg: 0 }
		});
		// The tooth input answers the tooth it was given.
		expect(await (await get({ teeth: '36', missing: '1', toothAtTdc: '4.5' })).json()).toMatchObject({
			input: 'tooth',
			toothAtTdc: 4.5,
			measured: null
		});
	});

	it('input=angles on the cam, and round the wrap', async () => {
		// Cam: crank degrees halve into wheel degrees: (180 − 60) / 2 + 30 = 90° of wheel, tooth 9, 180 crank degrees BTDC.
		const cam = await (
			await get({ teeth: '36', missing: '1', mount: 'cam', input: 'angles', sensorAngle: '180', keyAngle: '60', keywayAngle: '30' })
		).json();
		expect(cam).toMatchObject({ toothAtTdc: 9, firstToothOffsetDeg: 180 });
		// Sensor 30° after the mark: tooth 0 passed it 330° ago, tooth 33.
		const wrap = await (await get({ teeth: '36', missing: '1', input: 'angles', sensorAngle: '-30' })).json();
		expect(wrap).toMatchObject({ toothAtTdc: 33, firstToothOffsetDeg: 330 });
	});

	it('input=angles suggests a clocking from the target alone', async () => {
		// Key at the mark, sensor 90° before it: the key reaches the sensor 270° later; for 60° BTDC the
		// keyway goes 60 + 270 = 330° after tooth 0 (then 90 + 330 = 420 = 60° of wheel at the sensor).
		const body = await (await get({ teeth: '36', missing: '1', input: 'angles', sensorAngle: '90', target: '60' })).json();
		expect(body.clocking).toEqual({ targetDeg: 60, keyFromSensorDeg: 270, keywayAngleDeg: 330 });
		const check = await (await get({ teeth: '36', missing: '1', input: 'angles', sensorAngle: '90', keywayAngle: '330' })).json();
		expect(check.firstToothOffsetDeg).toBe(60);
	});

	// Single-crankpin V-twin (engine layout definition, common practice): intervals 360 + V, 360 − V.
	it('layout=v-twin with any vAngle; the old v-twin-90 still works', async () => {
		const v52 = await (await get({ teeth: '36', missing: '1', toothAtTdc: '9', layout: 'v-twin', vAngle: '52' })).json();
		expect(v52).toMatchObject({ layout: 'V-twin, 52° V, one crankpin', intervals: [412, 308] });
		// The gap passes 105°–90° before each crank turn's TDC 1, so 255°–270° after TDC 1; cylinder 2
		// (TDC at 412°) keeps its 45°–0° window 367°–412°: 97° clear.
		expect(v52.gapClearanceDeg).toEqual([
			{ cylinder: 1, tdcDeg: 0, clearanceDeg: 45 },
			{ cylinder: 2, tdcDeg: 412, clearanceDeg: 97 }
		]);
		const decimal = await (await get({ teeth: '36', missing: '1', toothAtTdc: '9', layout: 'v-twin', vAngle: '52.5' })).json();
		expect(decimal.intervals).toEqual([412.5, 307.5]);
		const old = await (await get({ teeth: '36', missing: '1', toothAtTdc: '9', layout: 'v-twin-90' })).json();
		expect(old).toMatchObject({ layout: 'V-twin, 90° V, one crankpin', intervals: [450, 270] });
	});

	it('refuses the new parameters naming the field and its range', async () => {
		const errorsOf = async (params: Record<string, string>) => {
			const res = await get({ teeth: '36', missing: '1', ...params });
			expect(res.status).toBe(400);
			return (await res.json()).errors;
		};
		expect(await errorsOf({ toothAtTdc: '9', layout: 'v-twin', vAngle: '200' })).toEqual({ vAngle: 'vAngle: a number from 15 to 120°' });
		expect(await errorsOf({ toothAtTdc: '9', layout: 'v-twin', vAngle: 'wide' })).toEqual({ vAngle: 'vAngle: a number from 15 to 120°' });
		expect(await errorsOf({ toothAtTdc: '9', layout: 'v-twin' })).toEqual({
			vAngle: 'vAngle: required with the V-twin layout, a number from 15 to 120°'
		});
		expect(await errorsOf({ toothAtTdc: '9', layout: 'twin-270', vAngle: '52' })).toEqual({
			vAngle: 'vAngle: only with the V-twin layout'
		});
		expect(await errorsOf({ toothAtTdc: '9', layout: 'v-twin-52' })).toEqual({
			layout: 'layout: one of single-4, single-2, twin-180, twin-270, twin-360, v-twin, twin-2-180, four-inline'
		});
		expect(await errorsOf({ input: 'guess', toothAtTdc: '9' })).toEqual({ input: 'input: one of tooth, angles' });
		expect(await errorsOf({ input: 'angles' })).toEqual({ sensorAngle: 'sensorAngle: a number from -720 to 720° before the TDC mark' });
		expect(await errorsOf({ input: 'angles', sensorAngle: '800', keywayAngle: '400', keyAngle: 'x' })).toEqual({
			sensorAngle: 'sensorAngle: a number from -720 to 720° before the TDC mark',
			keywayAngle: 'keywayAngle: a number from -360 to 360°',
			keyAngle: 'keyAngle: a number from -720 to 720° before the TDC mark'
		});
		expect(await errorsOf({ input: 'angles', sensorAngle: '90', toothAtTdc: '9', keyFromSensor: '30', target: '90' })).toEqual({
			toothAtTdc: 'toothAtTdc: not when the sensor is given as measured angles (it is worked out from the sensor, keyway and key angles)',
			keyFromSensor: 'keyFromSensor: not when the sensor is given as measured angles (it follows from the sensor and key angles)'
		});
		expect(await errorsOf({ toothAtTdc: '9', sensorAngle: '90' })).toEqual({
			sensorAngle: 'sensorAngle: only when the sensor is given as measured angles (or give “Tooth at the sensor at TDC” alone)'
		});
	});
});

describe('the page’s check and GET /api/v1/phasing', () => {
	// The expected reasons are typed from the ranges: the spark window runs from -30 to 90° BTDC, and
	// on a 36-position wheel the teeth are 0 to 35 (tooth 0 the first after the gap).
	it('give the same first refusal for the same bad query', async () => {
		const cases = [
			{
				query: { teeth: '36', missing: '1', toothAtTdc: '9', windowFrom: '100' },
				first: { field: 'windowFrom', message: 'a number from -30 to 90° BTDC' }
			},
			{
				query: { teeth: '36', missing: '1', toothAtTdc: '40', windowFrom: '45' },
				first: { field: 'toothAtTdc', message: '0 up to 36 (tooth 0 is the first after the gap)' }
			}
		];
		for (const { query, first } of cases) {
			// What the page runs: the form's fields as it sends them, through the one check.
			const page = checkPhasing(phasingSent(query));
			expect(page.ok).toBe(false);
			expect(!page.ok && page.refusals[0]).toEqual(first);
			const res = await get(query);
			expect(res.status).toBe(400);
			const body = await res.json();
			expect(body.refusals[0]).toEqual(first);
			expect(body.errors[first.field]).toBe(`${first.field}: ${first.message}`);
		}
	});
});

describe('GET /api/v1/build-sheet.pdf', () => {
	it('puts the wheel, the phasing, the TDC record and the warnings on one page (read back by poppler)', async () => {
		const { execFileSync } = await import('node:child_process');
		const { mkdtempSync, writeFileSync } = await import('node:fs');
		const { join } = await import('node:path');
		const { tmpdir } = await import('node:os');
		const params = {
			build: 'Trail single 500',
			revision: '3',
			teeth: '36',
			missing: '1',
			od: '100',
			depth: '5',
			bore: '20',
			toothAtTdc: '9',
			rpm: '7000',
			tdcA: '-10',
			tdcB: '19',
			tapeDiameter: '76.2'
		};
		const res = await fetch(`${process.env.APP_URL}/api/v1/build-sheet.pdf?${new URLSearchParams(params)}`);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-disposition')).toBe('attachment; filename="build-sheet-trail-single-500.pdf"');
		const file = join(mkdtempSync(join(tmpdir(), 'phasewright-sheet-')), 'sheet.pdf');
		writeFileSync(file, Buffer.from(await res.arrayBuffer()));
		expect(execFileSync('pdfinfo', [file], { encoding: 'utf8' })).toMatch(/Pages:\s+1\n/);
		const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
		expect(text).toContain('Build sheet: Trail single 500');
		expect(text).toContain('Wheel revision 3');
		expect(text).toMatch(/First-tooth offset\s+90° BTDC/);
		expect(text).toMatch(/36-1, 35 teeth, pitch 10°/);
		// Seed document: marks 29° apart, TDC 14.5° from each.
		// −10 on a signed scale is 10° BTDC (negative = BTDC); the record is printed with its sides.
		expect(text).toMatch(/10° BTDC and 19° ATDC: true TDC 4\.5° ATDC of the scale's 0, spread 29°\s+\(14\.5° each side\)/);
		expect(text).toContain('crank-only wheel on a four-stroke');
	});

	it('takes the angles input and a typed V-twin (read back by poppler)', async () => {
		const { execFileSync } = await import('node:child_process');
		const { mkdtempSync, writeFileSync } = await import('node:fs');
		const { join } = await import('node:path');
		const { tmpdir } = await import('node:os');
		const params = {
			buildName: 'V 52',
			teeth: '36',
			missing: '1',
			od: '120',
			depth: '6',
			input: 'angles',
			sensorAngle: '90',
			keywayAngle: '15',
			keyAngle: '5',
			layout: 'v-twin',
			vAngle: '52',
			target: '60'
		};
		const res = await fetch(`${process.env.APP_URL}/api/v1/build-sheet.pdf?${new URLSearchParams(params)}`);
		expect(res.status).toBe(200);
		// buildName is the name (build, its earlier spelling, is read too: see the test above).
		expect(res.headers.get('content-disposition')).toBe('attachment; filename="build-sheet-v-52.pdf"');
		const file = join(mkdtempSync(join(tmpdir(), 'phasewright-sheet-')), 'sheet.pdf');
		writeFileSync(file, Buffer.from(await res.arrayBuffer()));
		const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
		expect(text).toContain('Build sheet: V 52');
		// By geometry: (90 − 5) + 15 = 100° of wheel at the sensor, tooth 10, 100° BTDC.
		expect(text).toMatch(/Tooth at the sensor at TDC\s+10 \(tooth 0 = first after the gap, worked out from the angles\)/);
		expect(text).toMatch(/First-tooth offset\s+100° BTDC/);
		expect(text).toMatch(/sensor 90° before the TDC mark, key 5° before it/);
		// The wheel's keyway angle is the same parameter: the sheet's wheel and its phasing agree.
		expect(text).toMatch(/V-twin, 52° V, one crankpin; firing intervals 412 \/ 308°/);
		// For 60° BTDC: the key reaches the sensor (5 − 90) mod 360 = 275° later, so the keyway at 60 + 275 = 335°.
		expect(text).toMatch(/keyway angle 335° of wheel gives 60° BTDC/);
	});

	/** The sheet's text as poppler reads it, runs of white space made one (the value column wraps). */
	async function sheetText(params: Record<string, string>): Promise<string> {
		const { execFileSync } = await import('node:child_process');
		const { mkdtempSync, writeFileSync } = await import('node:fs');
		const { join } = await import('node:path');
		const { tmpdir } = await import('node:os');
		const res = await fetch(`${process.env.APP_URL}/api/v1/build-sheet.pdf?${new URLSearchParams(params)}`);
		expect(res.status).toBe(200);
		const file = join(mkdtempSync(join(tmpdir(), 'phasewright-sheet-')), 'sheet.pdf');
		writeFileSync(file, Buffer.from(await res.arrayBuffer()));
		return execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
	}

	it('a two-gap wheel: the sheet clears every gap, and names the one inside the spark window (model: tests/support/phasing-model.ts)', async () => {
		// 36-1-1, gaps at positions 17 and 35, tooth 19 at the sensor at TDC, single four-stroke,
		// window 45° to 0° BTDC. The model walks the wheel: the gap at 17 passes inside the window.
		const model = modelClearances({
			pattern: { kind: 'custom', teeth: 36, missingPositions: [17, 35] },
			duty: 0.5,
			mount: 'crank',
			stroke: 4,
			intervals: [720],
			toothAtTdc: 19,
			windowFromBtdc: 45,
			windowToBtdc: 0
		});
		expect(model.clearances).toEqual([0]);
		const text = await sheetText({
			buildName: 'Two gaps',
			pattern: 'custom',
			teeth: '36',
			gaps: '17,35',
			od: '100',
			depth: '5',
			bore: '20',
			toothAtTdc: '19',
			layout: 'single-4'
		});
		expect(text).toContain('Gaps in the pattern 2: missing position 17, position 35');
		expect(text).toContain(`cyl 1 (TDC at 0°): ${model.clearances[0]}° (inside) from the 45°–0° BTDC spark window, nearest of the 2 gaps`);
		expect(text).toContain('inside cylinder 1');
		// At 200 rpm cranking one crank degree takes 60000 / (200 · 360) ms; each gap's open space is 1.5 pitches = 15°.
		expect(text).toContain(`Gap at cranking ${(15 * 60000) / (200 * 360)} ms at 200 rpm (the shortest gap)`);
	});

	it('the same wheel clocked clear of the window shows the model’s clearance', async () => {
		const model = modelClearances({
			pattern: { kind: 'custom', teeth: 36, missingPositions: [17, 35] },
			duty: 0.5,
			mount: 'crank',
			stroke: 4,
			intervals: [720],
			toothAtTdc: 9,
			windowFromBtdc: 45,
			windowToBtdc: 0
		});
		const text = await sheetText({
			pattern: 'custom',
			teeth: '36',
			gaps: '17,35',
			od: '100',
			depth: '5',
			bore: '20',
			toothAtTdc: '9',
			layout: 'single-4'
		});
		expect(model.clearances[0]).toBeGreaterThan(0);
		expect(text).toContain(`cyl 1 (TDC at 0°): ${Math.round(model.clearances[0]!)}° from the`);
	});

	it('an N+1 cam wheel has no gap: the sheet says so instead of a cranking time', async () => {
		expect(
			modelClearances({
				pattern: { kind: 'extra', teeth: 24, extraAfter: 3 },
				duty: 0.4,
				mount: 'cam',
				stroke: 4,
				intervals: [180, 180, 180, 180],
				toothAtTdc: 2,
				windowFromBtdc: 45,
				windowToBtdc: 0
			}).gapRuns
		).toBe(0);
		const text = await sheetText({
			pattern: 'extra',
			teeth: '24',
			extraAfter: '3',
			duty: '0.4',
			mount: 'cam',
			od: '100',
			depth: '5',
			bore: '20',
			toothAtTdc: '2',
			layout: 'four-inline'
		});
		expect(text).toContain('Gaps in the pattern none');
		expect(text).toContain('Gap at cranking no gap on this wheel (it keeps its cam sync by the extra tooth)');
		expect(text).toContain('Gap clearance no gap on this wheel');
		expect(text).not.toMatch(/Gap at cranking [\d.]+ ms/);
	});

	it('refuses bad parameters of either part, naming them all at once', async () => {
		const res = await fetch(
			`${process.env.APP_URL}/api/v1/build-sheet.pdf?${new URLSearchParams({ teeth: '36', od: '100', depth: '5', tdcA: '5', tdcB: '5' })}`
		);
		expect(res.status).toBe(400);
		expect((await res.json()).errors).toEqual({
			toothAtTdc: 'toothAtTdc: a number from 0 to 720',
			tdcB: 'tdcB: must differ from the first piston-stop mark; a piston stop leaves one mark each side of TDC'
		});
		const more = await fetch(
			`${process.env.APP_URL}/api/v1/build-sheet.pdf?${new URLSearchParams({ buildName: 'x'.repeat(81), teeth: '36', depth: '5', input: 'angles', sensorAngle: '90', layout: 'v-twin', tapeDiameter: '2' })}`
		);
		expect(more.status).toBe(400);
		expect((await more.json()).errors).toEqual({
			buildName: 'buildName: at most 80 characters',
			od: 'od: required, 10 mm to 2000 mm',
			vAngle: 'vAngle: required with the V-twin layout, a number from 15 to 120°',
			tapeDiameter: 'tapeDiameter: the timing hub diameter, 10 mm to 2000 mm'
		});
	});
});
