import { z } from 'zod';
import { ansiShaftRangeIn, ansiSlot, dinShaftRange, dinSlot, woodruffNumbers, woodruffSlot, type HubSlot } from '$lib/trade/keys';
import { materials } from '$lib/trade/materials';
import type { Pattern } from '$lib/trade/pattern';
import { formatLength, fromMm, parseLength, toMm, type Units } from '$lib/trade/units';
import type { WheelSpec } from '$lib/trade/wheel';
import type { FieldErrors } from './form';
import { unprintable } from './text';

// The wheel's public parameters, as flat strings (URL query, form fields, JSON): one schema for
// the designer page, the API and the exports. Lengths are in `units` and may be written as
// fractions (`3 1/2`); they are checked against ranges given in millimetres and reported in the
// caller's units. Cross-field rules (missing < teeth, holes clear of the bore...) live in
// src/lib/trade/checks.ts.

export const patternKinds = ['missing', 'custom', 'single', 'extra'] as const;
export const keywayKinds = ['none', 'custom', 'din6885', 'b17.1', 'woodruff'] as const;
export const materialKinds = ['steel', 'stainless', 'aluminium', 'custom'] as const;
export const paperSizes = ['a4', 'letter'] as const;

/** Lengths' ranges in mm, inclusive. */
export const lengthRanges = {
	od: [10, 2000],
	depth: [0.2, 200],
	tipRadius: [0, 50],
	rootRadius: [0, 50],
	bore: [0, 1900],
	keyWidth: [0.5, 100],
	keyDepth: [0.2, 50],
	shaft: [1, 500],
	pcd: [2, 1990],
	boltHole: [0.5, 100],
	balancePcd: [2, 1990],
	balanceHole: [0.5, 200],
	thickness: [0.2, 50]
} as const satisfies Record<string, readonly [number, number]>;

type LengthField = keyof typeof lengthRanges;

/** Defaults for a new design (a 36-1 wheel for a small single), in each unit system. */
export const wheelDefaults = {
	mm: { teeth: '36', missing: '1', od: '100', depth: '5', duty: '0.5', bore: '20', thickness: '3', rpm: '8000', grade: '6.3' },
	in: { teeth: '36', missing: '1', od: '4', depth: '3/16', duty: '0.5', bore: '3/4', thickness: '1/8', rpm: '8000', grade: '6.3' }
} as const;

/** Given by the caller every time: no default would be a sensible guess for these. */
export const requiredWheelParams = ['teeth', 'od', 'depth'] as const;
const fillable = (units: Units) =>
	Object.fromEntries(Object.entries(wheelDefaults[units]).filter(([k]) => !(requiredWheelParams as readonly string[]).includes(k)));

export type WheelParams = Partial<Record<string, string>>;

export interface ParsedWheel {
	units: Units;
	spec: WheelSpec;
	running: { rpm: number; gradeMmS: number };
	paper: (typeof paperSizes)[number];
}

const oneOf = <T extends readonly [string, ...string[]]>(field: string, values: T) =>
	z.enum(values, { error: `${field}: one of ${values.join(', ')}` });

function integer(field: string, min: number, max: number) {
	return z.coerce
		.number({ error: `${field}: a whole number from ${min} to ${max}` })
		.int({ error: `${field}: a whole number from ${min} to ${max}` })
		.min(min, { error: `${field}: a whole number from ${min} to ${max}` })
		.max(max, { error: `${field}: a whole number from ${min} to ${max}` });
}

function decimal(field: string, min: number, max: number, unit = '') {
	const range = `${field}: a number from ${min} to ${max}${unit}`;
	return z.coerce.number({ error: range }).min(min, { error: range }).max(max, { error: range });
}

const lengthRange = (field: LengthField, units: Units) => {
	const [lo, hi] = lengthRanges[field];
	return `${formatLength(lo, units).replace(/\.?0+ /, ' ')} to ${formatLength(hi, units).replace(/\.?0+ /, ' ')}`;
};

function length(field: LengthField, units: Units) {
	const [lo, hi] = lengthRanges[field];
	const range = `${field}: ${lengthRange(field, units)}`;
	return z
		.string({ error: range })
		.transform((text, ctx) => {
			const value = parseLength(text);
			const mm = toMm(value, units);
			// A hair of tolerance, so a range end typed in the other unit system still passes.
			if (!Number.isFinite(value) || mm < lo - 1e-9 || mm > hi + 1e-9) {
				ctx.addIssue({ code: 'custom', message: range });
				return z.NEVER;
			}
			return mm;
		});
}

const angle = (field: string) => decimal(field, -360, 360, '°');

/** `gaps`: the missing positions of a custom pattern, as the wheel and the phasing check both read them. */
export const gapsField = z
	.string()
	.default('')
	.transform((text, ctx) => {
		const list = text.split(/[\s,;]+/).filter(Boolean).map(Number);
		if (list.some((n) => !Number.isInteger(n))) {
			ctx.addIssue({ code: 'custom', message: 'gaps: whole position numbers separated by commas, like 17, 35' });
			return z.NEVER;
		}
		return list;
	});

/** The tooth pattern from the public parameters `pattern`, `teeth`, `missing`, `gaps`, `extraAfter`. */
export function patternOf(v: { pattern: (typeof patternKinds)[number]; teeth: number; missing: number; gaps: number[]; extraAfter: number }): Pattern {
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

// Built once per unit system: making a zod schema costs far more than using it.
const schemas = new Map<Units, ReturnType<typeof buildSchema>>();
const schemaFor = (units: Units) => schemas.get(units) ?? schemas.set(units, buildSchema(units)).get(units)!;

function buildSchema(units: Units) {
	return z.object({
		pattern: oneOf('pattern', patternKinds).default('missing'),
		teeth: integer('teeth', 1, 720),
		missing: integer('missing', 0, 719).default(0),
		gaps: gapsField,
		extraAfter: integer('extraAfter', 0, 719).default(0),
		duty: decimal('duty', 0.05, 0.95),
		od: length('od', units),
		depth: length('depth', units),
		tipRadius: length('tipRadius', units).default(0),
		rootRadius: length('rootRadius', units).default(0),
		bore: length('bore', units).default(0),
		keyway: oneOf('keyway', keywayKinds).default('none'),
		keyWidth: length('keyWidth', units).optional(),
		keyDepth: length('keyDepth', units).optional(),
		shaft: length('shaft', units).optional(),
		woodruff: z.string().max(8, { error: `woodruff: one of the ANSI B17.2 key numbers ${woodruffNumbers.join(', ')}` }).optional(),
		keywayAngle: angle('keywayAngle').default(0),
		bolts: integer('bolts', 0, 24).default(0),
		pcd: length('pcd', units).optional(),
		boltHole: length('boltHole', units).optional(),
		boltAngle: angle('boltAngle').default(0),
		balanceCount: integer('balanceCount', 0, 8).default(0),
		balancePcd: length('balancePcd', units).optional(),
		balanceHole: length('balanceHole', units).optional(),
		balanceAngle: angle('balanceAngle').default(0),
		balanceSpacing: decimal('balanceSpacing', 0, 180, '°').optional(),
		// A union's own message: zod reports a failed union as one issue, without the members' messages.
		mark: z.union([z.literal('none'), angle('mark')], { error: 'mark: none, or an angle from -360 to 360°' }).default(0),
		// Etched as one line of text; a line break or control character would also break the DXF's group codes.
		label: z
			.string()
			.trim()
			.max(40, { error: 'label: at most 40 characters' })
			.refine((v) => !unprintable.test(v), { error: 'label: one line of text, at most 40 characters (no line breaks, control or direction-override characters)' })
			.default(''),
		rotation: oneOf('rotation', ['cw', 'ccw'] as const).default('cw'),
		material: oneOf('material', materialKinds).default('steel'),
		density: decimal('density', 0.5, 25, ' g/cm³').optional(),
		thickness: length('thickness', units),
		rpm: integer('rpm', 100, 30000).default(8000),
		grade: decimal('grade', 0.4, 100, ' mm/s').default(6.3),
		paper: oneOf('paper', paperSizes).default('a4')
	});
}

/** Every parameter name a wheel takes; anything else in a saved design is dropped. */
export const wheelParamNames: readonly string[] = ['units', ...Object.keys(buildSchema('mm').shape)];

const unitsSchema = z.object({ units: oneOf('units', ['mm', 'in'] as const).default('mm') });

/** Parses the flat parameters into a wheel spec (mm), or field errors naming what each allows. */
export function parseWheel(params: WheelParams): { ok: true; value: ParsedWheel } | { ok: false; errors: FieldErrors } {
	const u = unitsSchema.safeParse(params);
	if (!u.success) return { ok: false, errors: { units: 'units: one of mm, in' } };
	const units = u.data.units;
	// Empty form fields mean "not given".
	const given = Object.fromEntries(Object.entries(params).filter(([, v]) => v !== undefined && v !== ''));
	const errors: FieldErrors = {};
	for (const field of requiredWheelParams) {
		if (!(field in given)) errors[field] = `${field}: required, ${field === 'teeth' ? 'a whole number from 1 to 720' : lengthRange(field, units)}`;
	}
	const parsed = schemaFor(units).safeParse({ ...fillable(units), ...given });
	if (!parsed.success || Object.keys(errors).length) {
		for (const issue of parsed.success ? [] : parsed.error.issues) errors[String(issue.path[0] ?? 'form')] ??= issue.message;
		return { ok: false, errors };
	}
	const v = parsed.data;

	let keyway: HubSlot | null = null;
	const need = (field: string, value: number | undefined, message: string) => {
		if (value === undefined) errors[field] = message;
		return value ?? 0;
	};
	switch (v.keyway) {
		case 'custom':
			keyway = {
				widthMm: need('keyWidth', v.keyWidth, 'keyWidth: needed for a custom keyway'),
				depthMm: need('keyDepth', v.keyDepth, 'keyDepth: needed for a custom keyway'),
				source: 'custom keyway'
			};
			break;
		case 'din6885': {
			const shaft = need('shaft', v.shaft, 'shaft: the shaft diameter, to look up the DIN 6885-1 key');
			if (v.shaft !== undefined) {
				keyway = dinSlot(shaft) ?? null;
				if (!keyway) errors.shaft = `shaft: over ${formatLength(dinShaftRange.min, units)} to ${formatLength(dinShaftRange.max, units)} for DIN 6885-1 keys (the standard's table ends there); outside it, use keyway=custom`;
			}
			break;
		}
		case 'b17.1': {
			const shaft = need('shaft', v.shaft, 'shaft: the shaft diameter, to look up the ANSI B17.1 key');
			if (v.shaft !== undefined) {
				keyway = ansiSlot(fromMm(shaft, 'in')) ?? null;
				if (!keyway) errors.shaft = `shaft: over ${formatLength(toMm(ansiShaftRangeIn.min, 'in'), units)} to ${formatLength(toMm(ansiShaftRangeIn.max, 'in'), units)} for ANSI B17.1 square keys (the standard's square-key sizes end there); outside it, use keyway=custom`;
			}
			break;
		}
		case 'woodruff':
			keyway = woodruffSlot(v.woodruff ?? '') ?? null;
			if (!keyway) errors.woodruff = `woodruff: one of the ANSI B17.2 key numbers ${woodruffNumbers.join(', ')}`;
			break;
	}
	if (keyway && v.bore <= 0) errors.bore = 'bore: needed for a keyway (more than 0)';

	const bolts = v.bolts > 0 ? { count: v.bolts, pcdMm: need('pcd', v.pcd, 'pcd: needed with bolt holes'), holeMm: need('boltHole', v.boltHole, 'boltHole: needed with bolt holes'), clockDeg: v.boltAngle } : null;
	const balanceHoles =
		v.balanceCount > 0
			? {
					count: v.balanceCount,
					pcdMm: need('balancePcd', v.balancePcd, 'balancePcd: needed with balance holes'),
					holeMm: need('balanceHole', v.balanceHole, 'balanceHole: needed with balance holes'),
					clockDeg: v.balanceAngle,
					spacingDeg: v.balanceSpacing
				}
			: null;
	const densityGcm3 = v.material === 'custom' ? need('density', v.density, 'density: needed for a custom material, 0.5 to 25 g/cm³') : materials[v.material].densityGcm3;
	if (Object.keys(errors).length) return { ok: false, errors };

	const pattern = patternOf(v);

	return {
		ok: true,
		value: {
			units,
			paper: v.paper,
			running: { rpm: v.rpm, gradeMmS: v.grade },
			spec: {
				pattern,
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
				indexMarkDeg: v.mark === 'none' ? null : v.mark,
				label: v.label,
				rotation: v.rotation,
				thicknessMm: v.thickness,
				densityGcm3,
				materialLabel: v.material === 'custom' ? `density ${densityGcm3} g/cm³` : materials[v.material].label
			}
		}
	};
}
