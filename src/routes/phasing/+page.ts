import { phasingParams } from '$lib/schemas/phasing';
import { clockingTarget } from '$lib/clocking-target';
import { formFromAddress, formStart, sheetFormKeys } from './form-query';
import type { PageLoad } from './$types';

/** The phasing check's public parameters, read from the query (src/lib/schemas/phasing.ts). */
export const _phasingKeys = phasingParams.names;

/**
 * What only the build sheet needs (its own names and the wheel's, as /api/v1/build-sheet.pdf reads
 * them), also kept in the query.
 */
export const _sheetKeys = sheetFormKeys;

export const _phasingDefaults = formStart();

/**
 * A shared link carries the check in its query; anything it leaves out starts from the defaults.
 * From a build's page the link also names the build (the profile saves back into it) and the wheel
 * design whose head revision filled in the pattern (src/lib/build-links.ts), which "Apply to" clocks.
 */
export const load: PageLoad = async ({ url, fetch }) => ({
	params: formFromAddress(url.searchParams),
	build: url.searchParams.get('build'),
	clockingTarget: await clockingTarget(fetch, url.searchParams)
});
