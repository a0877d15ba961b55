import { describe, expect, it } from 'vitest';
import { parseReading, readingParam, spreadFromRim, tdcAdvice, tdcFromReadings, type Arc, type Scale } from './tdc';

// Independent oracle: a reading is a point on a circle. Put each mark on the unit circle, average the
// two vectors (the bisector of the shorter arc), read its angle back with atan2. The spread is the
// angle between the vectors, from their dot product. Written from geometry, not from tdc.ts.
function bisector(aAtdc: number, bAtdc: number) {
	const r = (d: number) => (d * Math.PI) / 180;
	const x = Math.cos(r(aAtdc)) + Math.cos(r(bAtdc));
	const y = Math.sin(r(aAtdc)) + Math.sin(r(bAtdc));
	const spread = (Math.acos(Math.cos(r(aAtdc)) * Math.cos(r(bAtdc)) + Math.sin(r(aAtdc)) * Math.sin(r(bAtdc))) * 180) / Math.PI;
	return { tdc: (Math.atan2(y, x) * 180) / Math.PI, spread };
}

function found(a: string, b: string, scale: Scale, arc: Arc = 'shorter') {
	const ra = parseReading('a', a, scale);
	const rb = parseReading('b', b, scale);
	if (!ra.ok || !rb.ok) throw new Error(`refused: ${!ra.ok ? ra.message : ''} ${!rb.ok ? rb.message : ''}`);
	const answer = tdcFromReadings(ra.reading, rb.reading, arc);
	if (!answer.ok) throw new Error(answer.message);
	return answer.result;
}

const closeAngle = (actual: number, expected: number) => expect(Math.abs(((actual - expected + 540) % 360) - 180)).toBeLessThan(1e-6);

describe('readings as written on a degree wheel or tape', () => {
	it('takes a number and its side, in the ways people type it', () => {
		for (const text of ['10 BTDC', '10 btdc', '10B', '10 b', '10°BTDC', '10° BTDC', ' 10  BTDC ']) {
			expect(parseReading('a', text, 'signed')).toEqual({ ok: true, reading: { atdcDeg: -10, sided: true } });
		}
		for (const text of ['19 ATDC', '19 atdc', '19A', '19 A']) {
			expect(parseReading('a', text, 'signed')).toEqual({ ok: true, reading: { atdcDeg: 19, sided: true } });
		}
	});

	it('reads a minus sign, ASCII or Unicode (U+2212, the sign the page prints), as BTDC on a signed scale', () => {
		expect(parseReading('a', '-10', 'signed')).toEqual({ ok: true, reading: { atdcDeg: -10, sided: false } });
		expect(parseReading('a', '\u221210', 'signed')).toEqual({ ok: true, reading: { atdcDeg: -10, sided: false } });
		expect(parseReading('a', '\u2212 10.5', 'signed')).toEqual({ ok: true, reading: { atdcDeg: -10.5, sided: false } });
	});

	it('reads a 0–360 scale as numbers growing the way the crank turns from 0 (common practice: 350 = 10 BTDC)', () => {
		expect(parseReading('a', '350', 'full')).toMatchObject({ ok: true, reading: { atdcDeg: -10 } });
		expect(parseReading('a', '10', 'full')).toMatchObject({ ok: true, reading: { atdcDeg: 10 } });
		expect(parseReading('a', '360', 'full')).toMatchObject({ ok: true, reading: { atdcDeg: 0 } });
	});

	it('reads each quadrant of a 0–90–0–90–0 wheel (BDC is 180° from TDC)', () => {
		// BBDC x: x before BDC = 180 − x ATDC; ABDC x: x after BDC = 180 − x BTDC (by hand).
		expect(parseReading('a', '10 BTDC', 'quadrant')).toMatchObject({ ok: true, reading: { atdcDeg: -10 } });
		expect(parseReading('a', '19 ATDC', 'quadrant')).toMatchObject({ ok: true, reading: { atdcDeg: 19 } });
		expect(parseReading('a', '30 BBDC', 'quadrant')).toMatchObject({ ok: true, reading: { atdcDeg: 150 } });
		expect(parseReading('a', '30 ABDC', 'quadrant')).toMatchObject({ ok: true, reading: { atdcDeg: -150 } });
	});

	it('refuses what a scale cannot show or what reads two ways, naming the field and showing how to write it', () => {
		const refused = (field: string, text: string, scale: Scale) => {
			const r = parseReading(field, text, scale);
			expect(r.ok).toBe(false);
			return r.ok ? '' : r.message;
		};
		// A bare number on a quadrant wheel: which quadrant?
		expect(refused('a', '10', 'quadrant')).toMatch(/^a: on a 0–90–0 wheel.*10 BTDC, 19 ATDC, 30 BBDC or 30 ABDC/);
		// "B" on a quadrant wheel could be BTDC or BBDC.
		expect(refused('b', '10B', 'quadrant')).toMatch(/^b: .*write the quadrant in full, 10 BTDC or 10 BBDC/);
		expect(refused('a', '-10', 'full')).toMatch(/^a: a reading from 0 to 360 .*350 = 10 BTDC/);
		expect(refused('a', '-10 BTDC', 'signed')).toMatch(/^a: a side or a sign, not both/);
		expect(refused('a', '200', 'signed')).toMatch(/^a: a reading from −180 to 180 \(negative = BTDC\)/);
		expect(refused('a', '100 ATDC', 'quadrant')).toMatch(/^a: ATDC readings run from 0 to 90/);
		for (const junk of ['', 'ten', '10 XTDC', '1e3', '10..5', '--10', 'NaN']) expect(refused('a', junk, 'signed')).toMatch(/^a: /);
	});

	it('writes readings back with their sides, so a stored record reads the same on any scale', () => {
		for (const [deg, scale, text] of [
			[-10, 'signed', '10 BTDC'],
			[19, 'full', '19 ATDC'],
			[150, 'quadrant', '30 BBDC'],
			[-150, 'quadrant', '30 ABDC'],
			[-150, 'signed', '150 BTDC'],
			[0, 'signed', '0']
		] as const) {
			expect(readingParam(deg, scale)).toBe(text);
			expect(parseReading('a', text, scale)).toMatchObject({ ok: true, reading: { atdcDeg: deg } });
		}
	});
});

describe('TDC from two piston-stop readings', () => {
	// Seed document (fact of the trade): two marks 29° apart put TDC 14.5° from each.
	it('10 BTDC and 19 ATDC: 29° apart, TDC 14.5° from each, at 4.5° ATDC', () => {
		const r = found('10 BTDC', '19 ATDC', 'signed');
		expect(r).toMatchObject({ spreadDeg: 29, halfSpreadDeg: 14.5 });
		closeAngle(r.tdcDeg, bisector(-10, 19).tdc);
		expect(r.tdcDeg).toBeCloseTo(4.5, 9); // by hand: −10 + 29/2
		// The same marks however they are typed, on each scale.
		for (const [a, b, scale] of [
			['-10', '19', 'signed'],
			['\u221210', '19', 'signed'],
			['10B', '19 A', 'signed'],
			['350', '19', 'full'],
			['10 BTDC', '19 ATDC', 'quadrant'],
			['19 ATDC', '10 BTDC', 'full']
		] as const) {
			expect(found(a, b, scale)).toMatchObject({ tdcDeg: 4.5, spreadDeg: 29, halfSpreadDeg: 14.5 });
		}
	});

	it('refuses two bare numbers on one side of 0 (a 0–90–0 wheel typed as plain numbers gave 14.5°, spread 9°)', () => {
		const a = parseReading('a', '10', 'signed');
		const b = parseReading('b', '19', 'signed');
		if (!a.ok || !b.ok) throw new Error('parse');
		const answer = tdcFromReadings(a.reading, b.reading);
		expect(answer).toMatchObject({ ok: false, field: 'b' });
		expect(answer.ok ? '' : answer.message).toMatch(/^b: both readings lie ATDC of 0.*10 BTDC and 19 ATDC/);
		// Written with sides, the same numbers on one side are taken as meant.
		expect(found('10 ATDC', '19 ATDC', 'signed')).toMatchObject({ tdcDeg: 14.5, spreadDeg: 9 });
	});

	it('readings across 0 on a 0–360 scale (350 and 20: TDC at 5 ATDC, spread 30)', () => {
		for (const [a, b] of [
			['350', '20'],
			['20', '350']
		] as const) {
			const r = found(a, b, 'full');
			const o = bisector(350, 20);
			closeAngle(r.tdcDeg, o.tdc);
			expect(r.spreadDeg).toBeCloseTo(o.spread, 6);
			expect(r.tdcDeg).toBeCloseTo(5, 9);
		}
	});

	it('readings across 180 (170 and −170 on a signed scale: TDC at 180, spread 20)', () => {
		const r = found('170', '-170', 'signed');
		closeAngle(r.tdcDeg, bisector(170, -170).tdc);
		expect(r.spreadDeg).toBeCloseTo(20, 9);
		expect(Math.abs(r.tdcDeg)).toBeCloseTo(180, 9);
	});

	it('quadrant-wheel readings, the wheel fitted near BDC (20 BBDC and 12 ABDC: TDC 176° ATDC, 4° BBDC)', () => {
		// By hand: 20 BBDC = 160 ATDC; 12 ABDC = 168 BTDC = 192 ATDC; half-way 176 ATDC, spread 32.
		const r = found('20 BBDC', '12 ABDC', 'quadrant');
		closeAngle(r.tdcDeg, bisector(160, -168).tdc);
		expect(r).toMatchObject({ spreadDeg: 32, halfSpreadDeg: 16 });
		expect(r.tdcDeg).toBeCloseTo(176, 9);
	});

	it('takes the longer arc when told (−10 and 19: TDC 175.5° BTDC, spread 331)', () => {
		const r = found('-10', '19', 'signed', 'longer');
		expect(r).toMatchObject({ tdcDeg: -175.5, spreadDeg: 331 });
	});

	it('refuses two equal readings', () => {
		const a = parseReading('a', '12 ATDC', 'signed');
		if (!a.ok) throw new Error('parse');
		expect(tdcFromReadings(a.reading, a.reading)).toMatchObject({ ok: false, field: 'b' });
	});
});

describe('what to do about it', () => {
	// Arc length s = r·θ: 4.5° on a 76.2 mm hub is 76.2·π·4.5/360 = 2.992 mm (by hand).
	it('4.5° ATDC on a 76.2 mm hub, crank clockwise: re-mark 3.0 mm to the left on the tape, or move the pointer with the rotation', () => {
		const advice = tdcAdvice(4.5, 'signed', { rotation: 'cw', diameterMm: 76.2 });
		expect(advice.finding).toBe("True TDC is 4.5° ATDC of the scale's 0.");
		expect(advice.rimMm).toBeCloseTo(2.992, 3);
		// Model: with the crank at true TDC the pointer reads 4.5 ATDC; ATDC numbers trail 0 past the
		// pointer, so they sit on the side opposite the tape's travel (hub.test.ts checks the travel
		// against a 3D model): clockwise crank, tape moves to its right, ATDC on the left.
		expect(advice.remark).toMatch(
			/new 0 at 4\.5° ATDC.*3\.0 mm along the rim.*ATDC side.*to the left of it on a tape.*anticlockwise of it on a wheel/
		);
		// The old 0 has already passed the pointer: the pointer follows it, the way the crank turns.
		expect(advice.pointer).toMatch(/4\.5° \(3\.0 mm.*the way the crank turns, over the old 0 \(clockwise seen from the wheel side\)/);
	});

	it('3° BTDC, crank anticlockwise: the new 0 sits on the BTDC side, to the left on the tape; the pointer moves against the rotation (clockwise)', () => {
		const advice = tdcAdvice(-3, 'full', { rotation: 'ccw' });
		expect(advice.finding).toBe("True TDC is 3° BTDC of the scale's 0.");
		expect(advice.remark).toMatch(
			/new 0 at 3° BTDC on the old scale \(the 357° graduation\).*to the left of it on a tape.*anticlockwise of it/
		);
		expect(advice.pointer).toMatch(/against the way the crank turns.*\(clockwise seen from the wheel side\)/);
		expect(advice.rimMm).toBeNull();
	});

	it('nothing to do when 0 is true TDC', () => {
		expect(tdcAdvice(0, 'signed')).toMatchObject({ finding: "True TDC is at the scale's 0.", remark: '', pointer: '' });
	});
});

describe('a spread measured along the rim', () => {
	// Arc length s = r·θ: 29° on a 150 mm rim is 150·π·29/360 = 37.96 mm; back to degrees 360·s/(π·D).
	it('converts it to degrees and halves it', () => {
		const s = (150 * Math.PI * 29) / 360;
		expect(spreadFromRim(s, 150)).toMatchObject({ spreadDeg: 29, halfSpreadDeg: 14.5 });
		expect(spreadFromRim(s, 150).fromEitherMarkMm).toBeCloseTo(s / 2, 6);
		// 37.96 mm on 150 mm, worked by hand: 360 × 37.96 / (π × 150) = 29.000 (to 3 places).
		expect(spreadFromRim(37.96, 150).spreadDeg).toBeCloseTo(29.0, 2);
	});
});
