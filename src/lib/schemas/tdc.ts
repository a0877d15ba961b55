import { z } from 'zod';
import type { Rotation } from '$lib/trade/hub';
import { parseReading, readingParam, sideText, tdcFromReadings, type Arc, type Reading, type Scale, type TdcResult } from '$lib/trade/tdc';
import { formatLength, type Units } from '$lib/trade/units';
import type { FieldErrors } from './form';
import { collect, given, length, oneOf, unitsOf } from './tape';

// Public parameters of the TDC finder (the page, /api/v1/tdc, a build's TDC records), as flat
// strings. Two readings `a` and `b` as the scale shows them ("10 BTDC", "−10", "350", "30 BBDC"),
// the `scale` they are read on, the `arc` through TDC; optionally the `rotation` and the
// `diameter` of the rim the scale sits on, for which way and how far to re-mark. Or a rim
// `distance` between the marks and the rim `diameter`.

export const tdcKeys = ['a', 'b', 'scale', 'arc', 'rotation', 'distance', 'diameter', 'units'] as const;

export type ParsedTdc =
	| { kind: 'marks'; a: Reading; b: Reading; scale: Scale; arc: Arc; rotation: Rotation | null; units: Units; diameterMm: number | null }
	| { kind: 'rim'; units: Units; distanceMm: number; diameterMm: number };

type Answer<T> = { ok: true; value: T } | { ok: false; errors: FieldErrors };

const bareOver180 = (text: string | undefined) => text !== undefined && /^\s*\+?\d+(\.\d+)?\s*°?\s*$/.test(text) && Number(text.replace(/[^\d.]/g, '')) > 180;
const minus = (text: string | undefined) => text !== undefined && /^\s*[-\u2212\u2012\u2013\uFE63\uFF0D]/.test(text);

export function parseTdc(params: Record<string, string | undefined>): Answer<ParsedTdc> {
	const p = given(params) as Record<string, string>;
	const units = unitsOf(params);
	if (!units) return { ok: false, errors: { units: 'units: one of mm, in' } };
	const rim = p.distance !== undefined || (p.diameter !== undefined && p.a === undefined && p.b === undefined);
	if (rim) {
		const parsed = z
			.object({ distance: length('distance', units, 0.1, 3000), diameter: length('diameter', units, 10, 2000) })
			.safeParse({ distance: p.distance ?? '', diameter: p.diameter ?? '' });
		if (!parsed.success) return { ok: false, errors: collect(parsed.error) };
		if (parsed.data.distance >= Math.PI * parsed.data.diameter) {
			return { ok: false, errors: { distance: `distance: less than the rim's circumference (${formatLength(Math.PI * parsed.data.diameter, units)})` } };
		}
		return { ok: true, value: { kind: 'rim', units, distanceMm: parsed.data.distance, diameterMm: parsed.data.diameter } };
	}
	const parsed = z
		.object({
			scale: oneOf('scale', ['signed', 'full', 'quadrant'] as const).optional(),
			arc: oneOf('arc', ['shorter', 'longer'] as const).default('shorter'),
			rotation: oneOf('rotation', ['cw', 'ccw'] as const).optional(),
			diameter: length('diameter', units, 10, 2000).optional()
		})
		.safeParse({ scale: p.scale, arc: p.arc, rotation: p.rotation, diameter: p.diameter });
	if (!parsed.success) return { ok: false, errors: collect(parsed.error) };
	// Without a scale named, a plain number past 180 (and no minus sign) can only be a 0–360 wheel.
	const scale: Scale = parsed.data.scale ?? (!minus(p.a) && !minus(p.b) && (bareOver180(p.a) || bareOver180(p.b)) ? 'full' : 'signed');
	const errors: FieldErrors = {};
	const read = (field: 'a' | 'b') => {
		const r = parseReading(field, p[field] ?? '', scale);
		if (!r.ok) errors[field] = r.message;
		return r.ok ? r.reading : null;
	};
	const a = read('a');
	const b = read('b');
	if (!a || !b) return { ok: false, errors };
	return { ok: true, value: { kind: 'marks', a, b, scale, arc: parsed.data.arc, rotation: parsed.data.rotation ?? null, units, diameterMm: parsed.data.diameter ?? null } };
}

export type ParsedMarks = Extract<ParsedTdc, { kind: 'marks' }>;

/** Two readings parsed and TDC found from them; refusals by field, for the page, the API and records. */
export function findTdc(params: Record<string, string | undefined>): Answer<{ marks: ParsedMarks; result: TdcResult }> | { ok: 'rim'; value: Extract<ParsedTdc, { kind: 'rim' }> } {
	const parsed = parseTdc(params);
	if (!parsed.ok) return parsed;
	if (parsed.value.kind === 'rim') return { ok: 'rim', value: parsed.value };
	const answer = tdcFromReadings(parsed.value.a, parsed.value.b, parsed.value.arc);
	if (!answer.ok) return { ok: false, errors: { [answer.field]: answer.message } };
	return { ok: true, value: { marks: parsed.value, result: answer.result } };
}

/**
 * The parameters a TDC record keeps: each reading with its side, the scale it was read on, and
 * what else was given. They read the same in the tool again, on any scale.
 */
export function tdcRecordParams(marks: ParsedMarks, params: Record<string, string | undefined>): Record<string, string> {
	const out: Record<string, string> = { a: readingParam(marks.a.atdcDeg, marks.scale), b: readingParam(marks.b.atdcDeg, marks.scale), scale: marks.scale };
	if (marks.arc === 'longer') out.arc = 'longer';
	if (marks.rotation) out.rotation = marks.rotation;
	if (marks.diameterMm !== null && params.diameter) {
		out.diameter = params.diameter.trim();
		out.units = marks.units;
	}
	return out;
}

export const scaleNames: Record<Scale, string> = { signed: 'signed scale', full: '0–360 scale', quadrant: '0–90–0 scale' };

/** A saved TDC record in words with its sides: what the build page and the record list show. */
export function tdcRecordWords(params: Record<string, string>, tdcDeg: string): { a: string; b: string; tdc: string; scale: string } {
	const found = findTdc(params);
	if (found.ok !== true) return { a: params.a ?? '', b: params.b ?? '', tdc: `${tdcDeg}°`, scale: '' };
	const { marks, result } = found.value;
	return { a: sideText(marks.a.atdcDeg, marks.scale), b: sideText(marks.b.atdcDeg, marks.scale), tdc: sideText(result.tdcDeg, marks.scale), scale: scaleNames[marks.scale] };
}
