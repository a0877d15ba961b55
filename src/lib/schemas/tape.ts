import { diameterFromCircumference, type TapeSpec } from '$lib/trade/tape';
import type { Units } from '$lib/trade/units';
import { common } from './common-params';
import { firstPerField, namedErrors, refusal, type Checked, type Refusal } from './refusal';
import { allows, defineRegistry, readUnits, type ParamDef } from './registry';
import { unprintable } from './text';

// The degree tape's public parameters (the page, its address, /api/v1/tape and tape.pdf, a build's
// saved tapes) and its one check, `checkTape`, which the page and every route call.

/** The hub the tape goes on, shared with the timing-light card: a diameter, or a circumference measured round it. */
export const hubParams = [
	common.units,
	common.diameter,
	{
		name: 'circumference',
		label: 'Hub circumference',
		help: 'Wrap a strip of paper round the hub, mark the overlap and measure it flat.',
		kind: 'length',
		minMm: 31.5,
		maxMm: 6300
	},
	{
		name: 'paperThickness',
		label: 'Paper thickness',
		help: 'The tape lies on its own mid-thickness; office paper is about 0.1 mm (0.004 in).',
		kind: 'length',
		minMm: 0,
		maxMm: 1,
		default: { mm: '0.1', in: '0.004' }
	},
	common.rotation,
	common.paper
] as const satisfies readonly ParamDef[];

export const tapeRegistry = defineRegistry([
	...hubParams,
	{
		name: 'window',
		label: 'Degrees each side of TDC',
		help: '5 to 180, or full for the whole circle.',
		kind: 'free',
		allows: 'full, or a number from 5 to 180° each side of TDC',
		default: 'full'
	},
	{ name: 'tick', label: 'Tick spacing', help: '0.25 to 10.', kind: 'number', min: 0.25, max: 10, unit: '°', default: '1' },
	{ name: 'mid', label: 'Long tick every', help: 'A multiple of the tick.', kind: 'number', min: 0.5, max: 90, unit: '°', default: '5' },
	{ name: 'label', label: 'Number every', help: 'A multiple of the tick.', kind: 'number', min: 1, max: 90, unit: '°', default: '10' },
	{
		name: 'timing',
		label: 'Spec timing marks',
		help: 'Degrees BTDC, separated by commas, optionally named: idle:10, full:32.',
		kind: 'free',
		allows: 'numbers from 0 to 90 separated by commas, optionally named, like idle:10, full:32 (degrees BTDC)'
	},
	{
		name: 'tdc2',
		label: 'Other cylinders’ TDC',
		help: 'Degrees after TDC of cylinder 1, like cyl 2:270 for a 270° twin, or 180, 360, 540 … within one turn: 1 to 359.',
		kind: 'free',
		allows: 'numbers from 1 to 359 separated by commas, optionally named, like cyl 2:270 (degrees after TDC of cylinder 1)'
	}
]);

export type TapeParam = (typeof tapeRegistry.names)[number];

/** The range of each labelled list (timing marks in degrees BTDC, other cylinders' TDC in degrees after TDC 1). */
const listRanges = { timing: { min: 0, max: 90 }, tdc2: { min: 1, max: 359 } } as const;
const maxListEntries = 12;

/** `10,32` or `idle:10, full:32`: labelled numbers, or the refusal (without the field's name). */
export function readLabelled(
	text: string,
	range: { min: number; max: number },
	allowsText: string
): Checked<{ label: string; value: number }[]> {
	const out: { label: string; value: number }[] = [];
	for (const item of text
		.split(',')
		.map((s) => s.trim())
		.filter(Boolean)) {
		const m = /^(?:([^:]{1,20}):)?\s*(-?\d+(?:\.\d+)?)$/.exec(item);
		const value = m ? Number(m[2]) : NaN;
		if (!m || value < range.min || value > range.max || unprintable.test(item)) return { ok: false, refusals: [refusal('', allowsText)] };
		out.push({ label: m[1]?.trim() ?? '', value });
	}
	if (out.length > maxListEntries) return { ok: false, refusals: [refusal('', `at most ${maxListEntries} entries`)] };
	return { ok: true, value: out };
}

/** The hub's size: a diameter, or one from a measured circumference; not both, not neither. */
export function hubDiameterOf(v: { diameter?: unknown; circumference?: unknown }): Checked<number> {
	const d = v.diameter as number | undefined;
	const c = v.circumference as number | undefined;
	if (d !== undefined && c !== undefined)
		return { ok: false, refusals: [refusal('circumference', 'give either diameter or circumference, not both')] };
	if (d === undefined && c === undefined) return { ok: false, refusals: [refusal('diameter', 'required (or give circumference instead)')] };
	return { ok: true, value: d ?? diameterFromCircumference(c!) };
}

export interface CheckedTape {
	units: Units;
	paper: 'a4' | 'letter';
	spec: TapeSpec;
}

/**
 * The tape's parameters as flat strings (query, form, a saved record) read and checked: the tape,
 * or the first reason per field, in the order found. The page and the API call this same check.
 */
export function checkTape(params: Partial<Record<string, string>>): Checked<CheckedTape> {
	const units = readUnits(params);
	if (!units.ok) return units;
	const read = tapeRegistry.read(params, units.value);
	const refusals: Refusal[] = read.ok ? [] : [...read.refusals];
	const v = read.ok ? read.value : {};
	const text = (name: TapeParam) => (params[name] ?? '').trim();

	const windowText = text('window') || 'full';
	const windowDeg = windowText === 'full' ? 180 : Number(windowText);
	if (windowText !== 'full' && !(windowDeg >= 5 && windowDeg <= 180)) {
		refusals.push(refusal('window', allows(tapeRegistry.get('window')!, units.value)));
	}
	const list = (name: 'timing' | 'tdc2') => {
		const r = readLabelled(text(name), listRanges[name], allows(tapeRegistry.get(name)!, units.value));
		if (!r.ok) refusals.push(...r.refusals.map((x) => ({ ...x, field: name })));
		return r.ok ? r.value : [];
	};
	const timing = list('timing');
	const tdc2 = list('tdc2');
	if (refusals.length) return { ok: false, refusals: firstPerField(refusals) };

	const hub = hubDiameterOf(v);
	const tick = v.tick as number;
	const multiple = (a: number) => Math.abs(a / tick - Math.round(a / tick)) < 1e-9;
	const more: Refusal[] = hub.ok ? [] : [...hub.refusals];
	if (!multiple(v.mid as number)) more.push(refusal('mid', `a multiple of the tick spacing (${tick}°)`));
	if (!multiple(v.label as number)) more.push(refusal('label', `a multiple of the tick spacing (${tick}°)`));
	if (!hub.ok || more.length) return { ok: false, refusals: firstPerField(more) };
	return {
		ok: true,
		value: {
			units: units.value,
			paper: v.paper as CheckedTape['paper'],
			spec: {
				hubDiameterMm: hub.value,
				paperThicknessMm: v.paperThickness as number,
				rotation: v.rotation as TapeSpec['rotation'],
				windowDeg,
				tickDeg: tick,
				midEveryDeg: v.mid as number,
				labelEveryDeg: v.label as number,
				timingMarks: timing.map((t) => ({ label: t.label || `${t.value}° BTDC`, btdcDeg: t.value })),
				otherTdc: tdc2.map((t, i) => ({ label: t.label || `TDC ${i + 2}`, atdcDeg: t.value }))
			}
		}
	};
}

export type ParsedTape = CheckedTape;

/** `checkTape` in the shape its callers had before (a field → `field: message` map), for the build sheet until it moves to refusals. */
export function parseTape(
	params: Partial<Record<string, string>>
): { ok: true; value: CheckedTape } | { ok: false; errors: Record<string, string> } {
	const checked = checkTape(params);
	return checked.ok ? checked : { ok: false, errors: namedErrors(checked.refusals) };
}
