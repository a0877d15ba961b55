import { json } from '@sveltejs/kit';
import { checkTdc } from '$lib/schemas/tdc';
import { refuse } from '$lib/server/api';
import { onScale, readingParam, scaleText, sideText, spreadFromRim, tdcAdvice } from '$lib/trade/tdc';
import { formatLength, fromMm } from '$lib/trade/units';

const r6 = (x: number) => Math.round(x * 1e6) / 1e6;

export function GET({ url }) {
	const found = checkTdc(Object.fromEntries(url.searchParams));
	if (!found.ok) return refuse(found.refusals);
	if (found.value.kind === 'rim') {
		const v = found.value;
		const r = spreadFromRim(v.distanceMm, v.diameterMm);
		return json({
			units: v.units,
			spreadDeg: r.spreadDeg,
			halfSpreadDeg: r.halfSpreadDeg,
			fromEitherMark: r6(fromMm(r.fromEitherMarkMm, v.units))
		});
	}
	const { marks, result } = found.value;
	const advice = tdcAdvice(result.tdcDeg, marks.scale, {
		rotation: marks.rotation ?? undefined,
		diameterMm: marks.diameterMm ?? undefined,
		lengthText: (mm) => formatLength(mm, marks.units)
	});
	const reading = (atdcDeg: number) => ({
		atdcDeg: r6(atdcDeg),
		written: readingParam(atdcDeg, marks.scale),
		onScale: scaleText(atdcDeg, marks.scale)
	});
	return json({
		scale: marks.scale,
		arc: marks.arc,
		// The reading of true TDC on a numeric scale, as before; on a quadrant wheel, degrees ATDC (BTDC negative).
		tdcDeg: marks.scale === 'quadrant' ? result.tdcDeg : r6(onScale(result.tdcDeg, marks.scale)),
		spreadDeg: result.spreadDeg,
		halfSpreadDeg: result.halfSpreadDeg,
		a: reading(marks.a.atdcDeg),
		b: reading(marks.b.atdcDeg),
		tdc: { ...reading(result.tdcDeg), side: sideText(result.tdcDeg, marks.scale) },
		finding: advice.finding,
		remark: advice.remark,
		pointer: advice.pointer,
		...(advice.rimMm === null ? {} : { units: marks.units, rimDistance: r6(fromMm(advice.rimMm, marks.units)) })
	});
}
