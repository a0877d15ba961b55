// True TDC from piston-stop marks (common practice): turn the crank by hand each way onto a stop
// screwed into the plug hole and read the degree wheel or tape at both stops, a and b. TDC lies
// half-way between them: TDC = a + δ/2, δ the signed arc from a to b that passes TDC (the shorter
// one unless told otherwise), with δ/2 on each side. A spread measured as a distance s along the
// rim of diameter D is 360·s/(π·D) degrees (arc length s = r·θ).
//
// Readings are taken as the scale shows them and held as degrees ATDC of the scale's 0, BTDC
// negative (hub.ts's sign). The scales people own:
// - signed, −180 to 180: negative = BTDC;
// - full, 0 to 360: numbers increase the way the crank turns from 0, so 10 = 10 ATDC and
//   350 = 10 BTDC (common practice);
// - quadrant, 0–90–0–90–0: a number from 0 to 90 and its quadrant, BTDC, ATDC, BBDC or ABDC.
// A number with its side ("10 BTDC") reads the same on every scale.

import { atdcSide, btdcSide, faceClockwiseDeg, type Rotation } from './hub';

export type Scale = 'signed' | 'full' | 'quadrant';
export type Arc = 'shorter' | 'longer';
export type Side = 'BTDC' | 'ATDC' | 'BBDC' | 'ABDC';

export const scales: readonly Scale[] = ['signed', 'full', 'quadrant'];

/** An angle as degrees ATDC in (−180, 180], BTDC negative. */
export function signed(deg: number): number {
	const full = ((deg % 360) + 360) % 360;
	return full > 180 ? full - 360 : full;
}

/** An angle in the range of a numeric scale: signed (−180, 180], full [0, 360). */
export const onScale = (deg: number, scale: 'signed' | 'full'): number => (scale === 'full' ? ((deg % 360) + 360) % 360 : signed(deg));

/** One reading: where it sits, and whether it was written with its side (not a bare number). */
export interface Reading {
	atdcDeg: number;
	sided: boolean;
}

export type ReadingAnswer = { ok: true; reading: Reading } | { ok: false; message: string };

/** How to write a reading on each scale, for refusals. */
export function howToWrite(field: string, scale: Scale): string {
	if (scale === 'quadrant')
		return `${field}: on a 0–90–0 wheel, a number from 0 to 90 and its quadrant, like 10 BTDC, 19 ATDC, 30 BBDC or 30 ABDC`;
	if (scale === 'full')
		return `${field}: a reading from 0 to 360 (10 = 10 ATDC, 350 = 10 BTDC), or a number and its side, like 10 BTDC or 19 ATDC`;
	return `${field}: a reading from −180 to 180 (negative = BTDC), or a number and its side, like 10 BTDC or 19 ATDC`;
}

const sideWords: Record<string, Side | 'B' | 'A'> = { btdc: 'BTDC', atdc: 'ATDC', bbdc: 'BBDC', abdc: 'ABDC', b: 'B', a: 'A' };

/**
 * A reading as typed: "10 BTDC", "19 atdc", "10B", "10 A", "30 BBDC", "-10", "−10" (Unicode
 * minus), "350", with or without "°". What a scale cannot show, or what reads two ways, is refused
 * with the field's name and how to write it.
 */
export function parseReading(field: string, text: string, scale: Scale): ReadingAnswer {
	const t = text
		.trim()
		.replace(/[\u2212\u2012\u2013\uFE63\uFF0D]/g, '-')
		.replace(/\s+/g, ' ');
	const m = /^([+-])? ?(\d{1,3}(?:\.\d+)?|\.\d+) ?(?:°|deg)? ?([a-z]+)?$/i.exec(t);
	const refuse = (message = howToWrite(field, scale)): ReadingAnswer => ({ ok: false, message });
	if (!m) return refuse();
	const value = Number(m[2]);
	const sign = m[1];
	const word = m[3]?.toLowerCase();
	if (word === undefined) {
		if (value === 0) return { ok: true, reading: { atdcDeg: 0, sided: true } };
		if (scale === 'quadrant') return refuse();
		if (scale === 'full') {
			if (sign === '-' || value > 360) return refuse();
			return { ok: true, reading: { atdcDeg: signed(value), sided: false } };
		}
		if (value > 180) return refuse();
		return { ok: true, reading: { atdcDeg: signed(sign === '-' ? -value : value), sided: false } };
	}
	const side = sideWords[word];
	if (!side) return refuse();
	if (sign)
		return refuse(
			`${field}: a side or a sign, not both: write ${m[2]} ${side.length === 1 ? `${side}TDC` : side}${scale === 'quadrant' ? '' : ` or ${sign === '-' ? '−' : ''}${m[2]}`}`
		);
	if (scale === 'quadrant' && side.length === 1) {
		return refuse(
			`${field}: on a 0–90–0 wheel “${side}” reads two ways: write the quadrant in full, ${m[2]} ${side}TDC or ${m[2]} ${side}BDC`
		);
	}
	const full: Side = side === 'B' ? 'BTDC' : side === 'A' ? 'ATDC' : side;
	const max = scale === 'quadrant' || full === 'BBDC' || full === 'ABDC' ? 90 : 180;
	if (value > max)
		return refuse(
			`${field}: ${full} readings run from 0 to ${max}${max === 90 ? '; past 90 the quadrant changes (100 ATDC is 80 BBDC)' : ''}`
		);
	const atdc = full === 'BTDC' ? -value : full === 'ATDC' ? value : full === 'BBDC' ? 180 - value : 180 + value;
	return { ok: true, reading: { atdcDeg: signed(atdc), sided: true } };
}

export interface TdcResult {
	/** True TDC in degrees ATDC of the scale's 0, BTDC negative. */
	tdcDeg: number;
	spreadDeg: number;
	halfSpreadDeg: number;
	/** The signed arc from the first mark to the second, through TDC. */
	deltaDeg: number;
}

export type TdcAnswer = { ok: true; result: TdcResult } | { ok: false; field: string; message: string };

export function tdcFromReadings(a: Reading, b: Reading, arc: Arc = 'shorter'): TdcAnswer {
	let delta = signed(b.atdcDeg - a.atdcDeg);
	if (Math.abs(delta) < 1e-9)
		return { ok: false, field: 'b', message: 'b: must differ from the first mark; a piston stop leaves one mark each side of TDC' };
	// Two bare numbers on one side of 0 are what a 0–90–0 wheel's readings look like typed as plain
	// numbers ("10" and "19"); taken as written they give a TDC between them that is far from true.
	if (arc === 'shorter' && !a.sided && !b.sided && Math.sign(a.atdcDeg) === Math.sign(b.atdcDeg)) {
		const side = a.atdcDeg < 0 ? 'BTDC' : 'ATDC';
		return {
			ok: false,
			field: 'b',
			message: `b: both readings lie ${side} of 0, yet a piston stop leaves one mark each side of TDC. Write each with its side: on a 0–90–0 wheel choose that scale and type, say, 10 BTDC and 19 ATDC; if both marks really lie ${side}, type ${fmt(Math.abs(a.atdcDeg))} ${side} and ${fmt(Math.abs(b.atdcDeg))} ${side}`
		};
	}
	if (arc === 'longer') delta -= 360 * Math.sign(delta);
	const spread = Math.abs(delta);
	return {
		ok: true,
		result: {
			tdcDeg: round(signed(a.atdcDeg + delta / 2)),
			spreadDeg: round(spread),
			halfSpreadDeg: round(spread / 2),
			deltaDeg: round(delta)
		}
	};
}

/** A spread measured along the rim: degrees, and the distance of TDC from either mark (s/2). */
export function spreadFromRim(
	distanceMm: number,
	diameterMm: number
): { spreadDeg: number; halfSpreadDeg: number; fromEitherMarkMm: number } {
	const spread = (360 * distanceMm) / (Math.PI * diameterMm);
	return { spreadDeg: round(spread), halfSpreadDeg: round(spread / 2), fromEitherMarkMm: round(distanceMm / 2) };
}

/** Distance along a rim of diameter D for an angle (s = r·θ). */
export const rimMm = (deg: number, diameterMm: number) => (Math.PI * diameterMm * Math.abs(deg)) / 360;

const fmt = (v: number) => String(Number(v.toFixed(2)));

/** A reading with its side, as a person says it: "10° BTDC", "30° BBDC" (quadrant past 90), "0° (TDC)". */
export function sideText(atdcDeg: number, scale: Scale = 'signed'): string {
	const x = signed(atdcDeg);
	if (Math.abs(x) < 1e-9) return '0° (TDC)';
	if (scale === 'quadrant' && Math.abs(x) > 90) return `${fmt(180 - Math.abs(x))}° ${x > 0 ? 'BBDC' : 'ABDC'}`;
	return `${fmt(Math.abs(x))}° ${x < 0 ? 'BTDC' : 'ATDC'}`;
}

/** The number the scale itself shows at this angle: "−10", "350", or "10 BTDC" on a quadrant wheel. */
export function scaleText(atdcDeg: number, scale: Scale): string {
	if (scale === 'quadrant') return sideText(atdcDeg, scale);
	return `${fmt(onScale(atdcDeg, scale)).replace(/^-/, '−')}°`;
}

/** A reading as stored and sent back to the tool: a number and its side, the same on every scale. */
export function readingParam(atdcDeg: number, scale: Scale): string {
	const x = signed(atdcDeg);
	if (Math.abs(x) < 1e-9) return '0';
	const n = (v: number) => String(round(v));
	if (scale === 'quadrant' && Math.abs(x) > 90) return `${n(180 - Math.abs(x))} ${x > 0 ? 'BBDC' : 'ABDC'}`;
	return `${n(Math.abs(x))} ${x < 0 ? 'BTDC' : 'ATDC'}`;
}

export interface TdcAdvice {
	/** "True TDC is 4.5° ATDC of the scale's 0." */
	finding: string;
	/** What to do, one sentence each: re-mark TDC, or move the pointer. Empty when 0 is true TDC. */
	remark: string;
	pointer: string;
	/** Distance on the rim between the scale's 0 and true TDC, when a diameter is known. */
	rimMm: number | null;
}

/**
 * What to do about a TDC found off the scale's 0. At true TDC the pointer reads the TDC reading, so
 * a new 0 goes on that graduation (on the same side of 0 as the reading); or the pointer moves over
 * the old 0, which lies the way the crank turns from the pointer when TDC reads ATDC (the 0 has
 * already passed it) and against it when TDC reads BTDC. Left and right on a tape, and clockwise on
 * a wheel, come from hub.ts.
 */
export function tdcAdvice(
	tdcDeg: number,
	scale: Scale,
	options: { rotation?: Rotation; diameterMm?: number; lengthText?: (mm: number) => string } = {}
): TdcAdvice {
	const x = signed(tdcDeg);
	const { rotation, diameterMm } = options;
	const length = options.lengthText ?? ((mm: number) => `${mm.toFixed(1)} mm`);
	const mm = diameterMm ? rimMm(x, diameterMm) : null;
	if (Math.abs(x) < 0.005) return { finding: "True TDC is at the scale's 0.", remark: '', pointer: '', rimMm: mm };
	const side = x < 0 ? 'BTDC' : 'ATDC';
	const by = `${fmt(Math.abs(x))}°${mm === null ? '' : ` (${length(mm)} along the rim)`}`;
	const reading = scale === 'signed' || scale === 'full' ? ` (the ${scaleText(x, scale)} graduation)` : '';
	let remark = `Re-mark TDC: put a new 0 at ${sideText(x, scale)} on the old scale${reading}, ${by} on the ${side} side of the old 0`;
	let pointer = `Or move the pointer ${by} ${x > 0 ? 'the way the crank turns' : 'against the way the crank turns'}, over the old 0`;
	if (rotation) {
		const tapeSide = x < 0 ? btdcSide(rotation) : atdcSide(rotation);
		const clockwise = faceClockwiseDeg(rotation, x) > 0;
		remark += ` — to the ${tapeSide} of it on a tape read upright from the wheel side, ${clockwise ? 'clockwise' : 'anticlockwise'} of it on a wheel on the hub face`;
		const pointerClockwise = (rotation === 'cw') === x > 0;
		pointer += ` (${pointerClockwise ? 'clockwise' : 'anticlockwise'} seen from the wheel side)`;
	}
	return { finding: `True TDC is ${sideText(x, scale)} of the scale's 0.`, remark: `${remark}.`, pointer: `${pointer}.`, rimMm: mm };
}

const round = (x: number) => Math.round(x * 1e6) / 1e6;
