import { and, eq } from 'drizzle-orm';
import type { Refusal } from '$lib/schemas/refusal';
import type { Database } from './db';
import { signalCheck, type FlatParams, type SignalCaseHeadline } from './db/schema';
import { logActivity } from './activity';
import { touchBuild } from './builds';
import { signalHeadline } from './signal-headline';

// A build's saved signal checks: the parameters as the signal check takes them (the page and
// GET /api/v1/signal), checked again here by the same check, with each case's sync margin worked out
// here too: a saved headline never comes from the browser.

export type SignalWrite = { ok: true; id: string; cases: SignalCaseHeadline[] } | { ok: false; refusals: Refusal[] };

const keep = (params: FlatParams) => Object.fromEntries(Object.entries(params).filter(([, v]) => v.trim() !== ''));

const pct = (v: number) => `${Math.round(v)}%`;

/** The activity line: the tightest case decides how the check reads. */
export function headlineWords(cases: readonly SignalCaseHeadline[]): string {
	if (!cases.length) return 'no speed cases';
	const worst = cases.reduce((a, b) => (b.marginPct < a.marginPct ? b : a));
	const failing = cases.filter((c) => c.verdict === 'fails').length;
	if (failing) return `${failing} of ${cases.length} speed cases fail, worst ${worst.name} (sync margin ${pct(worst.marginPct)})`;
	return `every speed case finds the gap, tightest ${worst.name} (sync margin ${pct(worst.marginPct)}, ${worst.verdict})`;
}

export async function saveSignalCheck(
	database: Database,
	buildId: string,
	input: { label: string; params: FlatParams },
	authorId: string
): Promise<SignalWrite> {
	const checked = signalHeadline(input.params);
	if (!checked.ok) return checked;
	const cases = checked.value;
	return database.transaction(async (tx) => {
		const [row] = await tx
			.insert(signalCheck)
			.values({ buildId, label: input.label, params: keep(input.params), cases, authorId })
			.returning({ id: signalCheck.id });
		await logActivity(tx, {
			buildId,
			actorId: authorId,
			kind: 'signal',
			summary: `Signal check${input.label ? ` “${input.label}”` : ''}: ${headlineWords(cases)}`
		});
		await touchBuild(tx, buildId);
		return { ok: true as const, id: row!.id, cases };
	});
}

export async function deleteSignalCheck(database: Database, buildId: string, id: string, actorId: string): Promise<boolean> {
	return database.transaction(async (tx) => {
		const rows = await tx
			.delete(signalCheck)
			.where(and(eq(signalCheck.id, id), eq(signalCheck.buildId, buildId)))
			.returning({ label: signalCheck.label });
		if (!rows[0]) return false;
		await touchBuild(tx, buildId);
		await logActivity(tx, {
			buildId,
			actorId,
			kind: 'signal',
			summary: `Signal check${rows[0].label ? ` “${rows[0].label}”` : ''} removed`
		});
		return true;
	});
}
