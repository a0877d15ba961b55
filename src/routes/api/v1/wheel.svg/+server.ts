import { exportName } from '$lib/server/exports/names';
import { wheelSvg } from '$lib/server/exports/svg';
import { fileResponse } from '$lib/server/api';
import { wheelFromQuery } from '$lib/server/wheel-request';

export function GET({ url }) {
	const r = wheelFromQuery(url);
	if (!r.ok) return r.response;
	const { spec, units } = r.wheel;
	return fileResponse(wheelSvg(spec, units), 'image/svg+xml', exportName(spec, units, 'svg'));
}
