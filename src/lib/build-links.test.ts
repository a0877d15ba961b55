import { describe, expect, it } from 'vitest';
import { formFromAddress } from '../routes/phasing/form-query';
import { hubOfTape, phasingFromBuild, phasingHref, tapeHref, wheelHref } from './build-links';

// The reported bug: "Set up the engine profile" on a build whose wheel is 24-2 opened the phasing
// check at 36-1. The expected values are the wheel's as typed here.

const profile = { layout: 'twin-parallel-360', teeth: '36', missing: '1', duty: '0.4', toothAtTdc: '9', rpm: '9000' };
const wheel = { units: 'in', teeth: '24', missing: '2', od: '4', keywayAngle: '90', rpm: '12000' };

describe('the phasing check opened from a build', () => {
	it('takes the wheel’s pattern, duty, keyway angle, OD and units over the profile’s copy', () => {
		const merged = phasingFromBuild(profile, wheel);
		expect(merged).toMatchObject({ teeth: '24', missing: '2', units: 'in', od: '4', keywayAngle: '90' });
		// The wheel leaves duty out: its default, not the profile's older 0.4.
		expect(merged.duty).toBeUndefined();
		// The engine's own facts stay the profile's (the rev limit is the engine's, not the wheel's balance speed).
		expect(merged).toMatchObject({ layout: 'twin-parallel-360', toothAtTdc: '9', rpm: '9000' });
	});

	it('opens the page at 24-2 for a build whose wheel is 24-2, with or without a saved profile', () => {
		for (const saved of [profile, null]) {
			const href = phasingHref('b1', saved, { designId: 'd1', params: wheel });
			const query = new URL(href, 'http://x').searchParams;
			const form = formFromAddress(query);
			expect([form.teeth, form.missing, form.units, form.od]).toEqual(['24', '2', 'in', '4']);
			expect([query.get('build'), query.get('design')]).toEqual(['b1', 'd1']);
		}
	});

	it('drops a pattern name the wheel does not give, so no older gap list lingers', () => {
		expect(phasingFromBuild({ pattern: 'custom', gaps: '17, 35', teeth: '36' }, { teeth: '36', missing: '1' })).toEqual({
			teeth: '36',
			missing: '1'
		});
	});

	it('keeps the profile whole when the build has no wheel yet', () => {
		expect(phasingFromBuild(profile, null)).toEqual(profile);
		expect(phasingHref('b1', null, null)).toBe('/phasing?build=b1');
	});
});

describe('the other tools opened from a build', () => {
	it('opens the designer at the design (its newest revision), or a new one from the profile’s pattern', () => {
		expect(wheelHref('b1', profile, { designId: 'd1', params: wheel })).toBe('/wheel?design=d1');
		expect(wheelHref('b1', profile, null)).toBe('/wheel?build=b1&teeth=36&missing=1&duty=0.4');
		expect(wheelHref('b1', null, null)).toBe('/wheel?build=b1');
	});

	it('takes the hub of a tape as measured: the diameter, else the circumference, with its units', () => {
		expect(hubOfTape({ units: 'in', diameter: '5 1/2', window: '40' })).toEqual({ units: 'in', diameter: '5 1/2' });
		expect(hubOfTape({ circumference: '471' })).toEqual({ units: 'mm', circumference: '471' });
		expect(hubOfTape(null)).toEqual({});
	});

	it('heads the tape’s timing-light card with the build’s name (the card reads `name` from the address)', () => {
		const href = new URL(tapeHref('b1', { units: 'mm', diameter: '127' }, 'Bonneville T120 & co'), 'http://x');
		expect(Object.fromEntries(href.searchParams)).toEqual({ build: 'b1', units: 'mm', diameter: '127', name: 'Bonneville T120 & co' });
		expect(tapeHref('b1', null)).toBe('/tape?build=b1');
	});
});
