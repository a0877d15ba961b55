import type { PageLoad } from './$types';

/** The phasing check's public parameters (the names parsePhasing reads), the only ones read from the query. */
export const _phasingKeys = [
	'teeth', 'missing', 'duty', 'mount', 'layout', 'stroke', 'intervals', 'toothAtTdc', 'edge', 'rpm', 'cranking',
	'sensor', 'sensorMaxHz', 'windowFrom', 'windowTo', 'resolution', 'target', 'keyFromSensor'
] as const;

export const _phasingDefaults: Record<string, string> = {
	teeth: '36', missing: '1', duty: '0.5', mount: 'crank', layout: 'single-4', stroke: '4', intervals: '', toothAtTdc: '',
	edge: 'leading', rpm: '8000', cranking: '200', sensor: 'hall', sensorMaxHz: '', windowFrom: '45', windowTo: '0',
	resolution: '', target: '', keyFromSensor: ''
};

/** A shared link carries the check in its query; anything it leaves out starts from the defaults. */
export const load: PageLoad = ({ url }) => {
	const params: Record<string, string> = { ..._phasingDefaults };
	for (const key of _phasingKeys) {
		const value = url.searchParams.get(key);
		if (value !== null) params[key] = value;
	}
	// Intervals without a preset are a custom layout.
	if (url.searchParams.has('intervals') && !url.searchParams.has('layout')) params.layout = 'custom';
	return { params };
};
