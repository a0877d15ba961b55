import { refuse } from './api';
import { checkWheel as check, checkWheelShape, type ParsedWheel } from '$lib/schemas/wheel';
import { namedErrors, type Refusal } from '$lib/schemas/refusal';
import type { WheelSummary } from '$lib/trade/summary';
import type { FieldErrors } from '$lib/schemas/form';

export type CheckedWheel =
	| { ok: true; wheel: ParsedWheel; summary: WheelSummary; params: Record<string, string> }
	| { ok: false; errors: FieldErrors; refusals: Refusal[] };

/**
 * The wheel's one check (`checkWheel` in $lib/schemas/wheel, which the designer page runs too), in
 * the shape the build and design routes read: the refusals also as a field → `field: message` map.
 */
export function checkWheel(params: Record<string, string | undefined>): CheckedWheel {
	const checked = check(params);
	if (!checked.ok) return { ok: false, errors: namedErrors(checked.refusals), refusals: checked.refusals };
	const { summary, params: known, ...wheel } = checked.value;
	return { ok: true, wheel, summary, params: known };
}

export type WheelRequest = { ok: true; wheel: ParsedWheel; summary: WheelSummary } | { ok: false; response: Response };

/** Reads a wheel from query parameters: the design and its summary, or the 400 that names each bad field. */
export function wheelFromQuery(url: URL): WheelRequest {
	const checked = check(Object.fromEntries(url.searchParams));
	if (!checked.ok) return { ok: false, response: refuse(checked.refusals) };
	const { summary, ...wheel } = checked.value;
	return { ok: true, wheel, summary };
}

export type WheelShapeRequest = { ok: true; wheel: ParsedWheel } | { ok: false; response: Response };

/** The same for a drawing file (DXF, SVG, STL): the same refusals, without the summary such a file never states. */
export function wheelShapeFromQuery(url: URL): WheelShapeRequest {
	const checked = checkWheelShape(Object.fromEntries(url.searchParams));
	return checked.ok ? { ok: true, wheel: checked.value } : { ok: false, response: refuse(checked.refusals) };
}
