import { refuse } from './api';
import { parseWheel, type ParsedWheel } from '$lib/schemas/wheel';
import { summarize, type WheelSummary } from '$lib/trade/summary';

export type WheelRequest = { ok: true; wheel: ParsedWheel; summary: WheelSummary } | { ok: false; response: Response };

/** Reads a wheel from query parameters: the design and its summary, or the 400 that names each bad field. */
export function wheelFromQuery(url: URL): WheelRequest {
	const parsed = parseWheel(Object.fromEntries(url.searchParams));
	if (!parsed.ok) return { ok: false, response: refuse(parsed.errors) };
	const result = summarize(parsed.value.spec, parsed.value.units, parsed.value.running);
	if (!result.ok) return { ok: false, response: refuse(Object.fromEntries(result.refusals.map((r) => [r.field, r.message]))) };
	return { ok: true, wheel: parsed.value, summary: result.summary };
}
