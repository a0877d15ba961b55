import { buildSheetHref, patternNames, phasingHref, tapeHref, tdcHref, wheelHref, type HeadWheel, type Params } from './build-links';
import { checkPhasing, phasingParams } from './schemas/phasing';
import { tdcRecordWords } from './schemas/tdc';
import { wheelParams } from './schemas/wheel-params';

// A build's job as a sequence of steps, each with its state, from what the build holds (its
// overview). Isomorphic: the build page and GET /api/v1/builds/:id both call it.
//
// What each state means, step by step:
// - Engine described: done when the engine profile has its layout (a preset or typed intervals).
// - Wheel designed: done when the build has a wheel design with a revision. The steps follow one
//   design, the one the build sheet takes: the first by name that has a revision.
// - Cutting package sent: done when a package was sent for that design at its head revision;
//   stale when only older revisions of it were sent.
// - TDC found: done when the build keeps a TDC record.
// - Degree tape printed: done when the build keeps a degree tape (the record the tape is printed from).
//   TDC and the tape measure the engine and its hub, not the wheel, so a new wheel leaves them done.
// - Phasing checked: done when the engine profile is saved and its copy of the wheel's pattern
//   (pattern, teeth, missing, gaps, extra tooth, tooth width; the keyway angle when the sensor was
//   placed by angles) is the head revision's; stale, with each difference, when it is not.
// - Build sheet issued: done when the build sheet was downloaded (the activity log's 'build-sheet'
//   entry) and nothing it prints changed since: the wheel's head revision, the engine profile, the
//   newest TDC record or degree tape. Stale, naming what changed, when one did.

export type StepState = 'todo' | 'done' | 'stale';
export type StepId = 'engine' | 'wheel' | 'cutting' | 'tdc' | 'tape' | 'phasing' | 'sheet';

export interface BuildStep {
	id: StepId;
	title: string;
	state: StepState;
	/** What the state rests on, in plain words: what was done, or what is needed. */
	detail: string;
	/** For a stale step: each change since it was done, like "teeth 36 → 24". */
	changes: string[];
	/** The tool or the file, prefilled from the build; null when the step cannot be taken yet. */
	href: string | null;
	/** The link's words. */
	action: string;
	/** The link is a file to download, not a page. */
	download: boolean;
}

type When = string | Date;

/** What the steps read from a build's overview (src/lib/server/build-overview.ts); the rest of it is ignored. */
export interface ThreadSource {
	build: { id: string; name?: string; engineProfile: Params | null };
	/** In the order the build sheet picks from (by name). */
	designs: { id: string; name: string }[];
	/** The newest revision of each design. */
	headRevisions: { designId: string; number: number; params: Params; createdAt: When }[];
	cuttingPackages: { designId: string | null; revision: number; createdAt: When }[];
	/** Newest first, as the overview gives them. */
	tdcRecords: { params: Params; tdcDeg: string; createdAt: When }[];
	/** Newest first. */
	tapes: { params: Params; createdAt: When }[];
	/** The newest activity entry of each kind the steps read ('engine', 'build-sheet'). */
	latestActivity: { kind: string; summary: string; createdAt: When }[];
}

const time = (when: When) => (when instanceof Date ? when : new Date(when)).getTime();
const newest = <T extends { createdAt: When }>(rows: T[]): T | undefined =>
	rows.reduce<T | undefined>((best, row) => (!best || time(row.createdAt) > time(best.createdAt) ? row : best), undefined);

/** The wheel the steps follow: the first design by name with a revision, and that revision. */
export function headWheel(source: Pick<ThreadSource, 'designs' | 'headRevisions'>) {
	for (const design of source.designs) {
		const head = source.headRevisions.find((r) => r.designId === design.id);
		if (head) return { design, head };
	}
	return null;
}

const lowerFirst = (text: string) => text.charAt(0).toLowerCase() + text.slice(1);

/** A value as the change list shows it: lengths with their units, angles in degrees. */
function shown(name: string, value: string, units: string): string {
	if (value === '') return 'none';
	const kind = wheelParams.get(name)?.kind;
	if (kind === 'length') return `${value} ${units === 'in' ? 'in' : 'mm'}`;
	if (kind === 'angle') return `${value}°`;
	return value;
}

/** Two values alike: numbers by value ("0.50" is "0.5"), the rest as text. */
function same(a: string, b: string): boolean {
	const x = Number(a);
	const y = Number(b);
	if (a.trim() !== '' && b.trim() !== '' && Number.isFinite(x) && Number.isFinite(y)) return x === y;
	return a.trim().toLowerCase() === b.trim().toLowerCase();
}

/**
 * How the engine profile's copy of the wheel differs from the wheel's revision, as "teeth 36 → 24"
 * (profile's value first). A name left out counts as its registry default on each side; a name that
 * applies on neither side (gap positions of a missing-tooth wheel) is not compared.
 */
export function wheelChanges(profile: Params, wheel: Params): string[] {
	const phasingDefaults = phasingParams.defaults('mm');
	const wheelUnits = wheel.units === 'in' ? 'in' : 'mm';
	const wheelDefaults = wheelParams.defaults(wheelUnits);
	const names: string[] = [...patternNames];
	if (profile.input === 'angles') names.push('keywayAngle');
	const changes: string[] = [];
	for (const name of names) {
		const def = wheelParams.get(name);
		const applies = (p: Params) => def?.appliesWhen?.(p) ?? true;
		if (!applies(profile) && !applies(wheel)) continue;
		const was = (profile[name] ?? '').trim() || (phasingDefaults[name] ?? '');
		const now = (wheel[name] ?? '').trim() || (wheelDefaults[name] ?? '');
		if (!same(was, now))
			changes.push(`${lowerFirst(def?.label ?? name)} ${shown(name, was, wheelUnits)} → ${shown(name, now, wheelUnits)}`);
	}
	return changes;
}

function engineStep(profile: Params | null, link: string): BuildStep {
	const base = { id: 'engine' as const, title: 'Engine described', changes: [], href: link, download: false };
	if (!profile || !(profile.layout?.trim() || profile.intervals?.trim()))
		return {
			...base,
			state: 'todo',
			detail: 'Layout, firing intervals, rev limit and sensor: in the phasing check.',
			action: 'Describe the engine'
		};
	const checked = checkPhasing(profile);
	const detail = checked.ok
		? checked.value.layoutLabel
		: 'Saved, but it no longer passes the phasing check: open it to see what to change.';
	return { ...base, state: 'done', detail, action: 'Open in the phasing check' };
}

function wheelStep(wheel: ReturnType<typeof headWheel>, link: string): BuildStep {
	const base = { id: 'wheel' as const, title: 'Wheel designed', changes: [], href: link, download: false };
	if (!wheel) return { ...base, state: 'todo', detail: 'No wheel design yet.', action: 'Design the wheel' };
	const p = wheel.head.params;
	const pattern =
		!p.pattern || p.pattern === 'missing' ? `${p.teeth ?? '36'}-${p.missing ?? '1'}` : `${p.teeth ?? '36'} teeth, ${p.pattern}`;
	return {
		...base,
		state: 'done',
		detail: `“${wheel.design.name}” revision ${wheel.head.number}: ${pattern}`,
		action: 'Open in the designer'
	};
}

function cuttingStep(source: ThreadSource, wheel: ReturnType<typeof headWheel>, link: string): BuildStep {
	const base = { id: 'cutting' as const, title: 'Cutting package sent', changes: [] as string[], href: link, download: false };
	const action = 'Send a cutting package';
	if (!wheel) return { ...base, href: null, state: 'todo', detail: 'Needs a wheel design first.', action };
	const sent = source.cuttingPackages.filter((p) => p.designId === wheel.design.id);
	if (sent.some((p) => p.revision === wheel.head.number))
		return { ...base, state: 'done', detail: `Revision ${wheel.head.number} sent.`, action };
	const last = newest(sent);
	if (!last) return { ...base, state: 'todo', detail: `Not sent yet for “${wheel.design.name}”.`, action };
	const change = `sent for revision ${last.revision}; the wheel is now at revision ${wheel.head.number}`;
	return { ...base, state: 'stale', detail: 'The wheel changed since it was sent.', changes: [change], action };
}

function tdcStep(source: ThreadSource, link: string): BuildStep {
	const base = { id: 'tdc' as const, title: 'TDC found', changes: [], href: link, download: false, action: 'Find TDC' };
	const record = newest(source.tdcRecords);
	if (!record) return { ...base, state: 'todo', detail: 'Two piston-stop marks, TDC half-way between them.' };
	return { ...base, state: 'done', detail: `TDC ${tdcRecordWords(record.params, record.tdcDeg).tdc} of the scale’s 0.` };
}

function tapeStep(source: ThreadSource, link: string): BuildStep {
	const base = {
		id: 'tape' as const,
		title: 'Degree tape printed',
		changes: [],
		href: link,
		download: false,
		action: 'Make a degree tape'
	};
	const tape = newest(source.tapes);
	if (!tape) return { ...base, state: 'todo', detail: 'Sized to the timing hub, zero at TDC.' };
	const units = tape.params.units === 'in' ? 'in' : 'mm';
	const hub = tape.params.diameter
		? `hub diameter ${tape.params.diameter} ${units}`
		: tape.params.circumference
			? `hub circumference ${tape.params.circumference} ${units}`
			: 'a degree tape';
	return { ...base, state: 'done', detail: `For a ${hub}.` };
}

function phasingStep(profile: Params | null, wheel: ReturnType<typeof headWheel>, link: string): BuildStep {
	const base = {
		id: 'phasing' as const,
		title: 'Phasing checked',
		changes: [] as string[],
		href: link,
		download: false,
		action: 'Check phasing'
	};
	if (!profile) return { ...base, state: 'todo', detail: 'The engine profile is not saved yet.' };
	if (!wheel) return { ...base, state: 'todo', detail: 'Needs a wheel design to check against.' };
	const changes = wheelChanges(profile, wheel.head.params);
	if (changes.length) return { ...base, state: 'stale', detail: 'The wheel changed since the engine profile was saved.', changes };
	return { ...base, state: 'done', detail: `Saved against revision ${wheel.head.number}'s pattern.` };
}

function sheetStep(source: ThreadSource, wheel: ReturnType<typeof headWheel>, link: string): BuildStep {
	const base = { id: 'sheet' as const, title: 'Build sheet issued', changes: [] as string[], href: link, download: true };
	const action = 'Download the build sheet';
	if (!source.build.engineProfile || !wheel)
		return { ...base, href: null, state: 'todo', detail: 'Needs the engine profile and a wheel design first.', action };
	const issued = source.latestActivity.find((a) => a.kind === 'build-sheet');
	if (!issued) return { ...base, state: 'todo', detail: 'Not downloaded yet.', action };
	const since = (when: When | undefined) => when !== undefined && time(when) > time(issued.createdAt);
	const changes: string[] = [];
	if (since(wheel.head.createdAt)) changes.push(`wheel revision ${wheel.head.number} saved`);
	if (since(source.latestActivity.find((a) => a.kind === 'engine')?.createdAt)) changes.push('engine profile saved');
	if (since(newest(source.tdcRecords)?.createdAt)) changes.push('TDC record added');
	if (since(newest(source.tapes)?.createdAt)) changes.push('degree tape kept');
	if (changes.length) return { ...base, state: 'stale', detail: 'Changed since it was issued.', changes, action };
	return { ...base, state: 'done', detail: issued.summary, action };
}

/** The build's job in order, each step with its state and its tool prefilled from the build. */
export function buildSteps(source: ThreadSource): BuildStep[] {
	const profile = source.build.engineProfile;
	const wheel = headWheel(source);
	const links: HeadWheel | null = wheel && { designId: wheel.design.id, params: wheel.head.params };
	const buildId = source.build.id;
	const phasing = phasingHref(buildId, profile, links);
	return [
		engineStep(profile, phasing),
		wheelStep(wheel, wheelHref(buildId, profile, links)),
		cuttingStep(source, wheel, '#packages-title'),
		tdcStep(source, tdcHref(buildId)),
		tapeStep(source, tapeHref(buildId, newest(source.tapes)?.params ?? null, source.build.name)),
		phasingStep(profile, wheel, phasing),
		sheetStep(source, wheel, buildSheetHref(buildId, links))
	];
}
