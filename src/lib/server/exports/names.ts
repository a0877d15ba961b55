import { patternName } from '$lib/trade/pattern';
import type { Paper } from '$lib/trade/paper';
import { fromMm, type Units } from '$lib/trade/units';
import type { WheelSpec } from '$lib/trade/wheel';

/**
 * `wheel-36-1-100mm.dxf`, `wheel-60-2-4.5in-letter-r3.pdf`: pattern, diameter, units, the paper a
 * template is laid out for (an A4 print and a Letter print differ, so they must not share a name)
 * and the saved revision.
 */
export function exportName(spec: WheelSpec, units: Units, ext: 'dxf' | 'svg' | 'pdf', revision?: number, paper?: Paper): string {
	const od = Number(fromMm(spec.odMm, units).toFixed(units === 'in' ? 3 : 2));
	const pattern = patternName(spec.pattern).split(' ')[0]!.replace(/[^0-9+-]/g, '');
	return `wheel-${pattern || 'custom'}-${od}${units}${paper ? `-${paper}` : ''}${revision ? `-r${revision}` : ''}.${ext}`;
}
