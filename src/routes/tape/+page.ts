import { tapeRegistry } from '$lib/schemas/tape';
import { timingCardRegistry } from '$lib/schemas/timing-card';
import type { PageLoad } from './$types';

/** The names the page reads from its address: the tape's public parameters and the timing-light card's. */
const known = [...new Set([...tapeRegistry.names, ...timingCardRegistry.names])];

/** A hub to start from, so a bare page shows a tape (the API has no default: a tape is for one hub). */
const startHub = { mm: '150', in: '6' } as const;

/**
 * A shared link carries the tape in its query; anything it leaves out starts from the registry's
 * defaults for its unit system, so `?units=in&diameter=5 1/2` is a whole tape.
 */
export const load: PageLoad = ({ url }) => {
	const units = url.searchParams.get('units') === 'in' ? 'in' : 'mm';
	const params: Record<string, string> = { ...tapeRegistry.defaults(units), units, diameter: startHub[units] };
	for (const key of known) {
		const value = url.searchParams.get(key);
		if (value !== null) params[key] = value;
	}
	// One of the two hub sizes is sent; a link with a circumference means "measured".
	if (url.searchParams.has('circumference') && !url.searchParams.has('diameter')) delete params.diameter;
	return { params, build: url.searchParams.get('build') };
};
