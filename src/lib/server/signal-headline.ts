import type { Checked } from '$lib/schemas/refusal';
import { checkSignal } from '$lib/schemas/signal';
import { signalCheck } from '$lib/trade/signal';
import { syncVerdict } from '$lib/trade/sync-verdict';
import type { SignalCaseHeadline } from './db/schema';

/** Each speed case's sync margin, by the check GET /api/v1/signal and the page run: what a saved check keeps. */
export function signalHeadline(params: Partial<Record<string, string>>): Checked<SignalCaseHeadline[]> {
	const checked = checkSignal(params);
	if (!checked.ok) return checked;
	const result = signalCheck(checked.value.input);
	return {
		ok: true,
		value: result.cases.map((c) => ({
			name: c.case.label,
			rpm: Math.round(c.case.rpm),
			marginPct: Math.round(c.margin * 1000) / 10,
			verdict: syncVerdict(c.margin)
		}))
	};
}
