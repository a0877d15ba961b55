import { z } from 'zod';
import { cycleDeg, layoutChoices, layouts, legacyVTwin, vAngleRange, vTwin, type Layout, type Stroke } from '$lib/trade/engine';
import { patternRefusals } from '$lib/trade/pattern';
import { keyFromSensorFrom, toothAtTdcFrom, type MeasuredAngles, type PhasingInput } from '$lib/trade/phasing';
import { summarize, type WheelSummary } from '$lib/trade/summary';
import type { TdcResult } from '$lib/trade/tdc';
import { formatLength, parseLength, toMm } from '$lib/trade/units';
import type { FieldErrors } from './form';
import { findTdc } from './tdc';
import { singleLine } from './text';
import { gapsField, parseWheel, patternKinds, patternOf, type ParsedWheel } from './wheel';

// The phasing check's public parameters (query or form), flat strings. Refusals name the field.
// Where the sensor is can be said two ways (`input`): `tooth`, the tooth under the sensor with
// cylinder 1 at TDC (`toothAtTdc`); or `angles`, measured on the engine: `sensorAngle` and
// `keyAngle` in crank degrees before the TDC mark, `keywayAngle` on the wheel (the designer's
// parameter of that name), from which toothAtTdcFrom works out the tooth.

/** Typical upper limits of the sensor's output, Hz (from memory; the data sheet wins). */
export const sensorDefaults = { hall: 15000, vr: 10000 } as const;

const oneOf = <T extends readonly [string, ...string[]]>(field: string, values: T) => z.enum(values, { error: `${field}: one of ${values.join(', ')}` });
const number = (field: string, min: number, max: number, unit = '') => {
	const range = `${field}: a number from ${min} to ${max}${unit}`;
	return z.coerce.number({ error: range }).min(min, { error: range }).max(max, { error: range });
};
const whole = (field: string, min: number, max: number) => number(field, min, max).int({ error: `${field}: a whole number from ${min} to ${max}` });

export const inputKinds = ['tooth', 'angles'] as const;
const layoutIds = layoutChoices.map((l) => l.id) as [string, ...string[]];
// Earlier ids (v-twin-45 …) are still read; the refusal names only today's.
const layoutField = z.enum([...layoutIds, 'v-twin-45', 'v-twin-60', 'v-twin-75', 'v-twin-90'], { error: `layout: one of ${layoutIds.join(', ')}` });

const schema = z.object({
	// The wheel's pattern parameters, with the wheel's names (src/lib/schemas/wheel.ts).
	pattern: oneOf('pattern', patternKinds).default('missing'),
	teeth: whole('teeth', 2, 720),
	missing: whole('missing', 0, 719).default(1),
	gaps: gapsField,
	extraAfter: whole('extraAfter', 0, 719).default(0),
	duty: number('duty', 0.05, 0.95).default(0.5),
	mount: oneOf('mount', ['crank', 'cam'] as const).default('crank'),
	layout: layoutField.optional(),
	vAngle: number('vAngle', vAngleRange.min, vAngleRange.max, '°').optional(),
	stroke: z.enum(['2', '4'], { error: 'stroke: 2 or 4' }).optional(),
	intervals: z.string().optional(),
	cylinders: whole('cylinders', 1, 12).optional(),
	input: oneOf('input', inputKinds).default('tooth'),
	toothAtTdc: number('toothAtTdc', 0, 720).optional(),
	sensorAngle: number('sensorAngle', -720, 720, '° before the TDC mark').optional(),
	keywayAngle: number('keywayAngle', -360, 360, '°').default(0),
	keyAngle: number('keyAngle', -720, 720, '° before the TDC mark').optional(),
	edge: oneOf('edge', ['leading', 'trailing'] as const).default('leading'),
	rpm: whole('rpm', 100, 30000).default(8000),
	cranking: whole('cranking', 50, 2000).default(200),
	sensor: oneOf('sensor', ['hall', 'vr'] as const).default('hall'),
	sensorMaxHz: number('sensorMaxHz', 100, 1_000_000, ' Hz').optional(),
	windowFrom: number('windowFrom', -30, 90, '° BTDC').default(45),
	windowTo: number('windowTo', -30, 90, '° BTDC').default(0),
	resolution: number('resolution', 0.1, 90, '°').optional(),
	target: number('target', 0, 720, '° BTDC').optional(),
	keyFromSensor: number('keyFromSensor', -360, 360, '°').optional()
});

export interface ParsedPhasing {
	input: PhasingInput;
	layoutLabel: string;
	sensor: 'hall' | 'vr';
	/** The angles measured on the engine, when the tooth at TDC was worked out from them (`input=angles`). */
	measured: MeasuredAngles | null;
	clocking: { targetDeg: number; keyFromSensorDeg: number } | null;
}

export function parsePhasing(params: Record<string, string | undefined>): { ok: true; value: ParsedPhasing } | { ok: false; errors: FieldErrors } {
	const given = Object.fromEntries(Object.entries(params).filter(([, v]) => v !== undefined && v !== ''));
	// What is required depends on the input chosen: a placeholder that fails makes the refusal say the range.
	const angles = given.input === 'angles';
	const parsed = schema.safeParse({ teeth: 'missing', ...(angles ? { sensorAngle: 'missing' } : { toothAtTdc: 'missing' }), ...given });
	const errors: FieldErrors = {};
	if (!parsed.success) {
		for (const issue of parsed.error.issues) errors[String(issue.path[0] ?? 'form')] ??= issue.message;
		return { ok: false, errors };
	}
	const v = parsed.data;
	const pattern = patternOf(v);
	for (const r of patternRefusals(pattern)) errors[r.field] ??= r.message;

	let measured: MeasuredAngles | null = null;
	let toothAtTdc = v.toothAtTdc ?? 0;
	if (v.input === 'angles') {
		const derivedFrom = 'it is worked out from sensorAngle, keywayAngle and keyAngle';
		if (v.toothAtTdc !== undefined) errors.toothAtTdc = `toothAtTdc: not with input=angles (${derivedFrom})`;
		if (v.keyFromSensor !== undefined) errors.keyFromSensor = 'keyFromSensor: not with input=angles (it follows from sensorAngle and keyAngle)';
		measured = { sensorFromTdcDeg: v.sensorAngle!, keywayDeg: v.keywayAngle, keyFromTdcDeg: v.keyAngle ?? 0, mount: v.mount };
		toothAtTdc = toothAtTdcFrom({ ...measured, teeth: v.teeth });
	} else {
		for (const field of ['sensorAngle', 'keyAngle'] as const) {
			if (v[field] !== undefined) errors[field] = `${field}: only with input=angles (or give toothAtTdc alone)`;
		}
		if (toothAtTdc >= v.teeth) errors.toothAtTdc = `toothAtTdc: 0 up to ${v.teeth} (tooth 0 is the first after the gap)`;
	}

	// A V-twin takes its V angle from vAngle, or from the id of earlier versions (v-twin-90).
	const legacyV = legacyVTwin(v.layout);
	const layoutId = legacyV !== null ? 'v-twin' : v.layout;
	let preset: Layout | undefined;
	if (layoutId === 'v-twin') {
		if (legacyV !== null && v.vAngle !== undefined) errors.vAngle = `vAngle: only with layout=v-twin (${v.layout} says its V angle)`;
		const vAngle = legacyV ?? v.vAngle;
		if (vAngle === undefined) errors.vAngle = `vAngle: required with layout=v-twin, a number from ${vAngleRange.min} to ${vAngleRange.max}°`;
		else preset = vTwin(vAngle);
	} else {
		if (v.vAngle !== undefined) errors.vAngle = 'vAngle: only with layout=v-twin';
		preset = layouts.find((l) => l.id === (layoutId ?? (v.intervals ? undefined : 'single-4')));
	}
	const stroke: Stroke = v.stroke ? (Number(v.stroke) as Stroke) : (preset?.stroke ?? 4);
	let intervals = preset?.intervals ?? [];
	if (v.intervals !== undefined) {
		intervals = v.intervals.split(/[\s,;]+/).filter(Boolean).map(Number);
		if (intervals.some((i) => !(i > 0 && i <= 720))) errors.intervals = 'intervals: crank degrees between firings, like 270, 450';
		else if (Math.abs(intervals.reduce((a, b) => a + b, 0) - cycleDeg(stroke)) > 1e-6) {
			errors.intervals = `intervals: must add up to ${cycleDeg(stroke)}° for a ${stroke}-stroke (one firing per cylinder per cycle)`;
		}
	} else if (preset && v.stroke && preset.stroke !== stroke) {
		errors.stroke = `stroke: the ${preset.label} layout is a ${preset.stroke}-stroke`;
	}
	if (v.cylinders !== undefined && v.cylinders !== intervals.length) errors.cylinders = `cylinders: ${intervals.length}, one per firing interval`;
	if (v.windowTo > v.windowFrom) errors.windowTo = 'windowTo: no more than windowFrom (the window runs from windowFrom down to windowTo degrees BTDC)';

	let clocking: ParsedPhasing['clocking'] = null;
	if (measured) {
		// The angles say where the key sits: the target alone is enough.
		if (v.target !== undefined) clocking = { targetDeg: v.target, keyFromSensorDeg: keyFromSensorFrom(measured) };
	} else if ((v.target === undefined) !== (v.keyFromSensor === undefined)) {
		errors[v.target === undefined ? 'target' : 'keyFromSensor'] = 'target and keyFromSensor: give both to get a clocking suggestion';
	} else if (v.target !== undefined && v.keyFromSensor !== undefined) {
		clocking = { targetDeg: v.target, keyFromSensorDeg: v.keyFromSensor };
	}
	if (Object.keys(errors).length) return { ok: false, errors };

	return {
		ok: true,
		value: {
			layoutLabel: preset?.label ?? `${intervals.length} cylinders, ${stroke}-stroke, intervals ${intervals.join('/')}°`,
			sensor: v.sensor,
			measured,
			clocking,
			input: {
				pattern,
				duty: v.duty,
				mount: v.mount,
				stroke,
				intervals,
				toothAtTdc,
				edge: v.edge,
				revLimitRpm: v.rpm,
				crankingRpm: v.cranking,
				sensorMaxHz: v.sensorMaxHz ?? sensorDefaults[v.sensor],
				windowFromBtdc: v.windowFrom,
				windowToBtdc: v.windowTo,
				resolutionDeg: v.resolution
			}
		}
	};
}

// ---- Build sheet ----
// The sheet's parameters are the wheel's (src/lib/schemas/wheel.ts) and the phasing check's, which
// share `teeth`, `missing`, `duty`, `rpm` and `keywayAngle` with one meaning, plus these.

/**
 * The build sheet's own parameters, besides the wheel's and the phasing check's. `build` is the
 * name's earlier spelling, still read: on the tools' pages `build` in the address is the id of the
 * build being worked on (src/lib/address-query.svelte.ts), so the name is `buildName`.
 */
export const buildSheetKeys = ['buildName', 'build', 'revision', 'tdcA', 'tdcB', 'tapeDiameter'] as const;

const sheetExtra = z.object({
	buildName: singleLine('buildName', 80).default(''),
	build: singleLine('build', 80).default(''),
	revision: singleLine('revision', 20).default(''),
	tdcA: z.string().optional(),
	tdcB: z.string().optional(),
	tapeDiameter: z.string().optional()
});

export interface ParsedBuildSheet {
	buildName: string;
	revision: string;
	wheel: ParsedWheel;
	summary: WheelSummary;
	phasing: ParsedPhasing;
	tdc: { a: number; b: number; result: TdcResult } | null;
	tapeHubMm: number | null;
}

/** Everything a build sheet needs, from flat parameters; refusals name each field, of either part. */
export function parseBuildSheet(params: Record<string, string | undefined>): { ok: true; value: ParsedBuildSheet } | { ok: false; errors: FieldErrors } {
	const given = Object.fromEntries(Object.entries(params).filter(([, v]) => v !== undefined && v !== '')) as Record<string, string>;
	const wheel = parseWheel(given);
	const phase = parsePhasing(given);
	const more = sheetExtra.safeParse(given);
	const errors: FieldErrors = { ...(wheel.ok ? {} : wheel.errors), ...(phase.ok ? {} : phase.errors) };
	if (!more.success) for (const i of more.error.issues) errors[String(i.path[0])] ??= i.message;

	let tdc: ParsedBuildSheet['tdc'] = null;
	const { tdcA, tdcB, tapeDiameter } = given;
	if (tdcA !== undefined || tdcB !== undefined) {
		const marks = findTdc({ a: tdcA, b: tdcB });
		// findTdc names its fields a and b: here they are tdcA and tdcB.
		const rename = (field: string, message: string) => {
			const named = `tdc${field.toUpperCase()}`;
			const text = message.startsWith(`${field}:`) ? `${named}${message.slice(field.length)}` : `${named}: ${message}`;
			errors[named] ??= text.replace(/^tdcB: must differ from a\b/, 'tdcB: must differ from tdcA');
		};
		if (marks.ok === false) for (const [k, m] of Object.entries(marks.errors)) rename(k, m);
		else if (marks.ok === 'rim') errors.tdcA ??= 'tdcA: a piston-stop reading in degrees';
		else tdc = { a: marks.value.marks.a.atdcDeg, b: marks.value.marks.b.atdcDeg, result: marks.value.result };
	}
	let tapeHubMm: number | null = null;
	if (tapeDiameter !== undefined) {
		const units = wheel.ok ? wheel.value.units : given.units === 'in' ? 'in' : 'mm';
		tapeHubMm = toMm(parseLength(tapeDiameter), units);
		const L = (mm: number) => formatLength(mm, units).replace(/\.?0+ /, ' ');
		if (!(tapeHubMm >= 10 && tapeHubMm <= 2000)) errors.tapeDiameter = `tapeDiameter: the timing hub diameter, ${L(10)} to ${L(2000)}`;
	}
	// The wheel's own cross-checks (a tooth deeper than the web allows …), from the trade library.
	const summary = wheel.ok ? summarize(wheel.value.spec, wheel.value.units, wheel.value.running) : null;
	if (summary && !summary.ok) for (const r of summary.refusals) errors[r.field] ??= r.message;
	if (!wheel.ok || !phase.ok || !more.success || !summary?.ok || Object.keys(errors).length) return { ok: false, errors };
	return {
		ok: true,
		value: {
			buildName: more.data.buildName || more.data.build || 'Untitled build',
			revision: more.data.revision || 'unsaved',
			wheel: wheel.value,
			summary: summary.summary,
			// One wheel on the sheet: the phasing check runs on the pattern and duty the wheel is cut
			// with (the phasing check's own defaults, such as missing=1, would describe another wheel).
			phasing: { ...phase.value, input: { ...phase.value.input, pattern: wheel.value.spec.pattern, duty: wheel.value.spec.duty } },
			tdc,
			tapeHubMm
		}
	};
}
