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

/** A length for people: mm to 0.01, inches to 0.001. */
export function formatLength(mm: number, units: Units): string {
	return units === 'in' ? `${fromMm(mm, units).toFixed(3)} in` : `${mm.toFixed(2)} mm`;
}

export const deg = (rad: number) => (rad * 180) / Math.PI;
export const rad = (degrees: number) => (degrees * Math.PI) / 180;

/** An angle brought into [0, 360). */
export const norm360 = (a: number) => ((a % 360) + 360) % 360;
