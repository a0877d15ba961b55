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
