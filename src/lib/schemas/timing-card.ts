import type { Rotation } from '$lib/trade/hub';
import { curveLimits, type AdvancePoint } from '$lib/trade/timing';
import type { Units } from '$lib/trade/units';
import { firstPerField, refusal, type Checked } from './refusal';
import { allows, defineRegistry, readUnits } from './registry';
import { hubDiameterOf, hubParams } from './tape';

// The timing-light card's public parameters (the tape page's card section, /api/v1/timing-card.pdf):
// the tape's hub, and the advance curve. One check, `checkTimingCard`, for the page and the route.

const { rpmMin, rpmMax, advanceMinDeg, advanceMaxDeg, maxPoints } = curveLimits;
const minus = (n: number) => (n < 0 ? `−${-n}` : String(n));

export const timingCardRegistry = defineRegistry([
	...hubParams,
	{
		name: 'name',
		label: 'Name on the card',
		help: 'The build or engine the card is for, printed at its top; up to 80 characters.',
		kind: 'text',
		max: 80
	},
	{
		name: 'curve',
		label: 'Advance curve',
		help: 'Engine speed and advance (degrees BTDC) pairs, like 1200:10, 3000:20.',
		kind: 'free',
		required: true,
		allows: `rpm:advance pairs like 1200:10, 3000:20 (rpm ${rpmMin} to ${rpmMax}, advance ${minus(advanceMinDeg)} to ${advanceMaxDeg}° BTDC)`
	}
]);

/** What one row of the curve table refuses, for the field beside it (the page shows them per row). */
export const curveRowAllows = {
	rpm: `A whole number from ${rpmMin} to ${rpmMax} rpm`,
	advance: `A number from ${minus(advanceMinDeg)} to ${advanceMaxDeg}° BTDC`
} as const;

/** One rpm and advance as typed: the point, or which of the two is wrong. */
export function checkCurvePoint(rpmText: string, advanceText: string): Checked<AdvancePoint> {
	const r = rpmText.trim();
	const a = advanceText.trim();
	const rpm = Number(r);
	const advanceDeg = Number(a);
	const refusals = [
		...(/^\d{2,5}$/.test(r) && rpm >= rpmMin && rpm <= rpmMax ? [] : [refusal('rpm', curveRowAllows.rpm)]),
		...(/^-?\d+(\.\d+)?$/.test(a) && advanceDeg >= advanceMinDeg && advanceDeg <= advanceMaxDeg
			? []
			: [refusal('advance', curveRowAllows.advance)])
	];
	return refusals.length ? { ok: false, refusals } : { ok: true, value: { rpm, advanceDeg } };
}

/** `1200:10, 2000:14`: rpm and advance pairs; the refusal's message is the whole curve's. */
export function readCurve(text: string): Checked<AdvancePoint[]> {
	const points: AdvancePoint[] = [];
	const whole = allows(timingCardRegistry.get('curve')!, 'mm');
	for (const item of text
		.split(',')
		.map((s) => s.trim())
		.filter(Boolean)) {
		const m = /^([^:]*):([^:]*)$/.exec(item);
		const point = m ? checkCurvePoint(m[1]!, m[2]!) : null;
		if (!point?.ok) return { ok: false, refusals: [refusal('curve', whole)] };
		points.push(point.value);
	}
	if (points.length < 1 || points.length > maxPoints)
		return { ok: false, refusals: [refusal('curve', `1 to ${maxPoints} rpm:advance pairs`)] };
	return { ok: true, value: points };
}

export interface CheckedCard {
	units: Units;
	paper: 'a4' | 'letter';
	hub: { hubDiameterMm: number; paperThicknessMm: number };
	rotation: Rotation;
	points: AdvancePoint[];
	/** The build's or engine's name, empty when none was given. */
	name: string;
}

/** The card's parameters as flat strings read and checked: the card, or the first reason per field. */
export function checkTimingCard(params: Partial<Record<string, string>>): Checked<CheckedCard> {
	const units = readUnits(params);
	if (!units.ok) return units;
	const read = timingCardRegistry.read(params, units.value);
	const curve = params.curve === undefined || params.curve === '' ? null : readCurve(params.curve);
	const refusals = [...(read.ok ? [] : read.refusals), ...(curve && !curve.ok ? curve.refusals : [])];
	if (!read.ok || !curve?.ok || refusals.length) return { ok: false, refusals: firstPerField(refusals) };
	const hub = hubDiameterOf(read.value);
	if (!hub.ok) return hub;
	const v = read.value;
	return {
		ok: true,
		value: {
			units: units.value,
			paper: v.paper as CheckedCard['paper'],
			rotation: v.rotation as Rotation,
			hub: { hubDiameterMm: hub.value, paperThicknessMm: v.paperThickness as number },
			points: curve.value,
			name: (v.name as string | undefined) ?? ''
		}
	};
}
