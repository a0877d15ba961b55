// GET /api/v1/tdc with readings as a degree wheel or tape shows them, against the real server.
import { describe, expect, it } from 'vitest';

const app = process.env.APP_URL!;
interface Answer {
	scale: string;
	tdcDeg: number;
	spreadDeg: number;
	a: { atdcDeg: number; written: string };
	tdc: { atdcDeg: number; side: string };
	finding: string;
	remark: string;
	pointer: string;
	rimDistance?: number;
	errors: Record<string, string>;
}
const get = async (params: Record<string, string>) => {
	const res = await fetch(`${app}/api/v1/tdc?${new URLSearchParams(params)}`);
	return { status: res.status, body: (await res.json()) as Answer };
};

// Independent oracle: each mark as a unit vector at its angle ATDC; TDC is the direction of their
// sum (the bisector of the shorter arc), read back with atan2.
const bisector = (a: number, b: number) => {
	const r = (d: number) => (d * Math.PI) / 180;
	return (Math.atan2(Math.sin(r(a)) + Math.sin(r(b)), Math.cos(r(a)) + Math.cos(r(b))) * 180) / Math.PI;
};

/**
 * A tape on the rim, pointer fixed: the tape moves toward its own right for a clockwise crank
 * (seen from the wheel side), left for anticlockwise (the 3D rim model of src/lib/trade/hub.test.ts).
 * With the crank c degrees past the moment the scale's 0 stood at the pointer, the tape has moved
 * c·(π·D/360) mm that way, so the graduation under the pointer sits that far the other way from 0.
 */
const underPointerMm = (c: number, rotation: 'cw' | 'ccw', diameterMm: number) =>
	-c * ((Math.PI * diameterMm) / 360) * (rotation === 'cw' ? 1 : -1);

describe('GET /api/v1/tdc with readings and their sides', () => {
	// Seed document (fact of the trade): two marks 29° apart put TDC 14.5° from each.
	it('10 BTDC and 19 ATDC: 4.5° ATDC, 14.5° from each, in words', async () => {
		const { status, body } = await get({ a: '10 BTDC', b: '19 ATDC' });
		expect(status).toBe(200);
		expect(body).toMatchObject({
			scale: 'signed',
			tdcDeg: 4.5,
			spreadDeg: 29,
			halfSpreadDeg: 14.5,
			tdc: { side: '4.5° ATDC' },
			finding: "True TDC is 4.5° ATDC of the scale's 0."
		});
		expect(body.tdc.atdcDeg).toBeCloseTo(bisector(-10, 19), 6);
		expect(body.a).toMatchObject({ atdcDeg: -10, written: '10 BTDC' });
	});

	it('the same marks typed every way people type them, on each scale', async () => {
		for (const params of <Record<string, string>[]>[
			{ a: '-10', b: '19' },
			{ a: '\u221210', b: '19' },
			{ a: '10B', b: '19 A' },
			{ a: '10 btdc', b: '19 atdc' },
			{ a: '350', b: '19', scale: 'full' },
			{ a: '350', b: '19' }, // a plain number past 180 can only be a 0–360 wheel
			{ a: '10 BTDC', b: '19 ATDC', scale: 'quadrant' }
		]) {
			const { status, body } = await get(params);
			expect(status, JSON.stringify(params)).toBe(200);
			expect(body.tdc.atdcDeg, JSON.stringify(params)).toBeCloseTo(4.5, 9);
			expect(body.spreadDeg).toBe(29);
		}
	});

	it('keeps today’s parameters with their meaning: 350 and 20 on a 0–360 wheel read TDC at 5', async () => {
		const { body } = await get({ a: '350', b: '20' });
		expect(body).toMatchObject({ scale: 'full', tdcDeg: 5, spreadDeg: 30 });
		expect(body.tdc.atdcDeg).toBeCloseTo(bisector(-10, 20), 9);
	});

	it('quadrant wheel near BDC: 20 BBDC and 12 ABDC, TDC 4° BBDC (176° ATDC)', async () => {
		// By hand: 20 BBDC = 160 ATDC, 12 ABDC = 192 ATDC; half-way 176 ATDC = 4 BBDC, spread 32.
		const { body } = await get({ a: '20 BBDC', b: '12 ABDC', scale: 'quadrant' });
		expect(body).toMatchObject({ spreadDeg: 32, tdc: { side: '4° BBDC' } });
		expect(body.tdc.atdcDeg).toBeCloseTo(bisector(160, 192), 6);
	});

	it('says which way and how far to re-mark on this hub, against a model of the tape passing the pointer', async () => {
		for (const rotation of ['cw', 'ccw'] as const) {
			for (const [a, b] of [
				['10 BTDC', '19 ATDC'],
				['19 BTDC', '10 ATDC']
			] as const) {
				const { body } = await get({ a, b, rotation, diameter: '76.2' });
				const tdc = bisector(a.startsWith('10') ? -10 : -19, b.startsWith('19') ? 19 : 10);
				// At true TDC the pointer stands over the graduation the new 0 goes on.
				const at = underPointerMm(tdc, rotation, 76.2);
				const side = at > 0 ? 'right' : 'left';
				expect(body.rimDistance).toBeCloseTo(Math.abs(at), 6);
				expect(body.remark).toContain(`${Math.abs(at).toFixed(2)} mm along the rim`);
				expect(body.remark).toContain(`to the ${side} of it on a tape read upright from the wheel side`);
			}
		}
		// 4.5° on a 76.2 mm hub: 76.2·π·4.5/360 = 2.992 mm (by hand).
		expect((await get({ a: '10 BTDC', b: '19 ATDC', rotation: 'cw', diameter: '76.2' })).body.remark).toMatch(
			/2\.99 mm along the rim.*to the left of it/
		);
	});

	it('refuses a 0–90–0 wheel’s readings typed as plain numbers (they used to give 14.5°, spread 9°)', async () => {
		const { status, body } = await get({ a: '10', b: '19' });
		expect(status).toBe(400);
		expect(body.errors.b).toMatch(/^b: both readings lie ATDC of 0.*10 BTDC and 19 ATDC/);
		const quadrant = await get({ a: '10', b: '19', scale: 'quadrant' });
		expect(quadrant.status).toBe(400);
		expect(quadrant.body.errors).toEqual({
			a: 'a: on a 0–90–0 wheel, a number from 0 to 90 and its quadrant, like 10 BTDC, 19 ATDC, 30 BBDC or 30 ABDC',
			b: 'b: on a 0–90–0 wheel, a number from 0 to 90 and its quadrant, like 10 BTDC, 19 ATDC, 30 BBDC or 30 ABDC'
		});
	});

	it('refuses by field what reads two ways or cannot be on the scale, never a 500', async () => {
		const cases: [Record<string, string>, string, RegExp][] = [
			[{ a: '10B', b: '19 ATDC', scale: 'quadrant' }, 'a', /^a: on a 0–90–0 wheel “B” reads two ways/],
			[{ a: '-10', b: '19', scale: 'full' }, 'a', /^a: a reading from 0 to 360/],
			[{ a: '-10 BTDC', b: '19' }, 'a', /^a: a side or a sign, not both/],
			[{ a: '10 BTDC', b: '19 ATDC', scale: 'hex' }, 'scale', /^scale: one of signed, full, quadrant/],
			[{ a: '10 BTDC', b: '19 ATDC', rotation: 'up' }, 'rotation', /^rotation: one of cw, ccw/],
			[{ a: '10 BTDC', b: '19 ATDC', diameter: '2' }, 'diameter', /^diameter: /],
			[{ a: '10 BTDC', b: '10 BTDC' }, 'b', /must differ from the first mark/],
			[{ a: '1e400', b: '19' }, 'a', /^a: /]
		];
		for (const [params, field, message] of cases) {
			const { status, body } = await get(params);
			expect(status, JSON.stringify(params)).toBe(400);
			expect(body.errors[field], JSON.stringify(params)).toMatch(message);
		}
	});
});
