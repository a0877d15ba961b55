import { maxDiscMm, maxShaftMm, minDiscMm } from '$lib/trade/degree-wheel';
import { formatLength } from '$lib/trade/units';
import { firstPerField, refusal, type Checked, type Refusal } from './refusal';
import { defineRegistry, readUnits } from './registry';
import { checkTape, tapeRegistry, type CheckedTape } from './tape';

// The printed degree wheel's parameters: the tape's (the hub it goes on, the scale, the marks),
// and the disc's own centre hole. One check, `checkDegreeWheel`, for the route and any page.

/** The disc's own parameter; the label is the wheel's `shaft` label (one label per public name). */
const discParams = [
	{
		name: 'shaft',
		label: 'Shaft diameter',
		help: 'The disc’s centre hole is cut to it; 0 for a centre mark only.',
		kind: 'length',
		minMm: 0,
		maxMm: 500,
		default: { mm: '20', in: '3/4' }
	}
] as const;

export const degreeWheelRegistry = defineRegistry([...tapeRegistry.params, ...discParams]);

export interface CheckedDegreeWheel extends CheckedTape {
	shaftMm: number;
}

/** The tape's check, then the disc's: its size on the paper and the centre hole inside the ring of marks. */
export function checkDegreeWheel(params: Partial<Record<string, string>>): Checked<CheckedDegreeWheel> {
	const units = readUnits(params);
	if (!units.ok) return units;
	const tape = checkTape(params);
	const own = defineRegistry(discParams).read(params, units.value);
	const refusals: Refusal[] = [...(tape.ok ? [] : tape.refusals), ...(own.ok ? [] : own.refusals)];
	if (!tape.ok || !own.ok) return { ok: false, refusals: firstPerField(refusals) };
	const { spec, paper } = tape.value;
	const shaftMm = own.value.shaft as number;
	const disc = spec.hubDiameterMm;
	const field = params.circumference?.trim() ? 'circumference' : 'diameter';
	const more: Refusal[] = [];
	if (disc < minDiscMm)
		more.push(refusal(field, `at least ${formatLength(minDiscMm, units.value)} across for a printed disc (the tape fits smaller hubs)`));
	else if (disc > maxDiscMm(paper))
		more.push(
			refusal(field, `at most ${formatLength(maxDiscMm(paper), units.value)} across for a disc on this paper (the tape fits larger hubs)`)
		);
	else if (shaftMm > maxShaftMm(disc))
		more.push(refusal('shaft', `at most ${formatLength(maxShaftMm(disc), units.value)}, so the hole leaves the ring of marks whole`));
	if (more.length) return { ok: false, refusals: more };
	return { ok: true, value: { ...tape.value, shaftMm } };
}
