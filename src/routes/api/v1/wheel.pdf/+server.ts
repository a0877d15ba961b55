import { exportName } from '$lib/server/exports/names';
import { wheelPdf } from '$lib/server/exports/wheel-pdf';
import { fileResponse } from '$lib/server/api';
import { wheelFromQuery } from '$lib/server/wheel-request';

export async function GET({ url }) {
	const r = wheelFromQuery(url);
	if (!r.ok) return r.response;
	const { spec, units, paper } = r.wheel;
	return fileResponse(await wheelPdf(spec, r.summary, units, paper), 'application/pdf', exportName(spec, units, 'pdf'));
}
