import { describe, expect, it } from 'vitest';

const get = (path: string, params: Record<string, string>) => fetch(`${process.env.APP_URL}/api/v1/${path}?${new URLSearchParams(params)}`);

describe('GET /api/v1/signal', () => {
	it('answers the default cases, each with its sync margin, the sweep and the sensor', async () => {
		const res = await get('signal', { teeth: '36', missing: '1', toothAtTdc: '9', layout: 'single-4' });
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.casesGiven).toBe('defaults');
		expect(body.cases.map((c: { case: { id: string } }) => c.case.id)).toEqual(['cranking', 'idle', 'free-rev', 'rev-limit']);
		for (const c of body.cases) {
			expect(typeof c.syncMargin).toBe('number');
			expect(c.spaces.length).toBeGreaterThan(60);
		}
		// The current clocking's margin is the worst case's; the best is never worse.
		expect(body.current.syncMargin).toBe(Math.min(...body.cases.map((c: { syncMargin: number }) => c.syncMargin)));
		expect(body.best.syncMargin).toBeGreaterThanOrEqual(body.current.syncMargin);
		expect(body.sweep.length).toBeGreaterThanOrEqual(180);
		// f = N·rpm/60 at the rev limit's 8000 rpm (common practice): 4800 Hz.
		expect(body.sensor).toMatchObject({ kind: 'hall', topRpm: 8000, hz: 4800, maxHz: 15000 });
	});

	it('with rpm and swing: that one case; steady, the margin is the gap’s geometry against the rule (2/1.5 − 1 and 1 − 1/1.5)', async () => {
		const body = await (await get('signal', { teeth: '36', missing: '1', toothAtTdc: '9', rpm: '1000', swing: '0', ratio: '1.5' })).json();
		expect(body.casesGiven).toBe('one');
		expect(body.cases).toHaveLength(1);
		expect(body.cases[0].case).toMatchObject({ rpm: 1000, swingPct: 0, accelRpmPerS: 0 });
		expect(body.cases[0].syncMargin).toBeCloseTo(1 / 3, 4);
		expect(body.cases[0].gapRatioMin).toBeCloseTo(2, 4);
	});

	it('refuses bad input naming the field, never a 500', async () => {
		const cases: [Record<string, string>, string][] = [
			[{ teeth: '36', missing: '1', toothAtTdc: '9', pattern: 'extra' }, 'pattern'],
			[{ teeth: '36', missing: '1', toothAtTdc: '9', swing: '95' }, 'swing'],
			[{ teeth: '36', missing: '1', toothAtTdc: '9', rpm: '200', accel: '-5000' }, 'accel'],
			[{ teeth: '36', missing: '1', toothAtTdc: '9', ratio: 'x' }, 'ratio'],
			[{ teeth: '36', missing: '1', toothAtTdc: '9', cycles: '1e9' }, 'cycles'],
			[{ teeth: 'abc', missing: '1', toothAtTdc: '9' }, 'teeth']
		];
		for (const [params, field] of cases) {
			const res = await get('signal', params);
			expect(res.status, field).toBe(400);
			const body = await res.json();
			expect(Object.keys(body.errors), field).toEqual([field]);
			expect(body.refusals[0].field).toBe(field);
		}
	});
});

describe('GET /api/v1/signal/edges.csv', () => {
	it('every leading and trailing edge of one cycle, wheel and crank degrees, times at the speed given', async () => {
		const res = await get('signal/edges.csv', { teeth: '36', missing: '1', toothAtTdc: '9', rpm: '1000', swing: '0' });
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toContain('text/csv');
		expect(res.headers.get('content-disposition')).toContain('attachment; filename="tooth-edges-36-1-crank-t9.csv"');
		const [header, ...rows] = (await res.text()).trim().split('\r\n');
		expect(header).toBe('edge,tooth,kind,wheel_deg,crank_deg,time_ms');
		// 35 teeth, two edges each, two crank turns in a four-stroke cycle.
		expect(rows).toHaveLength(140);
		let turn = 0;
		let last = -1;
		for (const [i, row] of rows.entries()) {
			const [edge, tooth, kind, wheelDeg, crankDeg, ms] = row.split(',');
			expect(Number(edge)).toBe(i);
			// Geometry (design.md): tooth k's leading edge at 10k°, its trailing edge 5° later (tooth width 0.5).
			expect(Number(wheelDeg)).toBeCloseTo(10 * Number(tooth) + (kind === 'trailing' ? 5 : 0), 4);
			// Tooth 9 at the sensor at TDC: the edge at wheel angle w reaches it (w − 90)° after TDC, each turn.
			if (Number(crankDeg) < last) throw new Error(`crank angles out of order at row ${i}`);
			if (i > 0 && (Number(wheelDeg) - 90 + 360) % 360 < (Number(rows[i - 1]!.split(',')[3]) - 90 + 360) % 360) turn++;
			expect(Number(crankDeg)).toBeCloseTo(((Number(wheelDeg) - 90 + 360) % 360) + 360 * turn, 4);
			last = Number(crankDeg);
			// 1000 rpm is 6°/ms, steady.
			expect(Number(ms)).toBeCloseTo(Number(crankDeg) / 6, 3);
		}
		expect(rows[0]).toBe('0,9,leading,90.0000,0.0000,0.0000');
	});

	it('refuses what the check refuses', async () => {
		const res = await get('signal/edges.csv', { teeth: '36', toothAtTdc: '99' });
		expect(res.status).toBe(400);
		expect(Object.keys((await res.json()).errors)).toEqual(['toothAtTdc']);
	});
});
