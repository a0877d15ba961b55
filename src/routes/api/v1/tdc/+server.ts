import { json } from '@sveltejs/kit';
import { parseTdc } from '$lib/schemas/tape';
import { refuse } from '$lib/server/api';
import { spreadFromRim, tdcFromMarks } from '$lib/trade/tdc';
import { fromMm } from '$lib/trade/units';

export function GET({ url }) {
	const parsed = parseTdc(Object.fromEntries(url.searchParams));
	if (!parsed.ok) return refuse(parsed.errors);
	const v = parsed.value;
	if (v.kind === 'rim') {
		const r = spreadFromRim(v.distanceMm, v.diameterMm);
		return json({ units: v.units, spreadDeg: r.spreadDeg, halfSpreadDeg: r.halfSpreadDeg, fromEitherMark: Math.round(fromMm(r.fromEitherMarkMm, v.units) * 1e6) / 1e6 });
	}
	const answer = tdcFromMarks(v.a, v.b, v.scale, v.arc);
	if (!answer.ok) return refuse({ [answer.field]: answer.message });
	return json({ scale: v.scale, arc: v.arc, ...answer.result });
}
