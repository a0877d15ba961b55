import { wheelDefaults } from '$lib/schemas/wheel';
import type { PageLoad } from './$types';

/** The wheel's public parameters (the same names as /api/v1/wheel), the only ones read from the query. */
const known = [
	'pattern', 'teeth', 'missing', 'gaps', 'extraAfter', 'duty', 'od', 'depth', 'tipRadius', 'rootRadius',
	'bore', 'keyway', 'keyWidth', 'keyDepth', 'shaft', 'woodruff', 'keywayAngle', 'bolts', 'pcd', 'boltHole',
	'boltAngle', 'balanceCount', 'balancePcd', 'balanceHole', 'balanceAngle', 'balanceSpacing', 'mark', 'label',
	'rotation', 'material', 'density', 'thickness', 'units', 'rpm', 'grade'
] as const;

/**
 * A shared link carries the design in its query. Anything it leaves out starts from the defaults
 * of its unit system, so `?units=in&od=3 1/2` is a whole design.
 */
export const load: PageLoad = ({ url }) => {
	const units = url.searchParams.get('units') === 'in' ? 'in' : 'mm';
	const params: Record<string, string> = { pattern: 'missing', units, ...wheelDefaults[units] };
	for (const key of known) {
		const value = url.searchParams.get(key);
		if (value !== null) params[key] = value;
	}
	return { params };
};
