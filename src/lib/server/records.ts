import { and, eq } from 'drizzle-orm';
import { refusal, type Refusal } from '$lib/schemas/refusal';
import { checkTape } from '$lib/schemas/tape';
import { checkTdc, tdcRecordParams } from '$lib/schemas/tdc';
import { sideText, spreadFromRim } from '$lib/trade/tdc';
import type { Database } from './db';
import { degreeTape, tdcRecord, type FlatParams } from './db/schema';
import { logActivity } from './activity';
import { touchBuild } from './builds';

// A build's TDC records and degree tapes: the parameters as the tools take them, checked by the
// tools' own schemas, so a saved record always opens again in its tool.

const keep = (params: FlatParams) => Object.fromEntries(Object.entries(params).filter(([, v]) => v.trim() !== ''));

/** The saved record's id, or the tool's refusals, named by the tool's own parameters. */
export type RecordWrite = { ok: true; id: string } | { ok: false; refusals: Refusal[] };

export async function saveTdcRecord(
	database: Database,
	buildId: string,
	input: { label: string; params: FlatParams },
	authorId: string
): Promise<RecordWrite> {
	const found = checkTdc(input.params);
	if (!found.ok) return found;
	if (found.value.kind === 'rim') {
		const spread = spreadFromRim(found.value.distanceMm, found.value.diameterMm);
		const why = `a TDC record needs the two piston-stop readings in degrees (the rim distance gives a spread of ${spread.spreadDeg.toFixed(2)}°)`;
		return { ok: false, refusals: [refusal('a', why)] };
	}
	const { marks, result } = found.value;
	// Kept with their sides and scale, so the record never depends on how the readings were typed.
	const params = tdcRecordParams(marks, input.params);
	// tdc_deg: degrees ATDC of the scale's 0, BTDC negative, on every scale.
	const tdcDeg = String(Math.round(result.tdcDeg * 1000) / 1000);
	return database.transaction(async (tx) => {
		const [row] = await tx
			.insert(tdcRecord)
			.values({ buildId, label: input.label, params, tdcDeg, authorId })
			.returning({ id: tdcRecord.id });
		await logActivity(tx, {
			buildId,
			actorId: authorId,
			kind: 'tdc',
			summary: `TDC record${input.label ? ` “${input.label}”` : ''}: marks ${sideText(marks.a.atdcDeg, marks.scale)} and ${sideText(marks.b.atdcDeg, marks.scale)}, TDC ${sideText(result.tdcDeg, marks.scale)} of the scale's 0`
		});
		await touchBuild(tx, buildId);
		return { ok: true as const, id: row!.id };
	});
}

export async function saveTape(
	database: Database,
	buildId: string,
	input: { label: string; params: FlatParams },
	authorId: string
): Promise<RecordWrite> {
	const parsed = checkTape(input.params);
	if (!parsed.ok) return parsed;
	const hub = parsed.value.spec.hubDiameterMm;
	return database.transaction(async (tx) => {
		const [row] = await tx
			.insert(degreeTape)
			.values({ buildId, label: input.label, params: keep(input.params), authorId })
			.returning({ id: degreeTape.id });
		await logActivity(tx, {
			buildId,
			actorId: authorId,
			kind: 'tape',
			summary: `Degree tape${input.label ? ` “${input.label}”` : ''} for a ${Math.round(hub * 100) / 100} mm hub`
		});
		await touchBuild(tx, buildId);
		return { ok: true as const, id: row!.id };
	});
}

export async function deleteRecord(
	database: Database,
	kind: 'tdc' | 'tape',
	buildId: string,
	id: string,
	actorId: string
): Promise<boolean> {
	const table = kind === 'tdc' ? tdcRecord : degreeTape;
	return database.transaction(async (tx) => {
		const rows = await tx
			.delete(table)
			.where(and(eq(table.id, id), eq(table.buildId, buildId)))
			.returning({ label: table.label });
		if (!rows[0]) return false;
		// A removal is a change to the build like any other: it moves the build up the "updated" sort.
		await touchBuild(tx, buildId);
		await logActivity(tx, {
			buildId,
			actorId,
			kind,
			summary: `${kind === 'tdc' ? 'TDC record' : 'Degree tape'}${rows[0].label ? ` “${rows[0].label}”` : ''} removed`
		});
		return true;
	});
}
