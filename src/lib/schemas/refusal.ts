import type { z } from 'zod';

// What every tool's check answers when it will not go on: one reason per field, the first one
// found, worded to stand beside that field (the field's name is not in the message). The page shows
// them beside its fields; the API (server/api.ts `refuse`) sends the same list, so the designer
// and the 400 always give the same reason.

export interface Refusal {
	/** The public parameter's name (`od`, `b`, `params.teeth` …), or `form` for the whole request. */
	field: string;
	message: string;
}

export type Checked<T> = { ok: true; value: T } | { ok: false; refusals: Refusal[] };

/**
 * The name a message starts with in the `errors` map: the field's own, or for a field inside an
 * object (`params.b`, a tool's parameter in a saved record) the name the tool knows it by (`b`).
 */
const shownName = (field: string) => field.slice(field.lastIndexOf('.') + 1);

/** A refusal, with a leading `field: ` (or the tool's `b: ` of `params.b`) taken off a message written the older way. */
export function refusal(field: string, message: string): Refusal {
	const prefix = [`${field}: `, `${shownName(field)}: `].find((p) => message.startsWith(p));
	return { field, message: prefix ? message.slice(prefix.length) : message };
}

/** The first refusal for each field, in the order found. */
export function firstPerField(refusals: readonly Refusal[]): Refusal[] {
	const seen = new Set<string>();
	return refusals.filter((r) => !seen.has(r.field) && (seen.add(r.field), true));
}

/** Zod's issues as refusals, named by the first key of each issue's path (`form` when none). */
export function refusalsOf(issues: readonly z.core.$ZodIssue[], prefix = ''): Refusal[] {
	return firstPerField(issues.map((issue) => refusal(prefix + String(issue.path[0] ?? 'form'), issue.message)));
}

/** Field → message, for a page that looks a field's reason up by name. */
export function byField(refusals: readonly Refusal[]): Record<string, string> {
	return Object.fromEntries(firstPerField(refusals).map((r) => [r.field, r.message]));
}

/**
 * The map the API has always answered under `errors`: each message starting with its field's name,
 * so a refusal read on its own still says what it is about (`params.b` → `b: …`, as the tool says it).
 */
export const namedErrors = (refusals: readonly Refusal[]): Record<string, string> =>
	Object.fromEntries(firstPerField(refusals).map((r) => [r.field, namedMessage(r)]));

/** A refusal about the object itself (`params.foo` refused as `params: …`) already says what it is about. */
const namedMessage = (r: Refusal) =>
	r.field.includes('.') && r.message.startsWith(`${r.field.split('.')[0]}: `) ? r.message : `${shownName(r.field)}: ${r.message}`;

/** A field → message map (messages may start with their field's name) as refusals. */
export const refusalsFromMap = (errors: Record<string, string>): Refusal[] =>
	Object.entries(errors).map(([field, message]) => refusal(field, message));

/** A tool's field → message map as refusals of a body's nested object (`params.teeth`), messages without the field's name. */
export const refusalsUnder = (prefix: string, errors: Record<string, string>): Refusal[] =>
	Object.entries(errors).map(([field, message]) => ({ field: `${prefix}.${field}`, message: refusal(field, message).message }));

/**
 * A form action's field → message map (messages may start with their field's name, as the action
 * answers them) as a page shows it beside its fields: without the name, which the label says.
 */
export const shownErrors = (errors: Record<string, string> | null | undefined): Record<string, string> =>
	byField(refusalsFromMap(errors ?? {}));
