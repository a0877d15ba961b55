import { z } from 'zod';

/**
 * What a name shown on screen, printed in a PDF, etched in a DXF or quoted in an e-mail must not
 * hold: C0 and C1 control characters (NUL, CR, LF, tab, escape …, and DEL), the line and paragraph
 * separators U+2028/U+2029, the bidirectional embeddings and overrides U+202A–U+202E and isolates
 * U+2066–U+2069 (they reorder what follows: "Trojan Source", CVE-2021-42574), and unpaired UTF-16
 * surrogates (not text at all; PostgreSQL refuses them).
 */
export const unprintable = /[\p{Cc}\u2028\u2029\u202A-\u202E\u2066-\u2069\p{Cs}]/u;

/** The characters of `s` that `unprintable` refuses, as U+XXXX, for a refusal that says which. */
export function unprintableIn(s: string): string[] {
	const found = new Set<string>();
	for (const ch of s) if (unprintable.test(ch)) found.add(`U+${ch.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}`);
	return [...found];
}

/**
 * One line of human-readable text (a name, a label, a short message): trimmed, `min` to `max`
 * characters, no control, separator or bidi-override characters. Every refusal names the field.
 */
export function singleLine(field: string, max: number, min = 0) {
	const range = min ? `${min} to ${max} characters` : `at most ${max} characters`;
	return z
		.string({ error: `${field}: text, ${range}` })
		.trim()
		.min(min, { error: `${field}: ${range}` })
		.max(max, { error: `${field}: ${range}` })
		.refine((s) => !unprintable.test(s), {
			error: (issue) =>
				`${field}: one line of text without control, line-break or direction-override characters (found ${unprintableIn(String(issue.input)).join(', ')})`
		});
}
