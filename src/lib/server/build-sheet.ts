import { error } from '@sveltejs/kit';
import { lengthText } from '$lib/params';
import { checkBuildSheet, type ParsedBuildSheet } from '$lib/schemas/phasing';
import type { Checked } from '$lib/schemas/refusal';
import type { Params } from '$lib/schemas/registry';
import { checkTape, type CheckedTape } from '$lib/schemas/tape';
import { readCurve } from '$lib/schemas/timing-card';
import { wheelParams } from '$lib/schemas/wheel-params';
import { firingTdcs } from '$lib/trade/engine';
import { phasing } from '$lib/trade/phasing';
import { fromTdcLine, tapeMarks } from '$lib/trade/tape';
import { timingRows } from '$lib/trade/timing';
import { getBuild } from './builds';
import type { Queryable } from './db';
import { designsOf, getDesign, revisionOf } from './designs';
import type { BuildSheet, SheetCard, SheetTape } from './exports/build-sheet-pdf';
import { buildSheetName } from './exports/names';
import { signalCheckPage, tapePage, tdcRecordPage } from './build-lists';

// The build sheet, from parameters alone (the public tool) or from a saved build: both checked by
// checkBuildSheet, both named by names.ts, both printed by build-sheet-pdf.ts.

export interface SheetFile {
	sheet: BuildSheet;
	filename: string;
}

/** The wheel's parameters as given (not defaulted): the sheet lists them, so nothing of the design is left unsaid. */
const wheelGiven = (params: Partial<Record<string, string>>): Params =>
	Object.fromEntries(
		wheelParams.names.flatMap((name) => {
			const value = params[name]?.trim();
			return value ? [[name, value]] : [];
		})
	);

/**
 * The tape as the sheet prints it: a saved tape's own hub, rotation, window and marks, each
 * cylinder's TDC from the engine profile; or, from a hub diameter alone, the wheel's rotation (the
 * same public `rotation`: the crank seen from the wheel side) on office paper.
 */
function sheetTape(parsed: ParsedBuildSheet, saved: CheckedTape | null, label: string | null): SheetTape | null {
	const base = saved?.spec ?? null;
	const hubDiameterMm = base?.hubDiameterMm ?? parsed.tapeHubMm;
	if (hubDiameterMm === null) return null;
	const input = parsed.phasing.input;
	// On the hub the crank's angle counts once a turn: a four-stroke's cylinder at 450° comes round at 90°.
	const tdcs = firingTdcs(input.intervals).slice(1);
	const spec = {
		hubDiameterMm,
		paperThicknessMm: base?.paperThicknessMm ?? 0.1,
		rotation: base?.rotation ?? parsed.wheel.spec.rotation,
		windowDeg: base?.windowDeg ?? 180,
		tickDeg: 1,
		midEveryDeg: 5,
		labelEveryDeg: 10,
		timingMarks: base?.timingMarks ?? [],
		otherTdc: tdcs.map((deg, i) => ({ label: `cyl ${i + 2}`, atdcDeg: deg }))
	};
	return { spec, label, saved: saved !== null, marks: tapeMarks(spec) };
}

/** The timing-light card's rows: the advance curve saved with the tape, else its spec timings. */
function sheetCard(tape: SheetTape | null, savedParams: Params | null): SheetCard | null {
	if (!tape) return null;
	const curve = savedParams?.curve ? readCurve(savedParams.curve) : null;
	if (curve?.ok)
		return {
			from: 'the advance curve saved with the tape',
			rows: timingRows(curve.value, tape.spec).map((r) => ({ ...r, what: `${r.rpm} rpm` }))
		};
	if (!tape.spec.timingMarks.length) return null;
	return {
		from: "the tape's spec timings",
		rows: tape.spec.timingMarks.map((m) => ({ what: m.label, advanceDeg: m.btdcDeg, ...fromTdcLine(tape.spec, -m.btdcDeg) }))
	};
}

const printed = (
	parsed: ParsedBuildSheet,
	given: Params,
	saved: { tape: CheckedTape; label: string; params: Params } | null
): BuildSheet => {
	const tape = sheetTape(parsed, saved?.tape ?? null, saved?.label ?? null);
	return {
		...parsed,
		date: new Date().toISOString().slice(0, 10),
		result: phasing(parsed.phasing.input),
		given,
		tape,
		card: sheetCard(tape, saved?.params ?? null)
	};
};

/** A build sheet from the wheel's, the phasing check's and the sheet's own parameters. */
export function sheetFromParams(params: Partial<Record<string, string>>): Checked<SheetFile> {
	const parsed = checkBuildSheet(params);
	if (!parsed.ok) return parsed;
	return { ok: true, value: { sheet: printed(parsed.value, wheelGiven(params), null), filename: buildSheetName(parsed.value.buildName) } };
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
	// The newest of each list, by the lists' own index (a build may hold thousands of records).
	const newest = { limit: 1 };
	const [tdc] = (await tdcRecordPage(database, access.buildId, newest)).items;
	if (tdc?.params.a !== undefined && tdc.params.b !== undefined) Object.assign(params, { tdcA: tdc.params.a, tdcB: tdc.params.b });
	const [tape] = (await tapePage(database, access.buildId, newest)).items;
	const hub = tape ? checkTape(tape.params) : null;
	if (hub?.ok) params.tapeDiameter = lengthText(hub.value.spec.hubDiameterMm, params.units === 'in' ? 'in' : 'mm');

	const parsed = checkBuildSheet(params);
	if (!parsed.ok) return parsed;
	const sheet = printed(
		{ ...parsed.value, buildName: build.name, revision: `${revision.number} of “${design.name}”` },
		wheelGiven(revision.params),
		tape && hub?.ok ? { tape: hub.value, label: tape.label, params: tape.params } : null
	);
	const [signal] = (await signalCheckPage(database, access.buildId, newest)).items;
	sheet.signal = signal ? { label: signal.label, date: signal.createdAt.toISOString().slice(0, 10), cases: signal.cases } : null;
	return { ok: true, value: { sheet, filename: buildSheetName(build.name, revision.number) } };
}
