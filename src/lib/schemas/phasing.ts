import { z } from 'zod';
import { cycleDeg, layouts, type Stroke } from '$lib/trade/engine';
import type { PhasingInput } from '$lib/trade/phasing';
import type { FieldErrors } from './form';

// The phasing check's public parameters (query or form), flat strings. Refusals name the field.

/** Typical upper limits of the sensor's output, Hz (from memory; the data sheet wins). */
export const sensorDefaults = { hall: 15000, vr: 10000 } as const;

const oneOf = <T extends readonly [string, ...string[]]>(field: string, values: T) => z.enum(values, { error: `${field}: one of ${values.join(', ')}` });
const number = (field: string, min: number, max: number, unit = '') => {
	const range = `${field}: a number from ${min} to ${max}${unit}`;
	return z.coerce.number({ error: range }).min(min, { error: range }).max(max, { error: range });
};
const whole = (field: string, min: number, max: number) => number(field, min, max).int({ error: `${field}: a whole number from ${min} to ${max}` });

const schema = z.object({
	teeth: whole('teeth', 2, 720),
	missing: whole('missing', 0, 719).default(1),
	duty: number('duty', 0.05, 0.95).default(0.5),
	mount: oneOf('mount', ['crank', 'cam'] as const).default('crank'),
	layout: oneOf('layout', layouts.map((l) => l.id) as [string, ...string[]]).optional(),
	stroke: z.enum(['2', '4'], { error: 'stroke: 2 or 4' }).optional(),
	intervals: z.string().optional(),
	cylinders: whole('cylinders', 1, 12).optional(),
	toothAtTdc: number('toothAtTdc', 0, 720),
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
	clocking: { targetDeg: number; keyFromSensorDeg: number } | null;
}

export function parsePhasing(params: Record<string, string | undefined>): { ok: true; value: ParsedPhasing } | { ok: false; errors: FieldErrors } {
	const given = Object.fromEntries(Object.entries(params).filter(([, v]) => v !== undefined && v !== ''));
	const parsed = schema.safeParse({ toothAtTdc: 'missing', teeth: 'missing', ...given });
	const errors: FieldErrors = {};
	if (!parsed.success) {
		for (const issue of parsed.error.issues) errors[String(issue.path[0] ?? 'form')] ??= issue.message;
		return { ok: false, errors };
	}
	const v = parsed.data;
	if (v.missing >= v.teeth) errors.missing = `missing: at most ${v.teeth - 1}, so that a tooth is left of the ${v.teeth} positions`;
	if (v.toothAtTdc >= v.teeth) errors.toothAtTdc = `toothAtTdc: 0 up to ${v.teeth} (tooth 0 is the first after the gap)`;

	const preset = layouts.find((l) => l.id === (v.layout ?? (v.intervals ? undefined : 'single-4')));
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
	if ((v.target === undefined) !== (v.keyFromSensor === undefined)) errors[v.target === undefined ? 'target' : 'keyFromSensor'] = 'target and keyFromSensor: give both to get a clocking suggestion';
	if (Object.keys(errors).length) return { ok: false, errors };

	return {
		ok: true,
		value: {
			layoutLabel: preset?.label ?? `${intervals.length} cylinders, ${stroke}-stroke, intervals ${intervals.join('/')}°`,
			sensor: v.sensor,
			clocking: v.target !== undefined && v.keyFromSensor !== undefined ? { targetDeg: v.target, keyFromSensorDeg: v.keyFromSensor } : null,
			input: {
				pattern: { kind: 'missing', teeth: v.teeth, missing: v.missing },
				duty: v.duty,
				mount: v.mount,
				stroke,
				intervals,
				toothAtTdc: v.toothAtTdc,
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
