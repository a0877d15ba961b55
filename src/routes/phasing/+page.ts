import { phasingParams } from '$lib/schemas/phasing';
import { clockingTarget } from './clocking-target';
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

/** A shared link carries the check in its query; anything it leaves out starts from the defaults. */
export const load: PageLoad = async ({ url, fetch }) => ({
	params: formFromAddress(url.searchParams),
	build: url.searchParams.get('build'),
	clockingTarget: await clockingTarget(fetch, url.searchParams)
});
