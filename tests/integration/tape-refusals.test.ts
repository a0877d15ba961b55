// The tape page and GET /api/v1/tape check a query with the same function (checkTape), so for the
// same bad query they give the same first reason; the expected texts are typed here from the
// ranges the tape publishes (the tape's parameters as the README published them), not taken from the code under test.
import { describe, expect, it } from 'vitest';
import { checkTape } from '../../src/lib/schemas/tape';
import { checkTdc } from '../../src/lib/schemas/tdc';

const app = process.env.APP_URL!;

interface Answer {
	errors: Record<string, string>;
	refusals: { field: string; message: string }[];
}
async function refused(path: string, query: Record<string, string>): Promise<Answer> {
	const res = await fetch(`${app}${path}?${new URLSearchParams(query)}`);
	expect(res.status, JSON.stringify(query)).toBe(400);
	return (await res.json()) as Answer;
}
const firstOf = (checked: ReturnType<typeof checkTape> | ReturnType<typeof checkTdc>) => (checked.ok ? null : checked.refusals[0]);

describe('the tape page and the API give the same first reason', () => {
	const cases: [Record<string, string>, { field: string; message: string }][] = [
		[{ diameter: '5' }, { field: 'diameter', message: '10 mm to 2000 mm' }],
		[
			{ units: 'in', diameter: '100' },
			{ field: 'diameter', message: '0.394 in to 78.74 in' }
		],
		[
			{ diameter: '150', tick: '0.1', mid: '0.2' },
			{ field: 'tick', message: 'a number from 0.25 to 10°' }
		],
		[
			{ diameter: '150', window: '200' },
			{ field: 'window', message: 'full, or a number from 5 to 180° each side of TDC' }
		],
		[
			{ diameter: '150', tick: '2', mid: '5' },
			{ field: 'mid', message: 'a multiple of the tick spacing (2°)' }
		],
		[
			{ diameter: '150', tdc2: 'cyl 2:400' },
			{
				field: 'tdc2',
				message: 'numbers from 1 to 359 separated by commas, optionally named, like cyl 2:270 (degrees after TDC of cylinder 1)'
			}
		],
		[
			{ diameter: '150', rotation: 'left' },
			{ field: 'rotation', message: 'one of cw, ccw' }
		],
		[
			{ units: 'furlong', diameter: '150' },
			{ field: 'units', message: 'one of mm, in' }
		]
	];
	for (const [query, want] of cases) {
		it(`${new URLSearchParams(query)}: ${want.field}: ${want.message}`, async () => {
			const page = firstOf(checkTape(query));
			const api = await refused('/api/v1/tape', query);
			expect(page).toEqual(want);
			expect(api.refusals[0]).toEqual(want);
			// The errors map keeps its old shape: the message starts with the field's name.
			expect(api.errors[want.field]).toBe(`${want.field}: ${want.message}`);
		});
	}

	it('the TDC finder too: a 0–90–0 wheel read as plain numbers', async () => {
		const query = { a: '10', b: '19', scale: 'quadrant' };
		const want = {
			field: 'a',
			message: 'on a 0–90–0 wheel, a number from 0 to 90 and its quadrant, like 10 BTDC, 19 ATDC, 30 BBDC or 30 ABDC'
		};
		expect(firstOf(checkTdc(query))).toEqual(want);
		expect((await refused('/api/v1/tdc', query)).refusals[0]).toEqual(want);
	});
});
