import { tdcRegistry } from '$lib/schemas/tdc';

// What the TDC page sends (to its check, to a build's TDC records, into its address): named by the
// registry, so the form cannot send a name /api/v1/tdc does not take.

export type Params = Record<string, string>;
export type TdcMode = 'marks' | 'rim';

/** The parameters of a rim measurement; everything else belongs to two readings. */
const rimOnly = new Set<string>(['distance']);
const rim = new Set<string>(['distance', 'diameter', 'units']);
/** Beside two readings the diameter (and the units it is in) is optional: sent only when given. */
const withDiameter = new Set<string>(['diameter', 'units']);

/** The parameters the page checks in this mode, trimmed, without empty strings, in the registry's order. */
export function tdcSent(params: Params, mode: TdcMode): Params {
	const hasDiameter = !!params.diameter?.trim();
	const names = tdcRegistry.names.filter((n) => (mode === 'rim' ? rim.has(n) : !rimOnly.has(n) && (hasDiameter || !withDiameter.has(n))));
	const out: Params = {};
	for (const name of names) {
		const v = params[name]?.trim();
		if (v) out[name] = v;
	}
	return out;
}
