import { checkSignal } from '$lib/schemas/signal';
import { fileResponse, refuse } from '$lib/server/api';
import { patternName } from '$lib/trade/pattern';
import { toothEdges } from '$lib/trade/signal';

// The tooth-edge table of one engine cycle: every leading and trailing edge in the order it reaches
// the sensor, with its angle on the wheel and in the cycle, and its time at the first speed case
// (the one given, or cranking). Plain columns, one header row.
export function GET({ url }) {
	const checked = checkSignal(Object.fromEntries(url.searchParams));
	if (!checked.ok) return refuse(checked.refusals);
	const { input } = checked.value;
	const speed = input.cases[0]!;
	const rows = toothEdges(input, speed).map((e) =>
		[e.index, e.tooth, e.kind, e.wheelDeg.toFixed(4), e.crankDeg.toFixed(4), (e.t * 1000).toFixed(4)].join(',')
	);
	const csv = ['edge,tooth,kind,wheel_deg,crank_deg,time_ms', ...rows].join('\r\n') + '\r\n';
	const pattern =
		patternName(input.pattern)
			.split(' ')[0]!
			.replace(/[^0-9+-]/g, '') || 'custom';
	const tooth = String(Math.round(input.toothAtTdc * 1000) / 1000).replace('.', 'p');
	return fileResponse(csv, 'text/csv; charset=utf-8', `tooth-edges-${pattern}-${input.mount}-t${tooth}.csv`);
}
