// Helpers for the tools' forms, which keep their inputs as flat strings named like the public API.
import { fromMm, parseLengthWithUnit, type Units } from './trade/units';
import type { HoleCircle } from './trade/wheel';
import { valueWords } from './schemas/param-words';
import type { Registry } from './schemas/registry';

export type Params = Record<string, string>;

/** A length as it goes back into a text field: mm to 0.01, inches to 0.0001, no trailing zeros. */
export function lengthText(mm: number, units: Units): string {
	const scale = units === 'in' ? 1e4 : 1e2;
	// Through 12 significant digits first, so a half typed exactly (1/8 in = 3.175 mm, held as
	// 3.17499…) rounds up as written rather than down as stored.
	return String(Math.round(Number((fromMm(mm, units) * scale).toPrecision(12))) / scale);
}

/** The balance-hole fields for holes given in mm: what "Add balance holes" writes into the design. */
export function balanceParams(h: HoleCircle, units: Units): Params {
	const angle = (d: number) => String(Number(d.toFixed(2)));
	return {
		balanceCount: String(h.count),
		balancePcd: lengthText(h.pcdMm, units),
		balanceHole: lengthText(h.holeMm, units),
		balanceAngle: angle(h.clockDeg),
		balanceSpacing: h.spacingDeg === undefined ? '' : angle(h.spacingDeg)
	};
}

/**
 * What a form's unit switches remember per field: the text as it was before the last switch wrote
 * over it, so switching back gives that text again (`1/8` rather than 0.1252 from 3.18 mm). Keep
 * one per form, across its switches.
 */
export type SwitchMemory = Record<string, { typed: string; units: Units; written: string }>;

/**
 * The same lengths in other units: only the fields that change. Empty fields stay empty; a value
 * with its own unit ("20 mm") means the same in either and stays as typed, and so does anything
 * not yet a length, for its refusal to say why. A field still as the last switch wrote it goes back
 * to what was typed before that switch; everything else is converted and rounded (`lengthText`).
 */
export function convertLengths(params: Params, fields: readonly string[], from: Units, to: Units, memory: SwitchMemory = {}): Params {
	const out: Params = {};
	if (from === to) return out;
	for (const field of fields) {
		const text = params[field];
		if (text === undefined || text.trim() === '') continue;
		const read = parseLengthWithUnit(text, from);
		if (!read.ok || read.unit !== null) continue;
		const before = memory[field];
		out[field] = before && before.units === to && before.written === text ? before.typed : lengthText(read.mm, to);
		memory[field] = { typed: text, units: from, written: out[field] };
	}
	return out;
}

export interface ParamChange {
	name: string;
	from: string;
	to: string;
	/** With a registry: the parameter's label, and each side in words with its unit. */
	label?: string;
	fromWords?: string;
	toWords?: string;
}

/**
 * Parameter by parameter, what differs between two sets (an empty value counts as not given).
 * Given the tool's registry, the changes come in its order, each with its label and its values in words.
 */
export function diffParams(from: Params, to: Params, registry?: Registry): ParamChange[] {
	const names = [...new Set([...Object.keys(from), ...Object.keys(to)])].sort();
	const changes = names.map((name) => ({ name, from: from[name] ?? '', to: to[name] ?? '' })).filter((c) => c.from.trim() !== c.to.trim());
	if (!registry) return changes;
	const order: readonly string[] = registry.names;
	const rank = (name: string) => (order.includes(name) ? order.indexOf(name) : order.length);
	return changes
		.sort((a, b) => rank(a.name) - rank(b.name) || a.name.localeCompare(b.name))
		.map((c) => ({
			...c,
			label: registry.label(c.name),
			fromWords: valueWords(registry, c.name, from),
			toWords: valueWords(registry, c.name, to)
		}));
}
