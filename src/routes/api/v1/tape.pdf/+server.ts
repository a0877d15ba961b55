import { checkTape } from '$lib/schemas/tape';
import { tapePdf } from '$lib/server/exports/tape-pdf';
import { fileResponse, refuse } from '$lib/server/api';
import { fromMm } from '$lib/trade/units';

export async function GET({ url }) {
	const parsed = checkTape(Object.fromEntries(url.searchParams));
	if (!parsed.ok) return refuse(parsed.refusals);
	const { spec, units, paper } = parsed.value;
	const name = `degree-tape-${Number(fromMm(spec.hubDiameterMm, units).toFixed(units === 'in' ? 3 : 1))}${units}-${paper}.pdf`;
	return fileResponse(await tapePdf(spec, units, paper), 'application/pdf', name);
}
