import { tdcRegistry } from '$lib/schemas/tdc';
import type { PageLoad } from './$types';

/**
 * The form's fields, each empty or at the registry's default, plus where a new form starts: a
 * signed scale and a clockwise crank (the API assumes neither).
 */
const blank = {
	...Object.fromEntries(tdcRegistry.names.map((n) => [n, ''])),
	...tdcRegistry.defaults('mm'),
	scale: 'signed',
	rotation: 'cw'
};

export const load: PageLoad = ({ url }) => {
	const params: Record<string, string> = { ...blank };
	for (const key of tdcRegistry.names) {
		const value = url.searchParams.get(key);
		if (value !== null) params[key] = value;
	}
	// A diameter with readings is the rim the scale sits on (for the distance to re-mark); alone, or with a distance, it is the rim measurement.
	const q = url.searchParams;
	const mode: 'marks' | 'rim' = q.has('distance') || (q.has('diameter') && !q.has('a') && !q.has('b')) ? 'rim' : 'marks';
	return { params, mode, build: url.searchParams.get('build') };
};
