import type { Rotation } from '$lib/trade/hub';
import { parseReading, readingParam, sideText, tdcFromReadings, type Arc, type Reading, type Scale, type TdcResult } from '$lib/trade/tdc';
import { formatLength, type Units } from '$lib/trade/units';
import { common } from './common-params';
import { firstPerField, namedErrors, refusal, type Checked, type Refusal } from './refusal';
import { allows, defineRegistry, givenParams, readUnits } from './registry';

// The TDC finder's public parameters (the page, /api/v1/tdc, a build's TDC records, the build
// sheet's tdcA/tdcB) and its one check, `checkTdc`. Two readings `a` and `b` as the scale shows
// them ("10 BTDC", "−10", "350", "30 BBDC"), the `scale` they are read on, the `arc` through TDC;
// optionally the `rotation` and the `diameter` of the rim the scale sits on, for which way and how
// far to re-mark. Or a rim `distance` between the marks and the rim `diameter`.

export const tdcRegistry = defineRegistry([
	{
		name: 'a',
		label: 'First mark',
		help: 'The reading at the first piston stop, as the scale shows it: 10 BTDC, −10, 350, 30 BBDC.',
		kind: 'free',
		allows: 'a reading as the scale shows it, or a number and its side, like 10 BTDC'
	},
	{
		name: 'b',
		label: 'Second mark',
		help: 'The reading at the other piston stop.',
		kind: 'free',
		allows: 'a reading as the scale shows it, or a number and its side, like 19 ATDC'
	},
	{
		name: 'scale',
		label: 'Scale',
		help:
			'signed: −180 to 180, negative BTDC; full: 0 to 360 the way the crank turns; quadrant: 0–90–0–90–0 with its quarter. ' +
			'Without it a plain number past 180 means a 0–360 wheel.',
		kind: 'choice',
		values: ['signed', 'full', 'quadrant'],
		labels: { signed: 'Signed, −180 to 180° (negative = BTDC)', full: '0 to 360° (350 = 10° BTDC)', quadrant: 'Quarters, 0–90–0–90–0' }
	},
	{
		name: 'arc',
		label: 'Arc through TDC',
		help: 'The shorter arc between the marks, unless the stop is deep and they lie more than half a turn apart through TDC.',
		kind: 'choice',
		values: ['shorter', 'longer'],
		labels: { shorter: 'Shorter arc', longer: 'Longer arc' },
		default: 'shorter'
	},
	// Not assumed: without it the answer cannot say left or right, clockwise or anticlockwise.
	{ ...common.rotation, default: undefined },
	{
		name: 'distance',
		label: 'Distance between the marks',
		help: 'Measured along the rim, through TDC, instead of two readings.',
		kind: 'length',
		minMm: 0.1,
		maxMm: 3000
	},
	common.diameter,
	common.units
]);

/** Every public parameter of the TDC finder (the names /api/v1/tdc takes). */
export const tdcKeys = tdcRegistry.names;

export type TdcMarks = {
	kind: 'marks';
	a: Reading;
	b: Reading;
	scale: Scale;
	arc: Arc;
	rotation: Rotation | null;
	units: Units;
	diameterMm: number | null;
};
export type TdcRim = { kind: 'rim'; units: Units; distanceMm: number; diameterMm: number };
export type ParsedTdc = TdcMarks | TdcRim;
export type ParsedMarks = TdcMarks;

/** What the TDC finder found: from two readings, TDC and the marks as read; or a spread measured along the rim. */
export type TdcFound = { kind: 'marks'; marks: TdcMarks; result: TdcResult } | TdcRim;

const bareOver180 = (text: string | undefined) =>
	text !== undefined && /^\s*\+?\d+(\.\d+)?\s*°?\s*$/.test(text) && Number(text.replace(/[^\d.]/g, '')) > 180;
const minus = (text: string | undefined) => text !== undefined && /^\s*[-\u2212\u2012\u2013\uFE63\uFF0D]/.test(text);

/** Refusals in the order the registry lists their fields. */
const byName = (x: Refusal, y: Refusal) => tdcRegistry.names.indexOf(x.field as never) - tdcRegistry.names.indexOf(y.field as never);

/** A rim measurement, not two readings: a distance given, or a diameter alone. */
export const isRim = (p: Partial<Record<string, string>>) => !!p.distance || (!!p.diameter && !p.a && !p.b);

/**
 * The one TDC sequence: units, then which measurement it is, the scale (named, or inferred from a
 * plain number past 180), each reading on that scale, then TDC half-way between them. Refusals
 * first per field in the order found; the page, the API, records and the build sheet call it.
 */
export function checkTdc(params: Partial<Record<string, string>>): Checked<TdcFound> {
	const units = readUnits(params);
	if (!units.ok) return units;
	const p = givenParams(params);
	if (isRim(p)) {
		const read = tdcRegistry.read({ distance: p.distance, diameter: p.diameter }, units.value);
		// Both are needed here, though each is optional beside two readings.
		const missing = (['distance', 'diameter'] as const)
			.filter((f) => p[f] === undefined)
			.map((f) => refusal(f, `required, ${allows(tdcRegistry.get(f)!, units.value)}`));
		if (missing.length || !read.ok)
			return { ok: false, refusals: firstPerField([...missing, ...(read.ok ? [] : read.refusals)].sort(byName)) };
		const distanceMm = read.value.distance as number;
		const diameterMm = read.value.diameter as number;
		if (distanceMm >= Math.PI * diameterMm) {
			return {
				ok: false,
				refusals: [refusal('distance', `less than the rim's circumference (${formatLength(Math.PI * diameterMm, units.value)})`)]
			};
		}
		return { ok: true, value: { kind: 'rim', units: units.value, distanceMm, diameterMm } };
	}
	const read = tdcRegistry.read({ scale: p.scale, arc: p.arc, rotation: p.rotation, diameter: p.diameter }, units.value);
	if (!read.ok) return read;
	const v = read.value;
	// Without a scale named, a plain number past 180 (and no minus sign) can only be a 0–360 wheel.
	const scale: Scale =
		(v.scale as Scale | undefined) ?? (!minus(p.a) && !minus(p.b) && (bareOver180(p.a) || bareOver180(p.b)) ? 'full' : 'signed');
	const refusals: Refusal[] = [];
	const reading = (field: 'a' | 'b') => {
		const r = parseReading(field, p[field] ?? '', scale);
		if (!r.ok) refusals.push(refusal(field, r.message));
		return r.ok ? r.reading : null;
	};
	const a = reading('a');
	const b = reading('b');
	if (!a || !b) return { ok: false, refusals };
	const marks: TdcMarks = {
		kind: 'marks',
		a,
		b,
		scale,
		arc: v.arc as Arc,
		rotation: (v.rotation as Rotation | undefined) ?? null,
		units: units.value,
		diameterMm: (v.diameter as number | undefined) ?? null
	};
	const answer = tdcFromReadings(a, b, marks.arc);
	if (!answer.ok) return { ok: false, refusals: [refusal(answer.field, answer.message)] };
	return { ok: true, value: { kind: 'marks', marks, result: answer.result } };
}

/**
 * `checkTdc` in the shape its callers had before: `ok: 'rim'` for a rim measurement, and the
 * refusals as a field → `field: message` map. The phasing check and the build page still read it.
 */
export function findTdc(
	params: Partial<Record<string, string>>
):
	| { ok: true; value: { marks: TdcMarks; result: TdcResult } }
	| { ok: 'rim'; value: TdcRim }
	| { ok: false; errors: Record<string, string> } {
	const checked = checkTdc(params);
	if (!checked.ok) return { ok: false, errors: namedErrors(checked.refusals) };
	if (checked.value.kind === 'rim') return { ok: 'rim', value: checked.value };
	return { ok: true, value: { marks: checked.value.marks, result: checked.value.result } };
}

/**
 * The parameters a TDC record keeps: each reading with its side, the scale it was read on, and
 * what else was given. They read the same in the tool again, on any scale.
 */
export function tdcRecordParams(marks: TdcMarks, params: Partial<Record<string, string>>): Record<string, string> {
	const out: Record<string, string> = {
		a: readingParam(marks.a.atdcDeg, marks.scale),
		b: readingParam(marks.b.atdcDeg, marks.scale),
		scale: marks.scale
	};
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
	const found = checkTdc(params);
	if (!found.ok || found.value.kind !== 'marks') return { a: params.a ?? '', b: params.b ?? '', tdc: `${tdcDeg}°`, scale: '' };
	const { marks, result } = found.value;
	return {
		a: sideText(marks.a.atdcDeg, marks.scale),
		b: sideText(marks.b.atdcDeg, marks.scale),
		tdc: sideText(result.tdcDeg, marks.scale),
		scale: scaleNames[marks.scale]
	};
}
