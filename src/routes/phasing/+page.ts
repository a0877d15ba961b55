import { legacyVTwin } from '$lib/trade/engine';
import type { PageLoad } from './$types';

/** The phasing check's public parameters (the names parsePhasing reads), read from the query. */
export const _phasingKeys = [
	'teeth', 'missing', 'duty', 'mount', 'layout', 'vAngle', 'stroke', 'intervals', 'input', 'toothAtTdc', 'sensorAngle', 'keywayAngle',
	'keyAngle', 'edge', 'rpm', 'cranking', 'sensor', 'sensorMaxHz', 'windowFrom', 'windowTo', 'resolution', 'target', 'keyFromSensor',
	// The wheel's other patterns (two gaps, N+1), read from a link; the form offers N-M.
	'pattern', 'gaps', 'extraAfter'
] as const;

/**
 * What only the build sheet needs (the wheel's names and the sheet's own, as /api/v1/build-sheet.pdf
 * reads them), also kept in the query. The name is `buildName`: `build` in a tool's address is a
 * build's id (src/lib/address-query.svelte.ts).
 */
export const _sheetKeys = ['buildName', 'units', 'od', 'depth', 'thickness', 'material', 'bore', 'tdcA', 'tdcB', 'tapeDiameter', 'paper'] as const;

export const _phasingDefaults: Record<string, string> = {
	teeth: '36', missing: '1', duty: '0.5', mount: 'crank', layout: 'single-4', vAngle: '', stroke: '4', intervals: '', input: 'tooth',
	toothAtTdc: '', sensorAngle: '', keywayAngle: '', keyAngle: '', edge: 'leading', rpm: '8000', cranking: '200', sensor: 'hall',
	sensorMaxHz: '', windowFrom: '45', windowTo: '0', resolution: '', target: '', keyFromSensor: '', pattern: 'missing', gaps: '', extraAfter: '',
	buildName: '', units: 'mm', od: '', depth: '', thickness: '', material: 'steel', bore: '', tdcA: '', tdcB: '', tapeDiameter: '', paper: 'a4'
};

/** A shared link carries the check in its query; anything it leaves out starts from the defaults. */
export const load: PageLoad = ({ url }) => {
	const params: Record<string, string> = { ..._phasingDefaults };
	for (const key of [..._phasingKeys, ..._sheetKeys]) {
		const value = url.searchParams.get(key);
		if (value !== null) params[key] = value;
	}
	// Intervals without a preset are a custom layout.
	if (url.searchParams.has('intervals') && !url.searchParams.has('layout')) params.layout = 'custom';
	// Links of earlier versions name the V angle in the layout (v-twin-90): today it has a field of its own.
	const v = legacyVTwin(params.layout);
	if (v !== null) {
		params.layout = 'v-twin';
		if (!url.searchParams.get('vAngle')) params.vAngle = String(v);
	}
	return { params, build: url.searchParams.get('build') };
};
