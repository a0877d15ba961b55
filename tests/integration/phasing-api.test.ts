import { describe, expect, it } from 'vitest';

const get = (params: Record<string, string>) => fetch(`${process.env.APP_URL}/api/v1/phasing?${new URLSearchParams(params)}`);

describe('GET /api/v1/phasing', () => {
	// Worked example by geometry (common practice): 36-1, tooth 9 at TDC -> 90° BTDC; f = N·rpm/60.
	it('the query of the issue: 36-1, tooth 9 at TDC, 12000 rpm single', async () => {
		const res = await get({ teeth: '36', missing: '1', toothAtTdc: '9', rpm: '12000', cylinders: '1', stroke: '4' });
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body).toMatchObject({ pitchDeg: 10, firstToothOffsetDeg: 90, pitchFrequencyHz: 7200, gapClearanceDeg: [{ cylinder: 1, tdcDeg: 0, clearanceDeg: 45 }] });
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
});

describe('GET /api/v1/build-sheet.pdf', () => {
	it('puts the wheel, the phasing, the TDC record and the warnings on one page (read back by poppler)', async () => {
		const { execFileSync } = await import('node:child_process');
		const { mkdtempSync, writeFileSync } = await import('node:fs');
		const { join } = await import('node:path');
		const { tmpdir } = await import('node:os');
		const params = { build: 'Trail single 500', revision: '3', teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', toothAtTdc: '9', rpm: '7000', tdcA: '-10', tdcB: '19', tapeDiameter: '76.2' };
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
		expect(text).toMatch(/-10° and 19°: true TDC at 4\.5°, spread 29° \(14\.5° each side\)/);
		expect(text).toContain('crank-only wheel on a four-stroke');
	});

	it('refuses bad parameters of either part, naming them', async () => {
		const res = await fetch(`${process.env.APP_URL}/api/v1/build-sheet.pdf?${new URLSearchParams({ teeth: '36', od: '100', depth: '5', tdcA: '5', tdcB: '5' })}`);
		expect(res.status).toBe(400);
		expect((await res.json()).errors).toEqual({ toothAtTdc: 'toothAtTdc: a number from 0 to 720' });
	});
});
