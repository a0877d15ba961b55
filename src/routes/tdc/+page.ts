import type { PageLoad } from './$types';

/** The TDC finder's public parameters (the same names as /api/v1/tdc), the only ones read from the query. */
const known = ['a', 'b', 'scale', 'arc', 'distance', 'diameter', 'units'] as const;

export const load: PageLoad = ({ url }) => {
	const params: Record<string, string> = { a: '', b: '', scale: 'signed', arc: 'shorter', distance: '', diameter: '', units: 'mm' };
	for (const key of known) {
		const value = url.searchParams.get(key);
		if (value !== null) params[key] = value;
	}
	const mode: 'marks' | 'rim' = url.searchParams.has('distance') || url.searchParams.has('diameter') ? 'rim' : 'marks';
	return { params, mode, build: url.searchParams.get('build') };
};
