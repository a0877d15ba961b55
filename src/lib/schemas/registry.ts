import { z } from 'zod';
import { formatLength, parseLengthWithUnit, type Units } from '$lib/trade/units';
import { firstPerField, refusal, refusalsOf, type Checked, type Refusal } from './refusal';
import { unprintable } from './text';

// A tool's public parameters, each written once: its name (the address query, the form field, the
// API), its label and help (forms, refusals, the revision comparison, the API's description), its
// default, its kind and range. Forms, parsing, refusals and the documentation all read a tool's
// registry; adding a parameter means adding it here and nowhere else but the check that uses it.

export type Params = Record<string, string>;

interface Base {
	name: string;
	/** The one label for this public name, on every page and in every tool. */
	label: string;
	help?: string;
	/** Given by the caller every time. */
	required?: boolean;
	/** What an empty field means; per unit system for lengths. */
	default?: string | Readonly<Record<Units, string>>;
	/** When the parameter is read at all (a keyway's width only for a custom keyway …). */
	appliesWhen?: (params: Params) => boolean;
	/** What the field takes, when the kind's own wording would not say it well. */
	allows?: string;
	/** What an empty value means, in words ("0 (sharp)", "none"), where the default alone would not say it. */
	whenEmpty?: string;
}

export type ParamDef = Base &
	(
		| { kind: 'length'; minMm: number; maxMm: number }
		| { kind: 'angle'; min: number; max: number; unit?: string }
		| { kind: 'whole'; min: number; max: number; unit?: string }
		| { kind: 'number'; min: number; max: number; unit?: string }
		| { kind: 'choice'; values: readonly [string, ...string[]]; labels?: Readonly<Record<string, string>> }
		| { kind: 'text'; max: number }
		/** Read by the tool's own check (lists, readings written as on a scale …). */
		| { kind: 'free' }
	);

/** A range end as people write it: no trailing zeros. */
const lengthText = (mm: number, units: Units) => formatLength(mm, units).replace(/\.?0+ /, ' ');

/** What a field takes, in words, in the caller's units: the message of every refusal of its value. */
export function allows(def: ParamDef, units: Units): string {
	if (def.allows) return def.allows;
	switch (def.kind) {
		case 'length':
			return `${lengthText(def.minMm, units)} to ${lengthText(def.maxMm, units)}`;
		case 'angle':
			return `an angle from ${def.min} to ${def.max}${def.unit ?? '°'}`;
		case 'whole':
			return `a whole number from ${def.min} to ${def.max}${def.unit ?? ''}`;
		case 'number':
			return `a number from ${def.min} to ${def.max}${def.unit ?? ''}`;
		case 'choice':
			return `one of ${def.values.join(', ')}`;
		case 'text':
			return `one line of text, at most ${def.max} characters`;
		case 'free':
			return 'see the field’s help';
	}
}

/** The zod schema of one parameter's text, giving the value in base units (mm, degrees). */
export function valueSchema(def: ParamDef, units: Units): z.ZodType {
	const message = allows(def, units);
	switch (def.kind) {
		case 'length':
			// A length may carry its own unit ("20 mm" on an inch form); text that cannot be read
			// says why before what the field takes.
			return z.string({ error: message }).transform((text, ctx) => {
				const read = parseLengthWithUnit(text, units);
				if (!read.ok) {
					ctx.addIssue({ code: 'custom', message: `${read.why}; ${message}` });
					return z.NEVER;
				}
				// A hair of tolerance, so a range end typed in the other unit system still passes.
				if (!Number.isFinite(read.mm) || read.mm < def.minMm - 1e-9 || read.mm > def.maxMm + 1e-9) {
					ctx.addIssue({ code: 'custom', message });
					return z.NEVER;
				}
				return read.mm;
			});
		case 'angle':
		case 'number':
			return z.coerce.number({ error: message }).min(def.min, { error: message }).max(def.max, { error: message });
		case 'whole':
			return z.coerce.number({ error: message }).int({ error: message }).min(def.min, { error: message }).max(def.max, { error: message });
		case 'choice':
			return z.enum(def.values, { error: message });
		case 'text':
			return z
				.string({ error: message })
				.trim()
				.max(def.max, { error: message })
				.refine((v) => !unprintable.test(v), { error: message });
		case 'free':
			return z.string();
	}
}

export const defaultOf = (def: ParamDef, units: Units): string | undefined =>
	typeof def.default === 'string' || def.default === undefined ? def.default : def.default[units];

/** Only the parameters given: an empty field means "not given". */
export const givenParams = (params: Partial<Record<string, string>>): Params =>
	Object.fromEntries(Object.entries(params).filter((e): e is [string, string] => e[1] !== undefined && e[1] !== ''));

export interface Registry<N extends string = string> {
	readonly params: readonly ParamDef[];
	readonly names: readonly N[];
	get(name: string): ParamDef | undefined;
	label(name: string): string;
	/** The defaults a new form starts from, in its unit system. */
	defaults(units: Units): Params;
	/** The zod object of every parameter, each optional; `read` fills the defaults in first. */
	schema(units: Units): z.ZodObject;
	/**
	 * The given parameters, each read by its kind (lengths to mm), defaults filled in; or the first
	 * refusal per field. Required parameters that are missing are refused with what they take.
	 */
	read(params: Partial<Record<string, string>>, units: Units): Checked<Record<string, unknown>>;
}

export function defineRegistry<const D extends readonly ParamDef[]>(params: D): Registry<D[number]['name']> {
	const byName = new Map(params.map((p) => [p.name, p]));
	const schemas = new Map<Units, z.ZodObject>();
	const build = (units: Units) => z.object(Object.fromEntries(params.map((p) => [p.name, valueSchema(p, units).optional()])));
	const schema = (units: Units) => schemas.get(units) ?? schemas.set(units, build(units)).get(units)!;
	return {
		params,
		names: params.map((p) => p.name) as D[number]['name'][],
		get: (name) => byName.get(name),
		label: (name) => byName.get(name)?.label ?? name,
		defaults: (units) =>
			Object.fromEntries(params.flatMap((p) => (defaultOf(p, units) === undefined ? [] : [[p.name, defaultOf(p, units)!]]))),
		schema,
		read(raw, units) {
			const given = givenParams(raw);
			const missing: Refusal[] = params
				.filter((p) => p.required && !(p.name in given) && (p.appliesWhen?.(given) ?? true))
				.map((p) => refusal(p.name, `required, ${allows(p, units)}`));
			// Strings in, defaults applied to the text (zod's .default skips the transform).
			const withDefaults = {
				...Object.fromEntries(params.flatMap((p) => (defaultOf(p, units) === undefined ? [] : [[p.name, defaultOf(p, units)]]))),
				...given
			};
			const parsed = schema(units).safeParse(withDefaults);
			if (parsed.success && !missing.length) return { ok: true, value: parsed.data };
			return { ok: false, refusals: firstPerField([...missing, ...(parsed.success ? [] : refusalsOf(parsed.error.issues))]) };
		}
	};
}

/** The unit system a request's lengths are in: mm unless `units=in`; null for anything else. */
export const unitsOf = (params: Partial<Record<string, string>>): Units | null =>
	params.units === undefined || params.units === '' || params.units === 'mm' ? 'mm' : params.units === 'in' ? 'in' : null;

/**
 * The unit system, read before anything else: every length is read in it, so a request in
 * unknown units is refused on `units` alone.
 */
export function readUnits(params: Partial<Record<string, string>>): Checked<Units> {
	const units = unitsOf(params);
	return units ? { ok: true, value: units } : { ok: false, refusals: [refusal('units', 'one of mm, in')] };
}

/** A choice parameter's values with their labels, for a form's toggle or select. */
export const choiceOptions = (def: ParamDef | undefined): { value: string; label: string }[] =>
	def?.kind === 'choice' ? def.values.map((value) => ({ value, label: def.labels?.[value] ?? value })) : [];
