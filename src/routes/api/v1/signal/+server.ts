import { json } from '@sveltejs/kit';
import { checkSignal } from '$lib/schemas/signal';
import { refuse } from '$lib/server/api';
import { signalCheck } from '$lib/trade/signal';

// The signal check: the phasing check's parameters for the wheel and engine, plus the check's own
// (src/lib/schemas/signal.ts). Every speed case with its sync margin, the clocking sweep and the sensor.
export function GET({ url }) {
	const checked = checkSignal(Object.fromEntries(url.searchParams));
	if (!checked.ok) return refuse(checked.refusals);
	const { input, phasing, given } = checked.value;
	return json({
		layout: phasing.layoutLabel,
		mount: input.mount,
		stroke: input.stroke,
		intervals: input.intervals,
		edge: input.edge,
		// Worked out from the angles with input=angles; as given otherwise.
		toothAtTdc: Math.round(input.toothAtTdc * 1e4) / 1e4,
		rule: input.rule,
		cycles: input.cycles,
		casesGiven: given ? 'one' : 'defaults',
		...signalCheck(input)
	});
}
