import { patternName } from '$lib/trade/pattern';
import { fromMm, type Units } from '$lib/trade/units';
import type { WheelSpec } from '$lib/trade/wheel';

/** `wheel-36-1-100mm.dxf`, `wheel-60-2-4.5in-r3.pdf`: pattern, diameter, units and the saved revision in the name. */
export function exportName(spec: WheelSpec, units: Units, ext: 'dxf' | 'svg' | 'pdf', revision?: number): string {
	const od = Number(fromMm(spec.odMm, units).toFixed(units === 'in' ? 3 : 2));
	const pattern = patternName(spec.pattern).split(' ')[0]!.replace(/[^0-9+-]/g, '');
	return `wheel-${pattern || 'custom'}-${od}${units}${revision ? `-r${revision}` : ''}.${ext}`;
}
