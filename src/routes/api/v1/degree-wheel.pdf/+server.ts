import { checkDegreeWheel } from '$lib/schemas/degree-wheel';
import { degreeWheelPdf } from '$lib/server/exports/degree-wheel-pdf';
import { fileResponse, refuse } from '$lib/server/api';
import { fromMm } from '$lib/trade/units';

/** The printed degree wheel: the tape's parameters, and `shaft` for the centre hole. */
export async function GET({ url }) {
	const parsed = checkDegreeWheel(Object.fromEntries(url.searchParams));
	if (!parsed.ok) return refuse(parsed.refusals);
	const { spec, units, paper, shaftMm } = parsed.value;
	const name = `degree-wheel-${Number(fromMm(spec.hubDiameterMm, units).toFixed(units === 'in' ? 3 : 1))}${units}-${paper}.pdf`;
	return fileResponse(await degreeWheelPdf(spec, shaftMm, units, paper), 'application/pdf', name);
}
