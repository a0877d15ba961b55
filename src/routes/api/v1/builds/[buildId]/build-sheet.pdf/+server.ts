import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { lengthText } from '$lib/params';
import { revisionNumber } from '$lib/schemas/build';
import { parseBuildSheet } from '$lib/schemas/phasing';
import { parseTape } from '$lib/schemas/tape';
import { objectAccess } from '$lib/server/access';
import { fileResponse, queryOf, refuse } from '$lib/server/api';
import { getBuild } from '$lib/server/builds';
import { db } from '$lib/server/db';
import { designsOf, getDesign, revisionOf } from '$lib/server/designs';
import { buildSheetPdf } from '$lib/server/exports/build-sheet-pdf';
import { tapesOf, tdcRecordsOf } from '$lib/server/records';
import { phasing } from '$lib/trade/phasing';

const query = z.object({ design: z.uuid({ error: 'design: a wheel design id of this build' }).optional(), revision: revisionNumber.optional() });

/**
 * The build sheet from the saved build: its engine profile, a wheel design's revision (the first
 * design's newest unless named), the newest TDC record and degree tape.
 */
export async function GET(event) {
	const access = await objectAccess(event, 'read', 'build', event.params.buildId);
	const q = queryOf(event.url, query);
	if (!q.ok) return q.response;
	const build = (await getBuild(db(), access.buildId))!;
	if (!build.engineProfile) error(422, { message: 'engineProfile: this build has no engine profile yet; set it up in the phasing check and save it to the build.', code: 'incomplete' });
	const designId = q.data.design ?? (await designsOf(db(), access.buildId))[0]?.id;
	const design = designId ? await getDesign(db(), designId) : undefined;
	if (!design || design.buildId !== access.buildId) error(q.data.design ? 404 : 422, { message: q.data.design ? 'design: no such wheel design in this build' : 'design: this build has no wheel design yet', code: q.data.design ? 'not-found' : 'incomplete' });
	const revision = await revisionOf(db(), design.id, q.data.revision);
	if (!revision) error(404, { message: `revision: “${design.name}” has no revision ${q.data.revision}`, code: 'not-found' });

	// The wheel as saved wins over the profile's copy of its pattern; records add the TDC and the hub.
	const params: Record<string, string> = { ...build.engineProfile, ...revision.params };
	const [tdc] = await tdcRecordsOf(db(), access.buildId);
	if (tdc?.params.a !== undefined && tdc.params.b !== undefined) Object.assign(params, { tdcA: tdc.params.a, tdcB: tdc.params.b });
	const [tape] = await tapesOf(db(), access.buildId);
	const hub = tape ? parseTape(tape.params) : null;
	if (hub?.ok) params.tapeDiameter = lengthText(hub.value.spec.hubDiameterMm, params.units === 'in' ? 'in' : 'mm');

	const parsed = parseBuildSheet(params);
	if (!parsed.ok) return refuse(parsed.errors);
	const sheet = { ...parsed.value, buildName: build.name, revision: `${revision.number} of “${design.name}”` };
	const pdf = await buildSheetPdf({ ...sheet, date: new Date().toISOString().slice(0, 10), result: phasing(sheet.phasing.input) });
	const slug = build.name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'build';
	return fileResponse(pdf, 'application/pdf', `build-sheet-${slug}-r${revision.number}.pdf`, 'private');
}
