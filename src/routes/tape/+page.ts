import type { PageLoad } from './$types';

/** The tape's public parameters (the same names as /api/v1/tape), plus the timing-light card's curve. */
const known = ['units', 'diameter', 'circumference', 'paperThickness', 'rotation', 'window', 'tick', 'mid', 'label', 'timing', 'tdc2', 'paper', 'curve'] as const;

const defaults = {
	mm: { diameter: '150', paperThickness: '0.1' },
	in: { diameter: '6', paperThickness: '0.004' }
} as const;

/**
 * A shared link carries the tape in its query; anything it leaves out starts from the defaults of
 * its unit system, so `?units=in&diameter=5 1/2` is a whole tape.
 */
export const load: PageLoad = ({ url }) => {
	const units = url.searchParams.get('units') === 'in' ? 'in' : 'mm';
	const params: Record<string, string> = {
		units,
		...defaults[units],
		rotation: 'cw',
		window: 'full',
		tick: '1',
		mid: '5',
		label: '10',
		timing: '',
		tdc2: '',
		paper: 'a4'
	};
	for (const key of known) {
		const value = url.searchParams.get(key);
		if (value !== null) params[key] = value;
	}
	// One of the two hub sizes is sent; a link with a circumference means "measured".
	if (url.searchParams.has('circumference') && !url.searchParams.has('diameter')) delete params.diameter;
	return { params, build: url.searchParams.get('build') };
};
