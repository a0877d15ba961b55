import type { PageLoad } from './$types';

/** The TDC finder's public parameters (the same names as /api/v1/tdc), the only ones read from the query. */
const known = ['a', 'b', 'scale', 'arc', 'rotation', 'distance', 'diameter', 'units'] as const;

export const load: PageLoad = ({ url }) => {
	const params: Record<string, string> = { a: '', b: '', scale: 'signed', arc: 'shorter', rotation: 'cw', distance: '', diameter: '', units: 'mm' };
	for (const key of known) {
		const value = url.searchParams.get(key);
		if (value !== null) params[key] = value;
	}
	// A diameter with readings is the rim the scale sits on (for the distance to re-mark); alone, or with a distance, it is the rim measurement.
	const q = url.searchParams;
	const mode: 'marks' | 'rim' = q.has('distance') || (q.has('diameter') && !q.has('a') && !q.has('b')) ? 'rim' : 'marks';
	return { params, mode, build: url.searchParams.get('build') };
};
