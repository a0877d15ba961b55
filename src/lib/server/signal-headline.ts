import type { Checked } from '$lib/schemas/refusal';
import { checkSignalCases } from '$lib/schemas/signal-cases';
import { signalCheck } from '$lib/trade/signal';
import { syncVerdict } from '$lib/trade/sync-verdict';
import type { SignalCaseHeadline } from './db/schema';

/** Each speed case's sync margin, by the check the page runs (the API's, with each case as given): what a saved check keeps. */
export function signalHeadline(params: Partial<Record<string, string>>): Checked<SignalCaseHeadline[]> {
	const checked = checkSignalCases(params);
	if (!checked.ok) return checked;
	const result = signalCheck(checked.value.input);
	return {
		ok: true,
		value: result.cases.map((c) => ({
			name: c.case.label,
			rpm: Math.round(c.case.rpm),
			marginPct: Math.round(c.syncMargin * 1000) / 10,
			verdict: syncVerdict(c.syncMargin)
		}))
	};
}
