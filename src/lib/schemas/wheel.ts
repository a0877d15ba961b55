import { z } from 'zod';
import { ansiShaftRangeIn, ansiSlot, dinShaftRange, dinSlot, woodruffSlot, type HubSlot } from '$lib/trade/keys';
import { materials } from '$lib/trade/materials';
import type { Pattern } from '$lib/trade/pattern';
import { refusals as tradeRefusals } from '$lib/trade/checks';
import { summarize, type WheelSummary } from '$lib/trade/summary';
import { formatLength, fromMm, toMm, type Units } from '$lib/trade/units';
import type { WheelSpec } from '$lib/trade/wheel';
import type { FieldErrors } from './form';
import { common } from './common-params';
import { allows, type Params } from './registry';
import { firstPerField, namedErrors, refusal, type Checked, type Refusal } from './refusal';
import { wheelParams } from './wheel-params';

// The wheel's one check, the same on the designer page (live, in the browser) and in every wheel
// route: the flat parameters (URL query, form fields, JSON) read by the registry (wheel-params.ts),
// then the rules between them (a keyway needs a bore …), then the trade library's refusals of a
// wheel that cannot be made (src/lib/trade/checks.ts). The first reason per field, in that order.

export const patternKinds = common.pattern.values;

export type WheelParams = Partial<Record<string, string>>;

export interface ParsedWheel {
	units: Units;
	spec: WheelSpec;
	running: { rpm: number; gradeMmS: number };
	paper: 'a4' | 'letter';
}

/** A wheel that can be made: the design, its summary, and the given parameters the wheel takes (what is saved). */
export interface ValidWheel extends ParsedWheel {
	summary: WheelSummary;
	params: Params;
}

/** `gaps`: the missing positions of a custom pattern, as the wheel and the phasing check both read them. */
export const gapsField = z
	.string()
	.default('')
	.transform((text, ctx) => {
		const list = text
			.split(/[\s,;]+/)
			.filter(Boolean)
			.map(Number);
		if (list.some((n) => !Number.isInteger(n))) {
			ctx.addIssue({ code: 'custom', message: `gaps: ${common.gaps.allows}` });
			return z.NEVER;
		}
		return list;
	});

/** The tooth pattern from the public parameters `pattern`, `teeth`, `missing`, `gaps`, `extraAfter`. */
export function patternOf(v: {
	pattern: (typeof patternKinds)[number];
	teeth: number;
	missing: number;
	gaps: number[];
	extraAfter: number;
}): Pattern {
	switch (v.pattern) {
		case 'missing':
			return { kind: 'missing', teeth: v.teeth, missing: v.missing };
		case 'custom':
			return { kind: 'custom', teeth: v.teeth, missingPositions: v.gaps };
		case 'single':
			return { kind: 'single', teeth: v.teeth };
		case 'extra':
			return { kind: 'extra', teeth: v.teeth, extraAfter: v.extraAfter };
	}
}

/** The values as the registry reads them (lengths in mm); `free` ones still text. */
interface Read {
	pattern: (typeof patternKinds)[number];
	teeth: number;
	missing: number;
	gaps: string;
	extraAfter: number;
	duty: number;
	od: number;
	depth: number;
	tipRadius: number;
	rootRadius: number;
	bore: number;
	keyway: 'none' | 'custom' | 'din6885' | 'b17.1' | 'woodruff';
	keyWidth?: number;
	keyDepth?: number;
	shaft?: number;
	woodruff?: string;
	keywayAngle: number;
	bolts: number;
	pcd?: number;
	boltHole?: number;
	boltAngle: number;
	balanceCount: number;
	balancePcd?: number;
	balanceHole?: number;
	balanceAngle: number;
	balanceSpacing?: number;
	mark: string;
	label: string;
	rotation: 'cw' | 'ccw';
	material: 'steel' | 'stainless' | 'aluminium' | 'custom';
	density?: number;
	thickness: number;
	etchRing?: number;
	rpm: number;
	grade: number;
	paper: 'a4' | 'letter';
}

const unitsOf = (params: WheelParams): Units | null =>
	params.units === undefined || params.units === '' ? 'mm' : params.units === 'mm' || params.units === 'in' ? params.units : null;

/**
 * The flat parameters read into a wheel spec (mm), without the trade library's cross-checks: the
 * first refusal per field otherwise. Units come first: lengths cannot be read without them.
 */
export function readWheel(params: WheelParams): Checked<ParsedWheel> {
	const units = unitsOf(params);
	if (!units) return { ok: false, refusals: [refusal('units', allows(common.units, 'mm'))] };
	const out: Refusal[] = [];
	const no = (field: string, message: string) => out.push({ field, message });
	// The two kinds the registry leaves to the check, read from the text as given.
	const gaps = gapsField.safeParse(params.gaps ?? '');
	if (!gaps.success) no('gaps', common.gaps.allows);
	const markText = (params.mark ?? '').trim();
	const markDeg = markText === 'none' ? null : markText === '' ? 0 : Number(markText);
	if (markDeg !== null && !(Number.isFinite(markDeg) && Math.abs(markDeg) <= 360)) no('mark', allows(wheelParams.get('mark')!, units));

	const read = wheelParams.read(params, units);
	if (!read.ok) return { ok: false, refusals: firstPerField([...read.refusals, ...out]) };
	const v = read.value as unknown as Read;

	const need = (field: string, value: number | undefined, message: string) => {
		if (value === undefined) no(field, message);
		return value ?? 0;
	};
	let keyway: HubSlot | null = null;
	switch (v.keyway) {
		case 'custom':
			keyway = {
				widthMm: need('keyWidth', v.keyWidth, 'needed for a custom keyway'),
				depthMm: need('keyDepth', v.keyDepth, 'needed for a custom keyway'),
				source: 'custom keyway'
			};
			break;
		case 'din6885':
			keyway = v.shaft === undefined ? null : (dinSlot(v.shaft) ?? null);
			if (v.shaft === undefined) no('shaft', 'the shaft diameter, to look up the DIN 6885-1 key');
			else if (!keyway) {
				const [lo, hi] = [formatLength(dinShaftRange.min, units), formatLength(dinShaftRange.max, units)];
				no('shaft', `over ${lo} to ${hi} for DIN 6885-1 keys (the standard's table ends there); outside it, choose a custom keyway`);
			}
			break;
		case 'b17.1': {
			keyway = v.shaft === undefined ? null : (ansiSlot(fromMm(v.shaft, 'in')) ?? null);
			const [lo, hi] = [ansiShaftRangeIn.min, ansiShaftRangeIn.max].map((inches) => formatLength(toMm(inches, 'in'), units));
			if (v.shaft === undefined) no('shaft', 'the shaft diameter, to look up the ANSI B17.1 key');
			else if (!keyway)
				no(
					'shaft',
					`over ${lo} to ${hi} for ANSI B17.1 square keys (the standard's square-key sizes end there); outside it, choose a custom keyway`
				);
			break;
		}
		case 'woodruff':
			keyway = woodruffSlot(v.woodruff ?? '') ?? null;
			if (!keyway) no('woodruff', allows(wheelParams.get('woodruff')!, units));
			break;
	}
	if (keyway && v.bore <= 0) no('bore', 'needed for a keyway (more than 0)');

	const bolts =
		v.bolts > 0
			? {
					count: v.bolts,
					pcdMm: need('pcd', v.pcd, 'needed with bolt holes'),
					holeMm: need('boltHole', v.boltHole, 'needed with bolt holes'),
					clockDeg: v.boltAngle
				}
			: null;
	const balanceHoles =
		v.balanceCount > 0
			? {
					count: v.balanceCount,
					pcdMm: need('balancePcd', v.balancePcd, 'needed with balance holes'),
					holeMm: need('balanceHole', v.balanceHole, 'needed with balance holes'),
					clockDeg: v.balanceAngle,
					spacingDeg: v.balanceSpacing
				}
			: null;
	const densityGcm3 =
		v.material === 'custom'
			? need('density', v.density, 'needed for a custom material, 0.5 to 25 g/cm³')
			: materials[v.material].densityGcm3;
	if (out.length || !gaps.success) return { ok: false, refusals: firstPerField(out) };

	return {
		ok: true,
		value: {
			units,
			paper: v.paper,
			running: { rpm: v.rpm, gradeMmS: v.grade },
			spec: {
				pattern: patternOf({ ...v, gaps: gaps.data }),
				duty: v.duty,
				odMm: v.od,
				depthMm: v.depth,
				tipRadiusMm: v.tipRadius,
				rootRadiusMm: v.rootRadius,
				boreMm: v.bore,
				keyway,
				keywayDeg: v.keywayAngle,
				bolts,
				balanceHoles,
				indexMarkDeg: markDeg,
				label: v.label,
				rotation: v.rotation,
				thicknessMm: v.thickness,
				etchRingMm: v.etchRing ?? null,
				densityGcm3,
				materialLabel: v.material === 'custom' ? `density ${densityGcm3} g/cm³` : materials[v.material].label
			}
		}
	};
}

/**
 * A trade refusal on the field the user fills in: a looked-up key's width is no field of theirs,
 * so a key as wide as the bore is the bore's refusal there.
 */
function userField(r: Refusal, { spec, units }: ParsedWheel): Refusal {
	if (r.field === 'keyWidth' && spec.keyway && spec.keyway.source !== 'custom keyway')
		return refusal('bore', `more than the key’s width (${formatLength(spec.keyway.widthMm, units)}, ${spec.keyway.source})`);
	return refusal(r.field, r.message);
}

/**
 * The wheel's one check, for the page and every route: the parameters read, then the wheel the
 * trade library would refuse (a tooth deeper than the web allows …). The first reason per field.
 */
export function checkWheel(params: WheelParams): Checked<ValidWheel> {
	const parsed = readWheel(params);
	if (!parsed.ok) return parsed;
	const { spec, units, running } = parsed.value;
	const result = summarize(spec, units, running);
	if (!result.ok) return { ok: false, refusals: firstPerField(result.refusals.map((r) => userField(r, parsed.value))) };
	const known = Object.fromEntries(
		Object.entries(params).filter((e): e is [string, string] => wheelParams.get(e[0]) !== undefined && e[1] !== undefined && e[1] !== '')
	);
	return { ok: true, value: { ...parsed.value, summary: result.summary, params: known } };
}

/**
 * checkWheel's refusals, the same ones in the same order, without the summary (mass, balance,
 * warnings) a drawing file never states: the DXF, SVG and STL routes answer a quarter sooner.
 */
export function checkWheelShape(params: WheelParams): Checked<ParsedWheel> {
	const parsed = readWheel(params);
	if (!parsed.ok) return parsed;
	const refused = tradeRefusals(parsed.value.spec, parsed.value.units);
	return refused.length ? { ok: false, refusals: firstPerField(refused.map((r) => userField(r, parsed.value))) } : parsed;
}

/** `readWheel` with its refusals as a field → `field: message` map, for the callers written before it. */
export function parseWheel(params: WheelParams): { ok: true; value: ParsedWheel } | { ok: false; errors: FieldErrors } {
	const read = readWheel(params);
	return read.ok ? read : { ok: false, errors: namedErrors(read.refusals) };
}
