import { json } from '@sveltejs/kit';
import { checkTape } from '$lib/schemas/tape';
import { refuse } from '$lib/server/api';
import { btdcSide, travelWords } from '$lib/trade/hub';
import { fittingWords, mmPerDegree, tapeLengthMm, tapeStrips, tapeWarnings } from '$lib/trade/tape';
import { fromMm } from '$lib/trade/units';

export function GET({ url }) {
	const parsed = checkTape(Object.fromEntries(url.searchParams));
	if (!parsed.ok) return refuse(parsed.refusals);
	const { spec, units, paper } = parsed.value;
	const strips = tapeStrips(spec, paper);
	const r = (v: number) => Math.round(v * 1e6) / 1e6;
	return json({
		units,
		hubDiameter: r(fromMm(spec.hubDiameterMm, units)),
		perDegree: r(fromMm(mmPerDegree(spec), units)),
		length: r(fromMm(tapeLengthMm(spec), units)),
		windowDeg: spec.windowDeg,
		rotation: spec.rotation,
		// Where BTDC lies, said as the print says it, for a person to check against the printed tape.
		btdcSide: btdcSide(spec.rotation),
		sides: travelWords(spec.rotation),
		fitting: fittingWords,
		paper,
		strips: strips.length,
		pages: strips.at(-1)!.page,
		warnings: tapeWarnings(spec)
	});
}
