// The TDC finder's one check. Expected values by hand (half-way between the piston-stop marks,
// common practice) and refusal texts typed from how each scale is written.
import { describe, expect, it } from 'vitest';
import { checkTdc, findTdc } from './tdc';

describe('checkTdc', () => {
	it('10 BTDC and 19 ATDC: 29° apart, TDC 14.5° from each, 4.5° ATDC', () => {
		const r = checkTdc({ a: '10 BTDC', b: '19 ATDC' });
		expect(r.ok && r.value.kind === 'marks' && r.value.result).toMatchObject({ tdcDeg: 4.5, spreadDeg: 29, halfSpreadDeg: 14.5 });
	});
	it('a rim distance needs the rim’s diameter', () => {
		expect(checkTdc({ distance: '30' })).toEqual({ ok: false, refusals: [{ field: 'diameter', message: 'required, 10 mm to 2000 mm' }] });
	});
	it('refuses each reading by field, without the field’s name', () => {
		expect(checkTdc({ a: '10', b: '19', scale: 'quadrant' })).toEqual({
			ok: false,
			refusals: ['a', 'b'].map((field) => ({
				field,
				message: 'on a 0–90–0 wheel, a number from 0 to 90 and its quadrant, like 10 BTDC, 19 ATDC, 30 BBDC or 30 ABDC'
			}))
		});
	});
	it('keeps findTdc’s older answer for its callers: a map of `field: message`', () => {
		expect(findTdc({ a: '12', b: '12' })).toEqual({
			ok: false,
			errors: { b: 'b: must differ from the first mark; a piston stop leaves one mark each side of TDC' }
		});
		expect(findTdc({ distance: '30', diameter: '100' })).toMatchObject({ ok: 'rim', value: { distanceMm: 30, diameterMm: 100 } });
	});
});
