import { error } from '@sveltejs/kit';
import { lengthText } from '$lib/params';
import { checkBuildSheet, type ParsedBuildSheet } from '$lib/schemas/phasing';
import type { Checked } from '$lib/schemas/refusal';
import { checkTape } from '$lib/schemas/tape';
import { phasing } from '$lib/trade/phasing';
import { getBuild } from './builds';
import type { Queryable } from './db';
import { designsOf, getDesign, revisionOf } from './designs';
import type { BuildSheet } from './exports/build-sheet-pdf';
import { buildSheetName } from './exports/names';
import { tapesOf, tdcRecordsOf } from './records';

// The build sheet, from parameters alone (the public tool) or from a saved build: both checked by
// checkBuildSheet, both named by names.ts, both printed by build-sheet-pdf.ts.

export interface SheetFile {
	sheet: BuildSheet;
	filename: string;
}

const printed = (parsed: ParsedBuildSheet): BuildSheet => ({
	...parsed,
	date: new Date().toISOString().slice(0, 10),
	result: phasing(parsed.phasing.input)
});

/** A build sheet from the wheel's, the phasing check's and the sheet's own parameters. */
export function sheetFromParams(params: Partial<Record<string, string>>): Checked<SheetFile> {
	const parsed = checkBuildSheet(params);
	if (!parsed.ok) return parsed;
	return { ok: true, value: { sheet: printed(parsed.value), filename: buildSheetName(parsed.value.buildName) } };
}

/**
 * The build sheet of a saved build the caller may read (objectAccess): its engine profile, a wheel
 * design's revision (the first design's newest unless named), the newest TDC record and degree tape.
 * A build without the profile or a design answers 422; a design or revision not in it, 404.
 */
export async function buildSheetFor(
	database: Queryable,
	access: { buildId: string },
	choice: { design?: string; revision?: number }
): Promise<Checked<SheetFile>> {
	const build = (await getBuild(database, access.buildId))!;
	if (!build.engineProfile)
		error(422, {
			message: 'engineProfile: this build has no engine profile yet; set it up in the phasing check and save it to the build.',
			code: 'incomplete'
		});
	const designId = choice.design ?? (await designsOf(database, access.buildId))[0]?.id;
	const design = designId ? await getDesign(database, designId) : undefined;
	if (!design || design.buildId !== access.buildId) {
		error(choice.design ? 404 : 422, {
			message: choice.design ? 'design: no such wheel design in this build' : 'design: this build has no wheel design yet',
			code: choice.design ? 'not-found' : 'incomplete'
		});
	}
	const revision = await revisionOf(database, design.id, choice.revision);
	if (!revision) error(404, { message: `revision: “${design.name}” has no revision ${choice.revision}`, code: 'not-found' });

	// The wheel as saved wins over the profile's copy of its pattern; records add the TDC and the hub.
	const params: Record<string, string> = { ...build.engineProfile, ...revision.params };
	const [tdc] = await tdcRecordsOf(database, access.buildId);
	if (tdc?.params.a !== undefined && tdc.params.b !== undefined) Object.assign(params, { tdcA: tdc.params.a, tdcB: tdc.params.b });
	const [tape] = await tapesOf(database, access.buildId);
	const hub = tape ? checkTape(tape.params) : null;
	if (hub?.ok) params.tapeDiameter = lengthText(hub.value.spec.hubDiameterMm, params.units === 'in' ? 'in' : 'mm');

	const parsed = checkBuildSheet(params);
	if (!parsed.ok) return parsed;
	const sheet = printed({ ...parsed.value, buildName: build.name, revision: `${revision.number} of “${design.name}”` });
	return { ok: true, value: { sheet, filename: buildSheetName(build.name, revision.number) } };
}
