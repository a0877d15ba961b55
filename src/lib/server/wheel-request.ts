import { refuse } from './api';
import { parseWheel, wheelParamNames, type ParsedWheel } from '$lib/schemas/wheel';
import { summarize, type WheelSummary } from '$lib/trade/summary';
import type { FieldErrors } from '$lib/schemas/form';

export type CheckedWheel = { ok: true; wheel: ParsedWheel; summary: WheelSummary; params: Record<string, string> } | { ok: false; errors: FieldErrors };

/** A wheel from flat parameters: the design, its summary and the given parameters it knows, or an error per bad field. */
export function checkWheel(params: Record<string, string | undefined>): CheckedWheel {
	const parsed = parseWheel(params);
	if (!parsed.ok) return { ok: false, errors: parsed.errors };
	const result = summarize(parsed.value.spec, parsed.value.units, parsed.value.running);
	if (!result.ok) return { ok: false, errors: Object.fromEntries(result.refusals.map((r) => [r.field, r.message])) };
	const known = Object.entries(params).filter((e): e is [string, string] => wheelParamNames.includes(e[0]) && e[1] !== undefined && e[1] !== '');
	return { ok: true, wheel: parsed.value, summary: result.summary, params: Object.fromEntries(known) };
}

export type WheelRequest = { ok: true; wheel: ParsedWheel; summary: WheelSummary } | { ok: false; response: Response };

/** Reads a wheel from query parameters: the design and its summary, or the 400 that names each bad field. */
export function wheelFromQuery(url: URL): WheelRequest {
	const checked = checkWheel(Object.fromEntries(url.searchParams));
	return checked.ok ? checked : { ok: false, response: refuse(checked.errors) };
}
