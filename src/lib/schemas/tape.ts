import { z } from 'zod';
import { diameterFromCircumference, type TapeSpec } from '$lib/trade/tape';
import type { AdvancePoint } from '$lib/trade/timing';
import { formatLength, parseLength, toMm, type Units } from '$lib/trade/units';
import type { FieldErrors } from './form';
import { unprintable } from './text';

// Public parameters of the degree tape and the timing-light card, as flat strings
// (query, form). Lengths in `units`, fractions allowed; refusals name the field and its range.

export const oneOf = <T extends readonly [string, ...string[]]>(field: string, values: T) => z.enum(values, { error: `${field}: one of ${values.join(', ')}` });
const number = (field: string, min: number, max: number, unit = '') => {
	const range = `${field}: a number from ${min} to ${max}${unit}`;
	return z.coerce.number({ error: range }).min(min, { error: range }).max(max, { error: range });
};
export function length(field: string, units: Units, minMm: number, maxMm: number) {
	const range = `${field}: ${formatLength(minMm, units)} to ${formatLength(maxMm, units)}`;
	return z.string().transform((text, ctx) => {
		const mm = toMm(parseLength(text), units);
		if (!Number.isFinite(mm) || mm < minMm - 1e-9 || mm > maxMm + 1e-9) {
			ctx.addIssue({ code: 'custom', message: range });
			return z.NEVER;
		}
		return mm;
	});
}
/** `10,32` or `idle:10, full:32`: labelled numbers. */
function labelled(field: string, example: string, min: number, max: number) {
	return z
		.string()
		.default('')
		.transform((text, ctx) => {
			const items = text.split(',').map((s) => s.trim()).filter(Boolean);
			const out: { label: string; value: number }[] = [];
			for (const item of items) {
				const m = /^(?:([^:]{1,20}):)?\s*(-?\d+(?:\.\d+)?)$/.exec(item);
				const value = m ? Number(m[2]) : NaN;
				if (!m || value < min || value > max || unprintable.test(item)) {
					ctx.addIssue({ code: 'custom', message: `${field}: numbers from ${min} to ${max} separated by commas, optionally named, like ${example}` });
					return z.NEVER;
				}
				out.push({ label: m[1]?.trim() ?? '', value });
			}
			if (out.length > 12) {
				ctx.addIssue({ code: 'custom', message: `${field}: at most 12 entries` });
				return z.NEVER;
			}
			return out;
		});
}

export const unitsOf = (params: Record<string, string | undefined>): Units | null => (params.units === undefined || params.units === '' || params.units === 'mm' ? 'mm' : params.units === 'in' ? 'in' : null);

export const given = (params: Record<string, string | undefined>) => Object.fromEntries(Object.entries(params).filter(([, v]) => v !== undefined && v !== ''));

export function collect(error: z.ZodError): FieldErrors {
	const errors: FieldErrors = {};
	for (const issue of error.issues) errors[String(issue.path[0] ?? 'form')] ??= issue.message;
	return errors;
}

/** The hub the tape goes on: a diameter, or a circumference measured with a tape or a strip of paper. */
function hubSchema(units: Units) {
	return z.object({
		diameter: length('diameter', units, 10, 2000).optional(),
		circumference: length('circumference', units, 31.5, 6300).optional(),
		paperThickness: length('paperThickness', units, 0, 1).default(0.1),
		rotation: oneOf('rotation', ['cw', 'ccw'] as const).default('cw'),
		paper: oneOf('paper', ['a4', 'letter'] as const).default('a4')
	});
}

function hubFrom(v: { diameter?: number; circumference?: number }, errors: FieldErrors): number {
	if (v.diameter !== undefined && v.circumference !== undefined) errors.circumference = 'circumference: give either diameter or circumference, not both';
	if (v.diameter === undefined && v.circumference === undefined) errors.diameter = 'diameter: required (or give circumference instead)';
	return v.diameter ?? diameterFromCircumference(v.circumference ?? 0);
}

export interface ParsedTape {
	units: Units;
	paper: 'a4' | 'letter';
	spec: TapeSpec;
}

export function parseTape(params: Record<string, string | undefined>): { ok: true; value: ParsedTape } | { ok: false; errors: FieldErrors } {
	const units = unitsOf(params);
	if (!units) return { ok: false, errors: { units: 'units: one of mm, in' } };
	const schema = hubSchema(units).extend({
		window: z.union([z.literal('full'), number('window', 5, 180, '° each side of TDC')], { error: 'window: full, or a number from 5 to 180° each side of TDC' }).default('full'),
		tick: number('tick', 0.25, 10, '°').default(1),
		mid: number('mid', 0.5, 90, '°').default(5),
		label: number('label', 1, 90, '°').default(10),
		timing: labelled('timing', 'idle:10, full:32 (degrees BTDC)', 0, 90),
		tdc2: labelled('tdc2', 'cyl 2:270 (degrees after TDC of cylinder 1)', 1, 359)
	});
	const parsed = schema.safeParse(given(params));
	if (!parsed.success) return { ok: false, errors: collect(parsed.error) };
	const v = parsed.data;
	const errors: FieldErrors = {};
	const hubDiameterMm = hubFrom(v, errors);
	const multiple = (a: number, b: number) => Math.abs(a / b - Math.round(a / b)) < 1e-9;
	if (!multiple(v.mid, v.tick)) errors.mid = `mid: a multiple of the tick spacing (${v.tick}°)`;
	if (!multiple(v.label, v.tick)) errors.label = `label: a multiple of the tick spacing (${v.tick}°)`;
	if (Object.keys(errors).length) return { ok: false, errors };
	const windowDeg = v.window === 'full' ? 180 : v.window;
	return {
		ok: true,
		value: {
			units,
			paper: v.paper,
			spec: {
				hubDiameterMm,
				paperThicknessMm: v.paperThickness,
				rotation: v.rotation,
				windowDeg,
				tickDeg: v.tick,
				midEveryDeg: v.mid,
				labelEveryDeg: v.label,
				timingMarks: v.timing.map((t) => ({ label: t.label || `${t.value}° BTDC`, btdcDeg: t.value })),
				otherTdc: v.tdc2.map((t, i) => ({ label: t.label || `TDC ${i + 2}`, atdcDeg: t.value }))
			}
		}
	};
}

export interface ParsedCard {
	units: Units;
	paper: 'a4' | 'letter';
	hub: { hubDiameterMm: number; paperThicknessMm: number };
	rotation: 'cw' | 'ccw';
	points: AdvancePoint[];
}

/** `curve=1200:10,2000:14`: rpm and advance (degrees BTDC) pairs. */
export function parseCard(params: Record<string, string | undefined>): { ok: true; value: ParsedCard } | { ok: false; errors: FieldErrors } {
	const units = unitsOf(params);
	if (!units) return { ok: false, errors: { units: 'units: one of mm, in' } };
	const schema = hubSchema(units).extend({
		curve: z.string({ error: 'curve: rpm:advance pairs like 1200:10, 3000:20' }).transform((text, ctx) => {
			const points: AdvancePoint[] = [];
			for (const item of text.split(',').map((s) => s.trim()).filter(Boolean)) {
				const m = /^(\d{2,5})\s*:\s*(-?\d+(?:\.\d+)?)$/.exec(item);
				const rpm = m ? Number(m[1]) : NaN;
				const adv = m ? Number(m[2]) : NaN;
				if (!m || rpm < 100 || rpm > 30000 || adv < -10 || adv > 60) {
					ctx.addIssue({ code: 'custom', message: 'curve: rpm:advance pairs like 1200:10, 3000:20 (rpm 100 to 30000, advance −10 to 60° BTDC)' });
					return z.NEVER;
				}
				points.push({ rpm, advanceDeg: adv });
			}
			if (points.length < 1 || points.length > 20) {
				ctx.addIssue({ code: 'custom', message: 'curve: 1 to 20 rpm:advance pairs' });
				return z.NEVER;
			}
			return points;
		})
	});
	const parsed = schema.safeParse(given(params));
	if (!parsed.success) return { ok: false, errors: collect(parsed.error) };
	const errors: FieldErrors = {};
	const hubDiameterMm = hubFrom(parsed.data, errors);
	if (Object.keys(errors).length) return { ok: false, errors };
	return { ok: true, value: { units, paper: parsed.data.paper, rotation: parsed.data.rotation, hub: { hubDiameterMm, paperThicknessMm: parsed.data.paperThickness }, points: parsed.data.curve } };
}
