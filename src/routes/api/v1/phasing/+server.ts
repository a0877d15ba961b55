import { json } from '@sveltejs/kit';
import { checkPhasing } from '$lib/schemas/phasing';
import { refuse } from '$lib/server/api';
import { clockingFor, phasing } from '$lib/trade/phasing';

export function GET({ url }) {
	const checked = checkPhasing(Object.fromEntries(url.searchParams));
	if (!checked.ok) return refuse(checked.refusals);
	const { input, layoutLabel, clocking, measured } = checked.value;
	return json({
		layout: layoutLabel,
		mount: input.mount,
		intervals: input.intervals,
		sensorMaxHz: input.sensorMaxHz,
		input: measured ? 'angles' : 'tooth',
		// Worked out from the angles with input=angles; as given otherwise.
		toothAtTdc: Math.round(input.toothAtTdc * 1e4) / 1e4,
		measured: measured
			? { sensorAngleDeg: measured.sensorFromTdcDeg, keywayAngleDeg: measured.keywayDeg, keyAngleDeg: measured.keyFromTdcDeg }
			: null,
		...phasing(input),
		clocking: clocking ? { ...clocking, keywayAngleDeg: clockingFor(clocking.targetDeg, clocking.keyFromSensorDeg, input.mount) } : null
	});
}
