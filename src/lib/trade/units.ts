// Lengths inside the trade library are millimetres; inches exist only at the edges (input and
// output). 1 in = 25.4 mm exactly (international inch, 1959).

export const MM_PER_IN = 25.4;
export type Units = 'mm' | 'in';

export const toMm = (value: number, units: Units) => (units === 'in' ? value * MM_PER_IN : value);
export const fromMm = (mm: number, units: Units) => (units === 'in' ? mm / MM_PER_IN : mm);

/**
 * Reads a length as people write it: `76.2`, `3.5`, `3 1/2`, `3-1/2`, `7/8`, `1,5` (decimal comma).
 * Returns NaN for anything else.
 */
export function parseLength(text: string | number): number {
	if (typeof text === 'number') return text;
	const s = text.trim().replace(/(\d),(\d)/g, '$1.$2');
	if (/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(s)) return Number(s);
	const mixed = /^(\d+)(?:\s+|-)(\d+)\s*\/\s*(\d+)$/.exec(s);
	if (mixed) return Number(mixed[3]) === 0 ? NaN : Number(mixed[1]) + Number(mixed[2]) / Number(mixed[3]);
	const frac = /^(\d+)\s*\/\s*(\d+)$/.exec(s);
	if (frac) return Number(frac[2]) === 0 ? NaN : Number(frac[1]) / Number(frac[2]);
	return NaN;
}

/** A length read with the unit it was written in, or why it could not be read. */
export type LengthReading =
	| { ok: true; mm: number; /** The unit written after the number; null when none was. */ unit: Units | 'cm' | null }
	| { ok: false; why: string };

// The units a length may carry after its number. cm is taken because nobody means anything else by
// it; m and ft are not (a wheel's sizes are never written in them, so "20 m" is more likely a slip).
// The inch mark comes straight (") or as the phone keyboards' curly quote and the prime sign.
const unitWords: Record<string, Units | 'cm'> = {
	mm: 'mm',
	millimetre: 'mm',
	millimetres: 'mm',
	millimeter: 'mm',
	millimeters: 'mm',
	cm: 'cm',
	in: 'in',
	'in.': 'in',
	inch: 'in',
	inches: 'in',
	'"': 'in',
	'\u201d': 'in',
	'\u2033': 'in',
	"''": 'in'
};

/** Why a length was refused, in the words a page and the API show after the field's label. */
export const lengthWhy = {
	notANumber: 'not a number',
	unitFirst: 'units go after the number',
	unknownUnit: 'unknown unit: use mm or in',
	overZero: 'a fraction over 0 is no number'
} as const;

const mmPer = (unit: Units | 'cm') => (unit === 'cm' ? 10 : unit === 'in' ? MM_PER_IN : 1);

/**
 * Reads a length with its unit, if any, after the number: `20 mm`, `3/4 in`, `3/4"`, `19.05mm`,
 * `1 1/2in`, `2 cm`; without one it is in `defaultUnits`. The number is read as `parseLength`
 * reads it (fractions, decimal comma). Refused with the reason: a unit before the number, an
 * unknown unit, or no number.
 */
export function parseLengthWithUnit(text: string | number, defaultUnits: Units): LengthReading {
	if (typeof text === 'number') return Number.isFinite(text) ? { ok: true, mm: toMm(text, defaultUnits), unit: null } : no('notANumber');
	const s = text.trim();
	const lead = /^([a-z]+\.?|["\u201d\u2033]|'')\s*[+-]?[\d.,]/i.exec(s);
	if (lead) return lead[1]!.toLowerCase() in unitWords ? no('unitFirst') : no('notANumber');
	// The number is everything up to its last digit; what follows, if anything, is the unit.
	const split = /^(.*\d)\s*([^\d\s][^\d]*)?$/.exec(s);
	if (!split) return no('notANumber');
	const written = split[2]?.trim().toLowerCase();
	const unit = written === undefined ? null : unitWords[written];
	if (unit === undefined) return /^[a-z"\u201d\u2033'.]+$/i.test(written!) ? no('unknownUnit') : no('notANumber');
	const value = parseLength(split[1]!);
	if (!Number.isFinite(value)) return /\/\s*0+$/.test(split[1]!) ? no('overZero') : no('notANumber');
	return { ok: true, mm: unit === null ? toMm(value, defaultUnits) : value * mmPer(unit), unit };
}

const no = (why: keyof typeof lengthWhy): LengthReading => ({ ok: false, why: lengthWhy[why] });

/** A length with or without its own unit, in `units`; NaN when it cannot be read. */
export function lengthIn(text: string | number, units: Units): number {
	const read = parseLengthWithUnit(text, units);
	return read.ok ? fromMm(read.mm, units) : NaN;
}

/** A length for people: mm to 0.01, inches to 0.001. */
export function formatLength(mm: number, units: Units): string {
	return units === 'in' ? `${fromMm(mm, units).toFixed(3)} in` : `${mm.toFixed(2)} mm`;
}

export const deg = (rad: number) => (rad * 180) / Math.PI;
export const rad = (degrees: number) => (degrees * Math.PI) / 180;

/** An angle brought into [0, 360). */
export const norm360 = (a: number) => ((a % 360) + 360) % 360;
