import type { z } from 'zod';

export type FieldErrors = Record<string, string>;

/**
 * Parses form data (or any record) with a schema. On failure, one message per field, each
 * saying what the field allows, ready for fail(400, …) or a JSON 400.
 */
export function parseForm<S extends z.ZodType>(schema: S, input: FormData | Record<string, unknown>) {
	const data = input instanceof FormData ? Object.fromEntries(input) : input;
	const result = schema.safeParse(data);
	if (result.success) return { ok: true as const, data: result.data as z.infer<S> };
	const errors: FieldErrors = {};
	for (const issue of result.error.issues) {
		const field = issue.path.join('.') || 'form';
		errors[field] ??= issue.message;
	}
	return { ok: false as const, errors };
}
