import { buildSheetParams, phasingParams } from '$lib/schemas/phasing';
import { givenParams, type ParamDef, type Params, type Registry } from '$lib/schemas/registry';
import { legacyVTwin } from '$lib/trade/engine';
import type { Units } from '$lib/trade/units';

// The phasing page's form as flat strings named like the API, to and from the address query and
// the check. Every name comes from the registries in src/lib/schemas/phasing.ts.

/**
 * The build sheet's fields kept in the page's address. `revision` is left to the API: in a tool's
 * address it names a saved design's revision (src/lib/address-query.svelte.ts, contextParams).
 */
export const sheetFormKeys: readonly string[] = buildSheetParams.names.filter((name) => name !== 'revision');

/** A new check starts from a 36-1 on a four-stroke single: an example, not what the API assumes. */
const example: Params = { teeth: '36', layout: 'single-4', stroke: '4' };

/** Every field of the form, empty where the registries have no default. */
export function formStart(): Params {
	const blank = Object.fromEntries([...phasingParams.names, ...sheetFormKeys].map((name) => [name, '']));
	return { ...blank, ...phasingParams.defaults('mm'), ...buildSheetParams.defaults('mm'), ...example };
}

/** A field's definition, from whichever registry holds it. */
export const defOf = (name: string): ParamDef | undefined => phasingParams.get(name) ?? buildSheetParams.get(name);

/** The unit shown after a field's label here; lengths take the form's units. */
const shownUnits: Record<string, string> = {
	vAngle: '°',
	intervals: 'crank °',
	sensorAngle: 'crank ° before the TDC mark',
	keywayAngle: 'wheel °',
	keyAngle: 'crank ° before the TDC mark',
	rpm: 'rpm',
	cranking: 'rpm',
	sensorMaxHz: 'Hz',
	windowFrom: '° BTDC',
	windowTo: '° BTDC',
	resolution: 'crank °',
	target: '° BTDC',
	keyFromSensor: 'wheel ° before the sensor',
	tdcA: '°',
	tdcB: '°'
};

/** The field's label as the form shows it: the registry's, with its unit. */
export function labelOf(name: string, units: Units): string {
	const def = defOf(name);
	const unit = def?.kind === 'length' ? units : shownUnits[name];
	return `${def?.label ?? name}${unit ? ` (${unit})` : ''}`;
}

function applying(registry: Registry, form: Params, names: readonly string[]): Params {
	const given = givenParams(Object.fromEntries(names.map((name) => [name, (form[name] ?? '').trim()])));
	// `custom` is the form's word for no preset: the intervals typed.
	if (given.layout === 'custom') delete given.layout;
	return Object.fromEntries(Object.entries(given).filter(([name]) => registry.get(name)?.appliesWhen?.(given) ?? true));
}

/** What goes to the phasing check and into the address: the fields that apply with the choices made, as typed. */
export const phasingSent = (form: Params): Params => applying(phasingParams, form, phasingParams.names);

/** The build sheet's own fields, as typed. */
export const sheetSent = (form: Params): Params => applying(buildSheetParams, form, sheetFormKeys);

/** The form from an address: a shared link carries the check; anything it leaves out starts from the defaults. */
export function formFromAddress(query: URLSearchParams): Params {
	const params = formStart();
	for (const key of [...phasingParams.names, ...sheetFormKeys]) {
		const value = query.get(key);
		if (value !== null) params[key] = value;
	}
	// Intervals without a preset are a custom layout.
	if (query.has('intervals') && !query.has('layout')) params.layout = 'custom';
	// Links of earlier versions name the V angle in the layout (v-twin-90): today it has a field of its own.
	const v = legacyVTwin(params.layout);
	if (v !== null) {
		params.layout = 'v-twin';
		if (!query.get('vAngle')) params.vAngle = String(v);
	}
	return params;
}
