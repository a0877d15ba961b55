import { clockingTarget } from '$lib/clocking-target';
import { formFromAddress } from './form-query';
import type { PageLoad } from './$types';

/**
 * A shared link carries the check in its query; anything it leaves out starts from the defaults.
 * From a build's page the link also names the build (the check saves into it) and the wheel design
 * whose head revision gave the pattern (src/lib/build-links.ts, signalHref), which the best
 * clocking can be applied to.
 */
export const load: PageLoad = async ({ url, fetch }) => ({
	params: formFromAddress(url.searchParams),
	build: url.searchParams.get('build'),
	clockingTarget: await clockingTarget(fetch, url.searchParams)
});
