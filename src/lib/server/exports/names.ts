import { patternName } from '$lib/trade/pattern';
import type { Paper } from '$lib/trade/paper';
import { fromMm, type Units } from '$lib/trade/units';
import type { WheelSpec } from '$lib/trade/wheel';

/**
 * `wheel-36-1-100mm.dxf`, `wheel-60-2-4.5in-letter-r3.pdf`: pattern, diameter, units, the paper a
 * template is laid out for (an A4 print and a Letter print differ, so they must not share a name)
 * and the saved revision.
 */
export function exportName(spec: WheelSpec, units: Units, ext: 'dxf' | 'svg' | 'pdf' | 'stl', revision?: number, paper?: Paper): string {
	const od = Number(fromMm(spec.odMm, units).toFixed(units === 'in' ? 3 : 2));
	const pattern = patternName(spec.pattern)
		.split(' ')[0]!
		.replace(/[^0-9+-]/g, '');
	return `wheel-${pattern || 'custom'}-${od}${units}${paper ? `-${paper}` : ''}${revision ? `-r${revision}` : ''}.${ext}`;
}

/** A name as it goes into a file name: lower case, runs of anything but letters and digits one hyphen. */
const slug = (name: string) =>
	name
		.toLowerCase()
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-|-$/g, '');

/** `build-sheet-trail-single-500.pdf`, `build-sheet-sheet-bench-650-r2.pdf`: the build's name and the wheel's saved revision. */
export const buildSheetName = (buildName: string, revision?: number): string =>
	`build-sheet-${slug(buildName) || 'build'}${revision ? `-r${revision}` : ''}.pdf`;
