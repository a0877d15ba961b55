import { crankMotion } from '$lib/trade/crank-speed';
import { cycleDeg } from '$lib/trade/engine';
import type { SpeedCase } from '$lib/trade/signal';
import { firstPerField, refusal, type Checked, type Refusal } from './refusal';
import { defineRegistry, givenParams, type ParamDef } from './registry';
import { checkSignal, signalParams, type ParsedSignal } from './signal';

// The signal page's four speed cases, each editable: the signal check (checkSignal) runs cranking,
// idle, a free rev and the rev limit from their defaults, or one case from `swing` and `accel`; the
// page and a check saved in a build give each case its own speed, swing and acceleration. The
// cranking case's speed is the phasing check's `cranking`, the rev limit's its `rpm`; the others'
// are named here. Each is read with the registry's own definition of `swing` and `accel`, so the
// ranges and units are the API's. Isomorphic: the page runs it live, the server when it saves.

/** Each case's field names, by the case's id in defaultCases (src/lib/trade/signal.ts). */
export const caseFields = [
	{ id: 'cranking', title: 'Cranking', rpm: 'cranking', swing: 'crankingSwing', accel: 'crankingAccel' },
	{ id: 'idle', title: 'Idle', rpm: 'idleRpm', swing: 'idleSwing', accel: 'idleAccel' },
	{ id: 'free-rev', title: 'Free rev', rpm: 'freeRevRpm', swing: 'freeRevSwing', accel: 'freeRevAccel' },
	{ id: 'rev-limit', title: 'Rev limit', rpm: 'rpm', swing: 'revLimitSwing', accel: 'revLimitAccel' }
] as const;

const swingDef = signalParams.get('swing')!;
const accelDef = signalParams.get('accel')!;
const speedDef = signalParams.get('cranking')!;

/** The case's own definitions: the registry's ranges under the case's name and label. */
export const caseParams = defineRegistry(
	caseFields.flatMap((c): ParamDef[] => [
		...(c.rpm === 'cranking' || c.rpm === 'rpm'
			? []
			: [{ ...speedDef, name: c.rpm, label: `${c.title} speed`, help: undefined, default: undefined, min: 100, max: 30_000 } as ParamDef]),
		{ ...swingDef, name: c.swing, label: `${c.title} swing`, help: undefined, default: undefined },
		{ ...accelDef, name: c.accel, label: `${c.title} acceleration`, help: undefined, default: undefined }
	])
);

/** Every name the page's check reads: the signal check's, less its one-case pair, and the cases'. */
export const signalCaseNames: readonly string[] = [
	...signalParams.names.filter((n) => n !== 'swing' && n !== 'accel'),
	...caseParams.names
];

const label = (name: string) => caseParams.get(name)?.label ?? signalParams.label(name);

/**
 * The signal check with each of the four cases as given (else its default): the parsed input the
 * API's check reads, its cases replaced. The first refusal per field, in the order found.
 */
export function checkSignalCases(params: Partial<Record<string, string>>): Checked<ParsedSignal> {
	const given = givenParams(params);
	delete given.swing;
	delete given.accel;
	const base = checkSignal(given);
	const read = caseParams.read(given, 'mm');
	const found: Refusal[] = [...(base.ok ? [] : base.refusals), ...(read.ok ? [] : read.refusals)];
	if (!base.ok || !read.ok) return { ok: false, refusals: firstPerField(found) };
	const values = read.value as unknown as Record<string, number | undefined>;
	const input = base.value.input;
	const cases: SpeedCase[] = input.cases.map((c) => {
		const f = caseFields.find((x) => x.id === c.id);
		if (!f) return c;
		const rpm = f.rpm === 'cranking' || f.rpm === 'rpm' ? c.rpm : (values[f.rpm] ?? c.rpm);
		return { ...c, rpm, swingPct: values[f.swing] ?? c.swingPct, accelRpmPerS: values[f.accel] ?? c.accelRpmPerS };
	});
	const end = input.cycles * cycleDeg(input.stroke);
	cases.forEach((c) => {
		const f = caseFields.find((x) => x.id === c.id);
		// A deceleration that stops the engine inside the run leaves nothing to judge after it.
		if (f && Number.isNaN(crankMotion(input, c).timeAt(end)))
			found.push(
				refusal(f.accel, `the engine would stop within the ${input.cycles} cycles checked: less deceleration or a higher ${label(f.rpm)}`)
			);
	});
	if (found.length) return { ok: false, refusals: firstPerField(found) };
	return { ok: true, value: { ...base.value, input: { ...input, cases } } };
}
