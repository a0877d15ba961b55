// "Start a design from this": a photo reading as the designer's parameters. Only what a photo
// can tell is filled in (pattern, duty, and the diameter when the user gave it); depth, bore and
// thickness are the designer's defaults until measured. The designer opens in the units the
// diameter was given in.
import type { Params } from '$lib/params';
import { diameterText } from '$lib/schemas/photo';
import type { Units } from '$lib/trade/units';

interface Read {
	teeth: number;
	missing: number;
	gaps: { first: number; count: number }[];
	duty: number;
}

export function readingToDesign(reading: Read, odMm?: number, units: Units = 'mm'): Params {
	const duty = String(Math.min(0.95, Math.max(0.05, Math.round(reading.duty * 20) / 20)));
	const out: Params = { units, teeth: String(reading.teeth), duty };
	if (reading.gaps.length <= 1) Object.assign(out, { pattern: 'missing', missing: String(reading.missing) });
	else {
		// Several gaps: the reading numbers positions as the designer does (0 = first tooth after the main gap).
		const positions = reading.gaps.flatMap((g) => Array.from({ length: g.count }, (_, i) => (g.first + i) % reading.teeth));
		Object.assign(out, { pattern: 'custom', gaps: positions.sort((a, b) => a - b).join(', ') });
	}
	if (odMm) out.od = diameterText(odMm, units);
	return out;
}
