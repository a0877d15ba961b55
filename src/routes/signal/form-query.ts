import { phasingParams } from '$lib/schemas/phasing';
import { givenParams, type ParamDef, type Params } from '$lib/schemas/registry';
import { signalParams } from '$lib/schemas/signal';
import { caseParams, signalCaseNames } from '$lib/schemas/signal-cases';
import type { Units } from '$lib/trade/units';

// The signal page's form as flat strings named like GET /api/v1/signal, to and from the address
// query and the check. Every name comes from the registry in src/lib/schemas/signal.ts.

/** A new check starts from a 36-1 on a four-stroke single with tooth 9 at TDC: an example, not what the API assumes. */
const example: Params = { teeth: '36', missing: '1', layout: 'single-4', stroke: '4', toothAtTdc: '9' };

export const formKeys: readonly string[] = signalCaseNames;

/** Every field of the form, empty where the registry has no default. */
export function formStart(): Params {
	const blank = Object.fromEntries(formKeys.map((name) => [name, '']));
	return { ...blank, ...signalParams.defaults('mm'), ...example };
}

export const defOf = (name: string): ParamDef | undefined => caseParams.get(name) ?? signalParams.get(name) ?? phasingParams.get(name);

/** The unit shown after a field's label, where the registry's kind does not carry one. */
const shownUnits: Record<string, string> = { vAngle: '°', intervals: 'crank °' };

/** The field's label as the form shows it: the registry's, with its unit. */
export function labelOf(name: string, units: Units): string {
	const def = defOf(name);
	const unit = def?.kind === 'length' ? units : def && 'unit' in def && def.unit ? def.unit.trim().replace(/^°$/, '°') : shownUnits[name];
	return `${def?.label ?? name}${unit ? ` (${unit})` : ''}`;
}

/** What goes to the check and into the address: the fields that apply with the choices made, as typed. */
export function signalSent(form: Params): Params {
	const given = givenParams(Object.fromEntries(formKeys.map((name) => [name, (form[name] ?? '').trim()])));
	// `custom` is the form's word for no preset: the intervals typed.
	if (given.layout === 'custom') delete given.layout;
	return Object.fromEntries(Object.entries(given).filter(([name]) => defOf(name)?.appliesWhen?.(given) ?? true));
}

/** The form from an address: a shared link carries the check; anything it leaves out starts from the defaults. */
export function formFromAddress(query: URLSearchParams): Params {
	const params = formStart();
	for (const key of formKeys) {
		const value = query.get(key);
		if (value !== null) params[key] = value;
	}
	// Intervals without a preset are a custom layout.
	if (query.has('intervals') && !query.has('layout')) params.layout = 'custom';
	return params;
}
