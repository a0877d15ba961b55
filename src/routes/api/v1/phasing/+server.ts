import { json } from '@sveltejs/kit';
import { parsePhasing } from '$lib/schemas/phasing';
import { refuse } from '$lib/server/api';
import { clockingFor, phasing } from '$lib/trade/phasing';

export function GET({ url }) {
	const parsed = parsePhasing(Object.fromEntries(url.searchParams));
	if (!parsed.ok) return refuse(parsed.errors);
	const { input, layoutLabel, clocking } = parsed.value;
	return json({
		layout: layoutLabel,
		mount: input.mount,
		intervals: input.intervals,
		sensorMaxHz: input.sensorMaxHz,
		...phasing(input),
		clocking: clocking ? { ...clocking, keywayAngleDeg: clockingFor(clocking.targetDeg, clocking.keyFromSensorDeg, input.mount) } : null
	});
}
