// Helpers for the tools' forms, which keep their inputs as flat strings named like the public API.
import { fromMm, parseLength, toMm, type Units } from './trade/units';
import type { HoleCircle } from './trade/wheel';
import { valueWords } from './schemas/param-words';
import type { Registry } from './schemas/registry';

export type Params = Record<string, string>;

/** A length as it goes back into a text field: mm to 0.01, inches to 0.0001, no trailing zeros. */
export function lengthText(mm: number, units: Units): string {
	return String(Number(fromMm(mm, units).toFixed(units === 'in' ? 4 : 2)));
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
 * The same lengths in other units. Empty fields stay empty, and anything not yet a number is left
 * as typed, for its error to say so.
 */
export function convertLengths(params: Params, fields: readonly string[], from: Units, to: Units): Params {
	const out: Params = {};
	for (const field of fields) {
		const text = params[field];
		if (text === undefined || text.trim() === '') continue;
		const value = parseLength(text);
		if (Number.isFinite(value)) out[field] = lengthText(toMm(value, from), to);
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
