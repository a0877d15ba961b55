import { crankMotion } from '$lib/trade/crank-speed';
import { cycleDeg } from '$lib/trade/engine';
import { gapsOf } from '$lib/trade/pattern';
import { defaultCases, type SignalInput, type SpeedCase } from '$lib/trade/signal';
import { checkPhasing, phasingParams, type ParsedPhasing } from './phasing';
import { firstPerField, refusal, type Checked, type Refusal } from './refusal';
import { defineRegistry, givenParams, type ParamDef } from './registry';

// The signal check's public parameters: the phasing check's for the wheel, its clocking and the
// engine (the same names, labels and meanings, so a link from the phasing check opens it as is),
// then its own: the speed of one case, the ECU's gap rule, the run's length and the VR sensor's
// data-sheet point. `rpm` stays the rev limit it is everywhere; given with `swing` or `accel`, it
// is the mean speed of the one case they make.

/** The phasing check's parameters the signal check reads; its spark window and clocking target are its own business. */
const fromPhasing = phasingParams.params.filter(
	(p) => !['windowFrom', 'windowTo', 'resolution', 'target', 'keyFromSensor'].includes(p.name)
);
const isVr = (p: Record<string, string>) => p.sensor === 'vr';

const own = [
	{
		name: 'swing',
		label: 'Speed swing',
		help: 'How much the crank slows through each compression and speeds up after TDC: peak to peak, in percent of the mean speed. With it (or an acceleration), one speed is checked, at the rev limit’s value; without both, cranking, idle, a free rev and the rev limit.',
		kind: 'number',
		min: 0,
		max: 90,
		unit: ' % peak to peak'
	},
	{
		name: 'accel',
		label: 'Acceleration',
		help: 'The mean speed’s steady change while the check runs, rpm per second; negative: slowing down.',
		kind: 'number',
		min: -50_000,
		max: 50_000,
		unit: ' rpm per second'
	},
	{
		name: 'ratio',
		label: 'Gap ratio',
		help: 'The ECU takes a space for the gap when it is longer than this many times the space before it. Empty: midway, in proportion, between an ordinary space (1) and the gap (missing teeth + 1).',
		kind: 'number',
		min: 1.05,
		max: 20
	},
	{
		name: 'afterRatio',
		label: 'Space after the gap',
		help: 'Optional: the space after the gap must also be shorter than this share of the gap.',
		kind: 'number',
		min: 0.05,
		max: 0.99
	},
	{
		name: 'cycles',
		label: 'Engine cycles',
		help: 'How many engine cycles each speed is run over.',
		kind: 'whole',
		min: 1,
		max: 50,
		default: '10'
	},
	{
		name: 'vrVolts',
		label: 'VR output',
		help: 'From the sensor’s data sheet: its peak voltage at the speed below. Optional, with the speed and the ECU’s threshold.',
		kind: 'number',
		min: 0.01,
		max: 500,
		unit: ' V',
		appliesWhen: isVr
	},
	{
		name: 'vrRpm',
		label: 'VR output speed',
		help: 'The speed the data sheet gives that voltage at.',
		kind: 'whole',
		min: 10,
		max: 30_000,
		unit: ' rpm',
		appliesWhen: isVr
	},
	{
		name: 'vrThreshold',
		label: 'ECU input threshold',
		help: 'The peak voltage the ECU’s VR input needs to see a tooth.',
		kind: 'number',
		min: 0.01,
		max: 50,
		unit: ' V',
		appliesWhen: isVr
	}
] as const satisfies ParamDef[];

const ownParams = defineRegistry(own);

export const signalParams = defineRegistry([...fromPhasing, ...own]);

export interface ParsedSignal {
	input: SignalInput;
	/** The wheel and engine as the phasing check read them (its layout's label, the angles measured). */
	phasing: ParsedPhasing;
	/** One case from `swing`/`accel`, or the default cases. */
	given: boolean;
}

interface OwnValues {
	swing?: number;
	accel?: number;
	ratio?: number;
	afterRatio?: number;
	cycles: number;
	vrVolts?: number;
	vrRpm?: number;
	vrThreshold?: number;
}

const quoted = (name: string) => `“${signalParams.label(name)}”`;
const round2 = (x: number) => Math.round(x * 100) / 100;

/**
 * The signal check's input, the same on the page and in `GET /api/v1/signal`: the phasing check's
 * reading of the wheel and engine, then the check's own parameters; the first refusal per field, in
 * the order found.
 */
export function checkSignal(params: Partial<Record<string, string>>): Checked<ParsedSignal> {
	const given = givenParams(params);
	const phase = checkPhasing(given);
	const read = ownParams.read(given, 'mm');
	const found: Refusal[] = [...(phase.ok ? [] : phase.refusals), ...(read.ok ? [] : read.refusals)];
	if (!phase.ok || !read.ok) return { ok: false, refusals: firstPerField(found) };
	const v = read.value as unknown as OwnValues;
	const wheel = phase.value.input;

	if (wheel.pattern.kind === 'single' || wheel.pattern.kind === 'extra') {
		found.push(
			refusal('pattern', 'missing or custom: the check looks for the gap a missing-tooth wheel leaves, which this wheel has none of')
		);
	}
	const gaps = gapsOf(wheel.pattern);
	if (!found.length && !gaps.length) {
		found.push(
			refusal(wheel.pattern.kind === 'custom' ? 'gaps' : 'missing', 'at least one position left out: the check looks for the gap')
		);
	}

	const vrGiven = (['vrVolts', 'vrRpm', 'vrThreshold'] as const).filter((n) => v[n] !== undefined);
	if (vrGiven.length && phase.value.sensor === 'vr') {
		for (const name of ['vrVolts', 'vrRpm', 'vrThreshold'] as const) {
			if (v[name] === undefined) {
				const others = (['vrVolts', 'vrRpm', 'vrThreshold'] as const).filter((n) => n !== name).map(quoted);
				found.push(refusal(name, `give it with ${others.join(' and ')}, for the estimate of the cranking speed the VR output needs`));
			}
		}
	} else if (vrGiven.length) {
		for (const name of vrGiven) found.push(refusal(name, `only for a VR sensor (${quoted('sensor')})`));
	}
	const one = v.swing !== undefined || v.accel !== undefined;
	const cases: SpeedCase[] = one
		? [{ id: 'given', label: 'The speed given', rpm: wheel.revLimitRpm, swingPct: v.swing ?? 0, accelRpmPerS: v.accel ?? 0 }]
		: defaultCases(wheel, wheel.crankingRpm, wheel.revLimitRpm);
	if (one) {
		// A deceleration that stops the engine inside the run leaves nothing to judge after it.
		const motion = crankMotion(wheel, cases[0]!);
		if (Number.isNaN(motion.timeAt(v.cycles * cycleDeg(wheel.stroke)))) {
			found.push(
				refusal('accel', `the engine would stop within the ${v.cycles} cycles checked: less deceleration, fewer cycles or a higher speed`)
			);
		}
	}
	if (found.length) return { ok: false, refusals: firstPerField(found) };

	// The default ratio sits midway in proportion between an ordinary space (1) and the smallest gap's (count + 1).
	const smallest = Math.min(...gaps.map((g) => g.count));
	const ratio = v.ratio ?? round2(Math.sqrt(smallest + 1));
	const sensor = phase.value.sensor;
	return {
		ok: true,
		value: {
			phasing: phase.value,
			given: one,
			input: {
				pattern: wheel.pattern,
				duty: wheel.duty,
				mount: wheel.mount,
				stroke: wheel.stroke,
				intervals: wheel.intervals,
				toothAtTdc: wheel.toothAtTdc,
				edge: wheel.edge,
				cases,
				rule: v.afterRatio === undefined ? { ratio } : { ratio, afterRatio: v.afterRatio },
				cycles: v.cycles,
				sensor: {
					kind: sensor,
					maxHz: wheel.sensorMaxHz,
					...(sensor === 'vr' && v.vrVolts !== undefined ? { vrVolts: v.vrVolts, vrAtRpm: v.vrRpm, thresholdVolts: v.vrThreshold } : {})
				}
			}
		}
	};
}
