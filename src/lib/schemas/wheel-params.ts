import { woodruffNumbers } from '$lib/trade/keys';
import { common } from './common-params';
import { defineRegistry, type ParamDef, type Params } from './registry';

// The wheel's public parameters, each once: the designer's form, the address query, the wheel API,
// the refusals and the revision comparison all read them from here. Ranges are in mm (a length is
// read in the caller's units). `appliesWhen` says which choices make a parameter mean something:
// a Woodruff number means nothing without a Woodruff keyway. Cross-field rules (missing < teeth,
// holes clear of the bore …) are the trade library's (src/lib/trade/checks.ts).

const keyed = (p: Params) => p.keyway !== undefined && p.keyway !== '' && p.keyway !== 'none';
const withBolts = (p: Params) => Number(p.bolts) > 0;
const withBalance = (p: Params) => Number(p.balanceCount) > 0;
const angle = { kind: 'angle', min: -360, max: 360, default: '0' } as const;
const length = (minMm: number, maxMm: number) => ({ kind: 'length', minMm, maxMm }) as const;

/** Each definition, with `starts` on the fields a new design's form starts filled in (a 36-1 wheel for a small single). */
const defs = [
	{ ...common.units, starts: true },
	{ ...common.pattern, starts: true },
	{ ...common.teeth, default: '36', starts: true },
	{ ...common.missing, default: '1', starts: true },
	{ ...common.gaps, default: '' },
	common.extraAfter,
	{ ...common.duty, default: '0.5', starts: true },
	{ ...common.od, required: true, default: { mm: '100', in: '4' }, starts: true },
	{
		name: 'depth',
		label: 'Tooth depth',
		help: 'From the tooth tips to the roots.',
		...length(0.2, 200),
		required: true,
		default: { mm: '5', in: '3/16' },
		starts: true
	},
	{
		name: 'tipRadius',
		label: 'Tip corner radius',
		help: 'Empty or 0 for sharp corners.',
		...length(0, 50),
		default: '0',
		whenEmpty: '0 (sharp)'
	},
	{
		name: 'rootRadius',
		label: 'Root corner radius',
		help: 'Empty or 0 for sharp corners.',
		...length(0, 50),
		default: '0',
		whenEmpty: '0 (sharp)'
	},
	{ name: 'bore', label: 'Bore', help: '0 for no bore.', ...length(0, 1900), default: { mm: '20', in: '3/4' }, starts: true },
	{
		name: 'keyway',
		label: 'Keyway',
		kind: 'choice',
		values: ['none', 'custom', 'din6885', 'b17.1', 'woodruff'],
		labels: {
			none: 'None',
			custom: 'Custom size',
			din6885: 'DIN 6885-1 parallel key',
			'b17.1': 'ANSI B17.1 square key',
			woodruff: 'Woodruff key (ANSI B17.2)'
		},
		default: 'none',
		whenEmpty: 'None'
	},
	{ name: 'keyWidth', label: 'Key slot width', ...length(0.5, 100), appliesWhen: (p) => p.keyway === 'custom' },
	{
		name: 'keyDepth',
		label: 'Key slot depth',
		help: 'Into the hub from the bore, at the slot’s centre line.',
		...length(0.2, 50),
		appliesWhen: (p) => p.keyway === 'custom'
	},
	{
		name: 'shaft',
		label: 'Shaft diameter',
		help: 'The key is looked up by shaft diameter.',
		...length(1, 500),
		appliesWhen: (p) => p.keyway === 'din6885' || p.keyway === 'b17.1'
	},
	{
		name: 'woodruff',
		label: 'Woodruff key number',
		help: 'A standard number such as 404, 606 or 617-1: width in 32nds, then diameter in 8ths of an inch.',
		kind: 'text',
		max: 8,
		allows: `one of the ANSI B17.2 key numbers ${woodruffNumbers.join(', ')}`,
		appliesWhen: (p) => p.keyway === 'woodruff'
	},
	{ ...common.keywayAngle, appliesWhen: keyed },
	{ name: 'bolts', label: 'Bolt holes', help: 'Empty or 0 for none.', kind: 'whole', min: 0, max: 24, default: '0', whenEmpty: 'none' },
	{ name: 'pcd', label: 'Bolt circle PCD', ...length(2, 1990), appliesWhen: withBolts },
	{ name: 'boltHole', label: 'Bolt hole diameter', ...length(0.5, 100), appliesWhen: withBolts },
	{ name: 'boltAngle', label: 'First bolt hole angle', ...angle, appliesWhen: withBolts },
	{ name: 'balanceCount', label: 'Balance holes', kind: 'whole', min: 0, max: 8, default: '0', whenEmpty: 'none' },
	{ name: 'balancePcd', label: 'Balance hole circle PCD', ...length(2, 1990), appliesWhen: withBalance },
	{ name: 'balanceHole', label: 'Balance hole diameter', ...length(0.5, 200), appliesWhen: withBalance },
	{ name: 'balanceAngle', label: 'First balance hole angle', ...angle, appliesWhen: withBalance },
	{
		name: 'balanceSpacing',
		label: 'Balance hole spacing',
		help: 'Between neighbouring holes; empty spreads them evenly round the circle.',
		kind: 'angle',
		min: 0,
		max: 180,
		whenEmpty: 'spread evenly',
		appliesWhen: withBalance
	},
	{
		name: 'mark',
		label: 'Index mark angle',
		help: 'Where TDC is marked; 0 puts it at tooth 0’s leading edge.',
		// `none`, or an angle: read by the check.
		kind: 'free',
		allows: 'none, or an angle from -360 to 360°',
		default: '0',
		whenEmpty: '0° (tooth 0’s leading edge)'
	},
	{
		name: 'label',
		label: 'Etched label',
		help: 'Up to 40 characters, etched opposite the index mark.',
		kind: 'text',
		max: 40,
		// Etched as one line; a line break or control character would also break the DXF's group codes.
		allows: 'one line of text, at most 40 characters (no line breaks, control or direction-override characters)',
		default: '',
		whenEmpty: 'no label'
	},
	{
		name: 'etchRing',
		label: 'Degree ring diameter',
		help: 'Etches a crank-degree scale (0 at the index mark, BTDC and ATDC marked) round the wheel at this outer diameter, on its own DXF layer; empty for none.',
		...length(20, 1990),
		whenEmpty: 'none'
	},
	common.rotation,
	{ name: 'material', label: 'Material', kind: 'choice', values: ['steel', 'stainless', 'aluminium', 'custom'], default: 'steel' },
	{ name: 'density', label: 'Density', kind: 'number', min: 0.5, max: 25, unit: ' g/cm³', appliesWhen: (p) => p.material === 'custom' },
	{
		name: 'thickness',
		label: 'Thickness',
		help: 'Of the plate the wheel is cut from.',
		...length(0.2, 50),
		default: { mm: '3', in: '1/8' },
		starts: true
	},
	{ ...common.rpm, starts: true },
	{
		name: 'grade',
		label: 'Balance grade',
		help: 'ISO 21940-11; a higher grade number allows more residual unbalance.',
		kind: 'number',
		min: 0.4,
		max: 100,
		unit: ' mm/s',
		default: '6.3',
		starts: true
	},
	common.paper
] as const satisfies readonly (ParamDef & { starts?: boolean })[];

export const wheelParams = defineRegistry(defs);
export type WheelParamName = (typeof wheelParams.names)[number];

/** The parameters that are lengths, so they follow the units switch. */
export const lengthParams: readonly string[] = wheelParams.params.filter((p) => p.kind === 'length').map((p) => p.name);

/** What a new design's form holds: the filled-in starting values in these units; the rest start empty and take their default. */
export function newWheel(units: 'mm' | 'in'): Params {
	const defaults = wheelParams.defaults(units);
	return { ...Object.fromEntries(defs.filter((d) => 'starts' in d && d.starts).map((d) => [d.name, defaults[d.name]!])), units };
}

/** A saved or shared set of parameters with a new design's values under what it leaves out. */
export const filledWheel = (p: Params): Params => ({ ...newWheel(p.units === 'in' ? 'in' : 'mm'), ...p });

/**
 * The wheel parameters that mean something with the choices made, without empty ones and without
 * names the wheel does not take. What the form keeps for a choice not made stays in the form, so
 * switching back brings it back, but is not sent, saved or checked.
 */
export function applying(p: Partial<Record<string, string>>): Params {
	const given = Object.fromEntries(Object.entries(p).filter((e): e is [string, string] => e[1] !== undefined && e[1].trim() !== ''));
	const applies = wheelParams.params.filter((d) => d.name in given && (d.appliesWhen?.(given) ?? true));
	return Object.fromEntries(applies.map((d) => [d.name, given[d.name]!]));
}
