import { cycleDeg, layoutChoices, layouts, legacyVTwin, vAngleRange, vTwin, type Layout, type Stroke } from '$lib/trade/engine';
import { patternRefusals } from '$lib/trade/pattern';
import { keyFromSensorFrom, toothAtTdcFrom, type MeasuredAngles, type PhasingInput } from '$lib/trade/phasing';
import { summarize, type WheelSummary } from '$lib/trade/summary';
import type { TdcResult } from '$lib/trade/tdc';
import { parseLengthWithUnit, type Units } from '$lib/trade/units';
import { common } from './common-params';
import { firstPerField, refusal, type Checked, type Refusal } from './refusal';
import { allows, defineRegistry, givenParams, type ParamDef, type Params } from './registry';
import { checkTdc } from './tdc';
import { singleLine } from './text';
import { gapsField, patternOf, readWheel, type ParsedWheel } from './wheel';
import { wheelParams } from './wheel-params';

// The phasing check's public parameters (query or form), flat strings; and the build sheet's.
// Where the sensor is can be said two ways (`input`): `tooth`, the tooth under the sensor with
// cylinder 1 at TDC (`toothAtTdc`); or `angles`, measured on the engine: `sensorAngle` and
// `keyAngle` in crank degrees before the TDC mark, `keywayAngle` on the wheel (the designer's
// parameter of that name), from which toothAtTdcFrom works out the tooth.

/** Typical upper limits of the sensor's output, Hz (from memory; the data sheet wins). */
export const sensorDefaults = { hall: 15000, vr: 10000 } as const;

export const inputKinds = ['tooth', 'angles'] as const;
const layoutIds = layoutChoices.map((l) => l.id) as [string, ...string[]];
const byAngles = (p: Params) => p.input === 'angles';
const beforeMark = '° before the TDC mark';

export const phasingParams = defineRegistry([
	// The wheel's pattern parameters, with the wheel's names and labels.
	common.pattern,
	{ ...common.teeth, min: 2 },
	{ ...common.missing, default: '1' },
	common.gaps,
	common.extraAfter,
	{ ...common.duty, default: '0.5' },
	{
		name: 'mount',
		label: 'Shaft the wheel turns with',
		help: 'The crankshaft, or a camshaft, which turns at half crank speed: one wheel degree is then two crank degrees.',
		kind: 'choice',
		values: ['crank', 'cam'],
		labels: { crank: 'Crankshaft', cam: 'Camshaft (half speed)' },
		default: 'crank'
	},
	{
		name: 'layout',
		label: 'Layout',
		help: 'The cylinders and the crank. Empty: single-4, or the firing intervals given.',
		kind: 'choice',
		// Earlier ids (v-twin-45 …) are still read; the refusal names only today's.
		values: [...layoutIds, 'v-twin-45', 'v-twin-60', 'v-twin-75', 'v-twin-90'],
		allows: `one of ${layoutIds.join(', ')}`
	},
	{
		name: 'vAngle',
		label: 'V angle',
		help: `Between the two cylinders’ axes, ${vAngleRange.min} to ${vAngleRange.max}°, decimals allowed. Both rods on one crankpin: cylinder 2 fires 360° + V after cylinder 1, then cylinder 1 360° − V later.`,
		kind: 'number',
		min: vAngleRange.min,
		max: vAngleRange.max,
		unit: '°',
		appliesWhen: (p) => p.layout === 'v-twin'
	},
	{
		name: 'stroke',
		label: 'Stroke',
		help: 'Without a layout: 4 unless given; a layout says its own.',
		kind: 'choice',
		values: ['4', '2'],
		labels: { '4': '4-stroke', '2': '2-stroke' },
		allows: '2 or 4',
		appliesWhen: (p) => !p.layout
	},
	{
		name: 'intervals',
		label: 'Firing intervals',
		help: 'Crank degrees from each cylinder’s firing to the next, from cylinder 1 round to cylinder 1 again, like 270, 450.',
		kind: 'free',
		allows: 'crank degrees between firings, like 270, 450',
		appliesWhen: (p) => !p.layout
	},
	{ name: 'cylinders', label: 'Cylinders', help: 'A check on the intervals: one per cylinder.', kind: 'whole', min: 1, max: 12 },
	{
		name: 'input',
		label: 'Say where the sensor sits by',
		help: 'tooth: the tooth under the sensor at TDC; angles: the sensor’s and the key’s places measured on the engine.',
		kind: 'choice',
		values: inputKinds,
		labels: { tooth: 'Tooth at TDC', angles: 'Measured angles' },
		default: 'tooth'
	},
	// The measurement of the input chosen is required: checkPhasing asks for it (see there).
	{
		name: 'toothAtTdc',
		label: 'Tooth at the sensor at TDC',
		help: 'With cylinder 1 at TDC. Tooth 0 is the first after the gap; fractions allowed: 4.5 is half-way between 4 and 5.',
		kind: 'number',
		min: 0,
		max: 720,
		appliesWhen: (p) => !byAngles(p)
	},
	{
		name: 'sensorAngle',
		label: 'Sensor angle',
		help: 'With cylinder 1 at TDC, crank degrees before the TDC mark; negative when the sensor sits after the mark.',
		kind: 'number',
		min: -720,
		max: 720,
		unit: beforeMark,
		appliesWhen: byAngles
	},
	// The designer's keyway angle; the API has always worded its range as a number's.
	{ ...common.keywayAngle, kind: 'number', unit: '°', appliesWhen: byAngles },
	{
		name: 'keyAngle',
		label: 'Key angle',
		help: 'Where the shaft’s key sits, read like the sensor. Empty is 0: the key in line with the mark.',
		kind: 'number',
		min: -720,
		max: 720,
		unit: beforeMark,
		default: '0',
		appliesWhen: byAngles
	},
	{
		name: 'edge',
		label: 'Tooth edge timed',
		help: 'The edge of each tooth the ECU takes its timing from; the leading edge reaches the sensor first. The ECU’s set-up and the sensor’s wiring decide which.',
		kind: 'choice',
		values: ['leading', 'trailing'],
		labels: { leading: 'Leading', trailing: 'Trailing' },
		default: 'leading'
	},
	common.rpm,
	{ name: 'cranking', label: 'Cranking speed', help: 'Starter speed, rpm.', kind: 'whole', min: 50, max: 2000, default: '200' },
	{
		name: 'sensor',
		label: 'Sensor type',
		kind: 'choice',
		values: ['hall', 'vr'],
		labels: { hall: 'Hall-effect', vr: 'VR' },
		default: 'hall'
	},
	{
		name: 'sensorMaxHz',
		label: 'Sensor’s highest frequency',
		help: `Empty: a typical sensor, Hall-effect ${sensorDefaults.hall} Hz, VR ${sensorDefaults.vr} Hz (from memory; the data sheet wins).`,
		kind: 'number',
		min: 100,
		max: 1_000_000,
		unit: ' Hz'
	},
	{
		name: 'windowFrom',
		label: 'Spark window from',
		help: 'The earliest advance the ECU may fire at.',
		kind: 'number',
		min: -30,
		max: 90,
		unit: '° BTDC',
		default: '45'
	},
	{
		name: 'windowTo',
		label: 'Spark window to',
		help: 'The latest; no more than the window’s start.',
		kind: 'number',
		min: -30,
		max: 90,
		unit: '° BTDC',
		default: '0'
	},
	{ name: 'resolution', label: 'Finest timing step wanted', help: 'Optional.', kind: 'number', min: 0.1, max: 90, unit: '°' },
	{
		name: 'target',
		label: 'First-tooth offset wanted',
		help: 'The angle you want to enter in the ECU, if its maker or your tune asks for one: the keyway angle that gives it follows.',
		kind: 'number',
		min: 0,
		max: 720,
		unit: '° BTDC'
	},
	{
		name: 'keyFromSensor',
		label: 'Where the key sits',
		help: 'With cylinder 1 at TDC: how many wheel degrees the shaft’s key still turns, in the sense of rotation, before it reaches the sensor.',
		kind: 'number',
		min: -360,
		max: 360,
		unit: '°',
		appliesWhen: (p) => !byAngles(p)
	}
]);

export interface ParsedPhasing {
	input: PhasingInput;
	layoutLabel: string;
	sensor: 'hall' | 'vr';
	/** The angles measured on the engine, when the tooth at TDC was worked out from them (`input=angles`). */
	measured: MeasuredAngles | null;
	clocking: { targetDeg: number; keyFromSensorDeg: number } | null;
}

/** The values as the registry reads them (angles in degrees; optional ones undefined when not given). */
interface PhasingValues {
	pattern: 'missing' | 'custom' | 'single' | 'extra';
	teeth: number;
	missing: number;
	gaps?: string;
	extraAfter: number;
	duty: number;
	mount: 'crank' | 'cam';
	layout?: string;
	vAngle?: number;
	stroke?: '2' | '4';
	intervals?: string;
	cylinders?: number;
	input: (typeof inputKinds)[number];
	toothAtTdc?: number;
	sensorAngle?: number;
	keywayAngle: number;
	keyAngle: number;
	edge: 'leading' | 'trailing';
	rpm: number;
	cranking: number;
	sensor: 'hall' | 'vr';
	sensorMaxHz?: number;
	windowFrom: number;
	windowTo: number;
	resolution?: number;
	target?: number;
	keyFromSensor?: number;
}

/**
 * The phasing check, the same on the page, in `GET /api/v1/phasing`, for a build's engine profile
 * and in the build sheet: the parsed input, or the first refusal per field in the order found.
 */
// Refusals name other fields by their labels, as the page shows them.
const quoted = (name: string) => `“${phasingParams.label(name)}”`;
const byAnglesWords = 'when the sensor is given as measured angles';

export function checkPhasing(params: Partial<Record<string, string>>): Checked<ParsedPhasing> {
	const given = givenParams(params);
	const ranges: Refusal[] = [];
	// The measurement of the input chosen: no default could stand in for it, and the refusal says what it takes.
	const measuredField = byAngles(given) ? 'sensorAngle' : 'toothAtTdc';
	if (!(measuredField in given)) ranges.push(refusal(measuredField, allows(phasingParams.get(measuredField)!, 'mm')));
	const read = phasingParams.read(given, 'mm');
	if (!read.ok) ranges.push(...read.refusals);
	const gaps = gapsField.safeParse(given.gaps ?? '');
	if (!gaps.success) ranges.push(...gaps.error.issues.map((i) => refusal('gaps', i.message)));
	if (!read.ok || ranges.length || !gaps.success) return { ok: false, refusals: firstPerField(ranges) };
	const v = read.value as unknown as PhasingValues;

	const found: Refusal[] = [];
	const refuse = (field: string, message: string) => found.push(refusal(field, message));
	const pattern = patternOf({ ...v, gaps: gaps.data });
	for (const r of patternRefusals(pattern)) refuse(r.field, r.message);

	let measured: MeasuredAngles | null = null;
	let toothAtTdc = v.toothAtTdc ?? 0;
	if (v.input === 'angles') {
		if (v.toothAtTdc !== undefined) refuse('toothAtTdc', `not ${byAnglesWords} (it is worked out from the sensor, keyway and key angles)`);
		if (v.keyFromSensor !== undefined) refuse('keyFromSensor', `not ${byAnglesWords} (it follows from the sensor and key angles)`);
		measured = { sensorFromTdcDeg: v.sensorAngle!, keywayDeg: v.keywayAngle, keyFromTdcDeg: v.keyAngle, mount: v.mount };
		toothAtTdc = toothAtTdcFrom({ ...measured, teeth: v.teeth });
	} else {
		// As given, not as defaulted: keyAngle means 0 when empty, but is refused only when given.
		for (const field of ['sensorAngle', 'keyAngle'] as const)
			if (field in given) refuse(field, `only ${byAnglesWords} (or give ${quoted('toothAtTdc')} alone)`);
		if (toothAtTdc >= v.teeth) refuse('toothAtTdc', `0 up to ${v.teeth} (tooth 0 is the first after the gap)`);
	}

	// A V-twin takes its V angle from vAngle, or from the id of earlier versions (v-twin-90).
	const legacyV = legacyVTwin(v.layout);
	const layoutId = legacyV !== null ? 'v-twin' : v.layout;
	let preset: Layout | undefined;
	if (layoutId === 'v-twin') {
		if (legacyV !== null && v.vAngle !== undefined) refuse('vAngle', `not with the ${legacyV}° V-twin layout, which gives its own V angle`);
		const vAngle = legacyV ?? v.vAngle;
		if (vAngle === undefined) refuse('vAngle', `required with the V-twin layout, ${allows(phasingParams.get('vAngle')!, 'mm')}`);
		else preset = vTwin(vAngle);
	} else {
		if (v.vAngle !== undefined) refuse('vAngle', 'only with the V-twin layout');
		preset = layouts.find((l) => l.id === (layoutId ?? (v.intervals ? undefined : 'single-4')));
	}
	const stroke: Stroke = v.stroke ? (Number(v.stroke) as Stroke) : (preset?.stroke ?? 4);
	let intervals = preset?.intervals ?? [];
	if (v.intervals !== undefined) {
		intervals = v.intervals
			.split(/[\s,;]+/)
			.filter(Boolean)
			.map(Number);
		if (intervals.some((i) => !(i > 0 && i <= 720))) refuse('intervals', allows(phasingParams.get('intervals')!, 'mm'));
		else if (Math.abs(intervals.reduce((a, b) => a + b, 0) - cycleDeg(stroke)) > 1e-6) {
			refuse('intervals', `must add up to ${cycleDeg(stroke)}° for a ${stroke}-stroke (one firing per cylinder per cycle)`);
		}
	} else if (preset && v.stroke && preset.stroke !== stroke) {
		refuse('stroke', `the ${preset.label} layout is a ${preset.stroke}-stroke`);
	}
	if (v.cylinders !== undefined && v.cylinders !== intervals.length) refuse('cylinders', `${intervals.length}, one per firing interval`);
	if (v.windowTo > v.windowFrom)
		refuse('windowTo', `no more than ${quoted('windowFrom')} (the window runs from it down to this, in degrees BTDC)`);

	let clocking: ParsedPhasing['clocking'] = null;
	if (measured) {
		// The angles say where the key sits: the target alone is enough.
		if (v.target !== undefined) clocking = { targetDeg: v.target, keyFromSensorDeg: keyFromSensorFrom(measured) };
	} else if (v.target === undefined && v.keyFromSensor !== undefined) {
		refuse('target', `give it with ${quoted('keyFromSensor')}, to get a clocking suggestion`);
	} else if (v.target !== undefined && v.keyFromSensor === undefined) {
		refuse('keyFromSensor', `give it with ${quoted('target')}, to get a clocking suggestion`);
	} else if (v.target !== undefined && v.keyFromSensor !== undefined) {
		clocking = { targetDeg: v.target, keyFromSensorDeg: v.keyFromSensor };
	}
	if (found.length) return { ok: false, refusals: firstPerField(found) };

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
// share `teeth`, `missing`, `duty`, `rpm` and `keywayAngle` with one meaning, plus its own.

/**
 * The wheel's parameters as the sheet's form takes them: every one the phasing check does not
 * already name (that one holds `teeth`, `missing`, `duty` … with the same meaning), without its
 * default, so an empty field is sent as nothing (the address stays short) and the wheel's own check
 * (readWheel) fills it in.
 * `od` and `depth` are asked for: the sheet prints the wheel that is cut, not an example's.
 */
const wheelOnSheet: ParamDef[] = wheelParams.params
	.filter((p) => !phasingParams.get(p.name) && !['od', 'depth'].includes(p.name))
	.map((p) => {
		const copy: ParamDef = { ...p };
		// The choices the sheet's own form shows keep their default (a control shows one of its values).
		if (!['units', 'material', 'paper'].includes(copy.name)) delete copy.default;
		return copy;
	});

/**
 * The build sheet's parameters besides the phasing check's: its own, then every wheel parameter
 * (composed from wheelParams, never a copy of it). The name is `buildName`: on the tools' pages
 * `build` in the address is the id of the build being worked on (src/lib/address-query.svelte.ts).
 */
export const buildSheetParams = defineRegistry([
	{
		name: 'buildName',
		label: 'Build name',
		help: 'Printed at the top; up to 80 characters.',
		kind: 'free',
		allows: 'one line of text, at most 80 characters'
	},
	{
		name: 'revision',
		label: 'Wheel revision',
		help: 'Printed under the name; empty is “unsaved”.',
		kind: 'free',
		allows: 'one line of text, at most 20 characters'
	},
	{
		name: 'tdcA',
		label: 'First piston-stop mark',
		help: 'Optional: the two readings of the TDC finder.',
		kind: 'free',
		allows: 'a piston-stop reading in degrees'
	},
	{ name: 'tdcB', label: 'Second piston-stop mark', kind: 'free', allows: 'a piston-stop reading in degrees' },
	{
		name: 'tapeDiameter',
		label: 'Timing hub diameter',
		help: 'Optional: for the degree tape’s scale.',
		kind: 'length',
		minMm: 10,
		maxMm: 2000
	},
	{ ...common.od, required: true },
	{ ...common.depth, required: true },
	...wheelOnSheet
]);

/** The names the sheet takes besides the wheel's and the phasing check's; `build` is `buildName`'s earlier spelling, still read. */
export const buildSheetKeys = ['buildName', 'build', 'revision', 'tdcA', 'tdcB', 'tapeDiameter'] as const;

export interface ParsedBuildSheet {
	buildName: string;
	revision: string;
	wheel: ParsedWheel;
	summary: WheelSummary;
	phasing: ParsedPhasing;
	tdc: { a: number; b: number; result: TdcResult } | null;
	tapeHubMm: number | null;
}

/** The sheet's own text fields: one line each. */
const sheetText = { buildName: singleLine('buildName', 80), build: singleLine('build', 80), revision: singleLine('revision', 20) };

/**
 * Everything a build sheet needs, from flat parameters, checked the same on the page and in both
 * build-sheet routes; refusals name each field, of either part.
 */
export function checkBuildSheet(params: Partial<Record<string, string>>): Checked<ParsedBuildSheet> {
	const given = givenParams(params);
	const wheel = readWheel(given);
	const phase = checkPhasing(given);
	// Where both refuse a shared name (teeth …), the phasing check's reason: its ranges are the narrower.
	const found: Refusal[] = [...(phase.ok ? [] : phase.refusals), ...(wheel.ok ? [] : wheel.refusals)];
	const text: Record<string, string> = {};
	for (const [field, schema] of Object.entries(sheetText)) {
		const read = schema.safeParse(given[field] ?? '');
		if (read.success) text[field] = read.data;
		else found.push(...read.error.issues.map((i) => refusal(field, i.message)));
	}

	let tdc: ParsedBuildSheet['tdc'] = null;
	const { tdcA, tdcB, tapeDiameter } = given;
	if (tdcA !== undefined || tdcB !== undefined) {
		const marks = checkTdc({ a: tdcA, b: tdcB });
		if (!marks.ok) {
			// The TDC check names its readings a and b: here they are tdcA and tdcB, labelled as such.
			const first = buildSheetParams.label('tdcA').toLowerCase();
			for (const r of marks.refusals)
				found.push(
					refusal(`tdc${r.field.toUpperCase()}`, r.message.replace(/^must differ from the first mark\b/, `must differ from the ${first}`))
				);
		} else if (marks.value.kind === 'rim') found.push(refusal('tdcA', 'a piston-stop reading in degrees'));
		else tdc = { a: marks.value.marks.a.atdcDeg, b: marks.value.marks.b.atdcDeg, result: marks.value.result };
	}
	let tapeHubMm: number | null = null;
	if (tapeDiameter !== undefined) {
		const units: Units = wheel.ok ? wheel.value.units : given.units === 'in' ? 'in' : 'mm';
		const def = buildSheetParams.get('tapeDiameter')!;
		const read = parseLengthWithUnit(tapeDiameter, units);
		tapeHubMm = read.ok ? read.mm : NaN;
		if (!read.ok) found.push(refusal('tapeDiameter', `${read.why}; the timing hub diameter, ${allows(def, units)}`));
		else if (!(tapeHubMm >= 10 && tapeHubMm <= 2000)) found.push(refusal('tapeDiameter', `the timing hub diameter, ${allows(def, units)}`));
	}
	// The wheel's own cross-checks (a tooth deeper than the web allows …), from the trade library.
	const summary = wheel.ok ? summarize(wheel.value.spec, wheel.value.units, wheel.value.running) : null;
	if (summary && !summary.ok) for (const r of summary.refusals) found.push(refusal(r.field, r.message));
	if (!wheel.ok || !phase.ok || !summary?.ok || found.length) {
		return { ok: false, refusals: firstPerField(found.length ? found : [refusal('form', 'this build sheet could not be put together')]) };
	}
	return {
		ok: true,
		value: {
			buildName: text.buildName || text.build || 'Untitled build',
			revision: text.revision || 'unsaved',
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
