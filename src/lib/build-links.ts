// The tools' addresses prefilled from a build: what each tool is opened with when a build's page
// links to it, so the numbers travel instead of being typed again. Isomorphic (no server imports).

export type Params = Record<string, string>;

/**
 * The wheel's parameters that the phasing check or its build sheet also take, with one meaning in
 * both (src/lib/schemas/phasing.ts). Where a build has a saved wheel, these come from its head
 * revision and never from the engine profile's copy: the wheel as cut is the one on the engine.
 */
export const wheelOwned = [
	'units',
	'pattern',
	'teeth',
	'missing',
	'gaps',
	'extraAfter',
	'duty',
	'keywayAngle',
	'od',
	'depth',
	'bore',
	'thickness',
	'material'
] as const;

/** The pattern part of the wheel: what a new design for a build takes from its engine profile. */
export const patternNames = ['pattern', 'teeth', 'missing', 'gaps', 'extraAfter', 'duty'] as const;

const given = (value: string | undefined): value is string => value !== undefined && value.trim() !== '';

/**
 * The phasing check's parameters for a build: the engine profile with the head revision's wheel
 * over it. A wheel-owned name the wheel leaves out is dropped from the profile too, so the check
 * starts from the wheel's default rather than from an older pattern (a 24-2 never opens at 36-1).
 */
export function phasingFromBuild(profile: Params | null, wheel: Params | null): Params {
	const merged: Params = { ...(profile ?? {}) };
	if (!wheel) return merged;
	for (const name of wheelOwned) {
		delete merged[name];
		if (given(wheel[name])) merged[name] = wheel[name];
	}
	return merged;
}

/** An address with its query; empty values are left out, so the tool starts those from its defaults. */
export function toolHref(path: string, params: Params): string {
	const query = new URLSearchParams(Object.entries(params).filter(([, value]) => given(value))).toString();
	return query ? `${path}?${query}` : path;
}

/** The wheel of a build the links take: a design and its head revision's parameters. */
export interface HeadWheel {
	designId: string;
	params: Params;
}

/** The phasing check, prefilled and saving its engine profile back into the build (and naming the design it was checked against). */
export const phasingHref = (buildId: string, profile: Params | null, wheel: HeadWheel | null) =>
	toolHref('/phasing', { ...phasingFromBuild(profile, wheel?.params ?? null), build: buildId, design: wheel?.designId ?? '' });

/**
 * The designer: the head revision of the build's wheel (the newest is what `?design=` opens), or a
 * new design for the build starting from the engine profile's pattern.
 */
export function wheelHref(buildId: string, profile: Params | null, wheel: HeadWheel | null): string {
	if (wheel) return toolHref('/wheel', { design: wheel.designId });
	const pattern = Object.fromEntries(patternNames.filter((name) => given(profile?.[name])).map((name) => [name, profile![name]!]));
	return toolHref('/wheel', { build: buildId, ...pattern });
}

/** The hub size of a saved degree tape, as the tape tool reads it: its units and diameter, or the circumference measured. */
export function hubOfTape(params: Params | null): Params {
	if (!params) return {};
	const units = params.units === 'in' ? 'in' : 'mm';
	if (given(params.diameter)) return { units, diameter: params.diameter };
	if (given(params.circumference)) return { units, circumference: params.circumference };
	return {};
}

/**
 * The degree tape tool, for the timing hub of the newest tape kept in the build (or its start
 * hub), its timing-light card headed with the build's name. The tape takes no TDC offset: it is
 * zeroed at the true TDC the TDC record found.
 */
export const tapeHref = (buildId: string, newestTape: Params | null, buildName = '') =>
	toolHref('/tape', { build: buildId, ...hubOfTape(newestTape), name: buildName });

/** The TDC finder, keeping its record in the build. */
export const tdcHref = (buildId: string) => toolHref('/tdc', { build: buildId });

/** The build sheet of the build's wheel (the same design the steps follow, named so the sheet and the steps agree). */
export const buildSheetHref = (buildId: string, wheel: HeadWheel | null) =>
	toolHref(`/api/v1/builds/${buildId}/build-sheet.pdf`, { design: wheel?.designId ?? '' });

/**
 * The signal check for a build: the engine profile with the head revision's wheel over it (as the
 * phasing check opens), the speed cases, gap rule and sensor of the newest signal check saved in the
 * build kept where the profile and the wheel do not say otherwise; saving goes back into the build.
 */
export const signalHref = (buildId: string, profile: Params | null, wheel: HeadWheel | null, newestCheck: Params | null = null) =>
	toolHref('/signal', {
		...phasingFromBuild({ ...(newestCheck ?? {}), ...(profile ?? {}) }, wheel?.params ?? null),
		build: buildId,
		design: wheel?.designId ?? ''
	});
