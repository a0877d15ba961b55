import { exportName } from '$lib/server/exports/names';
import { wheelDxf } from '$lib/server/exports/dxf';
import { fileResponse } from '$lib/server/api';
import { wheelFromQuery } from '$lib/server/wheel-request';

export function GET({ url }) {
	const r = wheelFromQuery(url);
	if (!r.ok) return r.response;
	const { spec, units } = r.wheel;
	return fileResponse(wheelDxf(spec, units), 'application/dxf', exportName(spec, units, 'dxf'));
}
