import { describe, expect, it } from 'vitest';
import { checkPhotoTaps, diameterText, photoParams } from './photo';

// Expected values are worked out here by hand: 1 in = 25.4 mm exactly (international inch, 1959),
// so 3 1/2 in = 88.9 mm and 4 in = 101.6 mm; the ranges are the definitions' own (od 10 to 2000 mm).
const taps = { centre: { x: 400, y: 300 }, tips: [{ x: 600, y: 300 }] };
const photo = { width: 800, height: 600 };

const refusals = (input: Record<string, unknown>, size?: { width: number; height: number }) => {
	const checked = checkPhotoTaps(input, size);
	return checked.ok ? [] : checked.refusals;
};

describe('the photo reading’s check', () => {
	it('reads od in the units given, fractions of an inch too, and the older odMm in mm', () => {
		const inch = checkPhotoTaps({ ...taps, od: '3 1/2', units: 'in' }, photo);
		expect(inch.ok && inch.value.units).toBe('in');
		expect(inch.ok && inch.value.odMm).toBeCloseTo(88.9, 9);
		const mm = checkPhotoTaps({ ...taps, od: 100 }, photo);
		expect(mm.ok && mm.value).toEqual({ ...taps, units: 'mm', odMm: 100 });
		const older = checkPhotoTaps({ ...taps, odMm: 100 }, photo);
		expect(older.ok && older.value).toEqual({ ...taps, units: 'mm', odMm: 100 });
		const none = checkPhotoTaps({ ...taps, od: '' }, photo);
		expect(none.ok && none.value).toEqual({ ...taps, units: 'mm' });
	});

	it('reads a diameter with its own unit in either units, and takes that unit as the one chosen', () => {
		// 4 in = 101.6 mm typed on a mm reading: the designer opens in inches.
		const inch = checkPhotoTaps({ ...taps, od: '4 in', units: 'mm' }, photo);
		expect(inch.ok && inch.value.units).toBe('in');
		expect(inch.ok && inch.value.odMm).toBeCloseTo(101.6, 9);
		const quoted = checkPhotoTaps({ ...taps, od: '3 1/2"' }, photo);
		expect(quoted.ok && quoted.value.odMm).toBeCloseTo(88.9, 9);
		const metric = checkPhotoTaps({ ...taps, od: '100mm', units: 'in' }, photo);
		expect(metric.ok && metric.value).toMatchObject({ units: 'mm', odMm: 100 });
		expect(refusals({ ...taps, od: 'mm 100' })).toEqual([{ field: 'od', message: 'units go after the number; 10 mm to 2000 mm' }]);
	});

	it('refuses a diameter out of range in the caller’s units, with the field apart from the message', () => {
		expect(refusals({ ...taps, od: '5' })).toEqual([{ field: 'od', message: '10 mm to 2000 mm' }]);
		// 1/4 in = 6.35 mm, under 10 mm; 10 mm = 0.394 in, 2000 mm = 78.74 in.
		expect(refusals({ ...taps, od: '1/4', units: 'in' })).toEqual([{ field: 'od', message: '0.394 in to 78.74 in' }]);
		expect(refusals({ ...taps, odMm: 5 })).toEqual([{ field: 'odMm', message: 'a number from 10 to 2000 mm' }]);
		expect(refusals({ ...taps, od: { mm: 100 } }).map((r) => r.field)).toEqual(['od']);
		expect(refusals({ ...taps, odMm: null }).map((r) => r.field)).toEqual(['odMm']);
		expect(refusals({ ...taps, units: 'cm', od: '100' })).toEqual([{ field: 'units', message: 'one of mm, in' }]);
	});

	it('keeps only x and y of each point, so nothing else sent is stored with the reading', () => {
		const checked = checkPhotoTaps({ centre: { x: 1, y: 2, note: 'x'.repeat(1000) }, tips: [{ x: 30, y: 40, z: 5 }] });
		expect(checked.ok && checked.value).toEqual({ centre: { x: 1, y: 2 }, tips: [{ x: 30, y: 40 }], units: 'mm' });
	});

	it('takes the diameter once', () => {
		expect(refusals({ ...taps, od: '100', odMm: 100 }).map((r) => r.field)).toEqual(['odMm']);
	});

	it('refuses taps missing, of the wrong shape, or off the photo, one reason per field in the order found', () => {
		expect(refusals({})).toEqual([
			{ field: 'centre', message: 'required, a point {x, y} in image pixels' },
			{ field: 'tips', message: 'required, 1 to 24 tooth-tip points {x, y} in image pixels' }
		]);
		expect(refusals({ centre: { x: '1', y: 2 }, tips: [] }).map((r) => r.field)).toEqual(['centre', 'tips']);
		expect(refusals({ centre: taps.centre, tips: Array.from({ length: 25 }, () => taps.tips[0]) }).map((r) => r.field)).toEqual(['tips']);
		// (801, 300) is one pixel right of an 800 px wide photo; (400, -1) one above it.
		expect(refusals({ centre: { x: 400, y: -1 }, tips: [{ x: 801, y: 300 }] }, photo)).toEqual([
			{ field: 'centre', message: 'inside the photo, 0 to 800 across and 0 to 600 down' },
			{ field: 'tips', message: 'inside the photo, 0 to 800 across and 0 to 600 down' }
		]);
		// The photo's own corners are on it.
		expect(refusals({ centre: { x: 0, y: 0 }, tips: [{ x: 800, y: 600 }] }, photo)).toEqual([]);
	});

	it('has one label for od, the one every tool uses', () => {
		expect(photoParams.label('od')).toBe('Outside diameter');
	});

	it('writes a diameter back in the units it was typed in', () => {
		expect(diameterText(88.9, 'in')).toBe('3.5');
		expect(diameterText(101.6, 'in')).toBe('4');
		expect(diameterText(63.504, 'mm')).toBe('63.5');
	});
});
