import { json } from '@sveltejs/kit';
import type { z } from 'zod';
import { parseForm } from '$lib/schemas/form';
import { namedErrors, refusalsFromMap, type Refusal } from '$lib/schemas/refusal';

// Answers shared by the public API's routes.

/**
 * The API's one 400 for bad parameters: `refusals` as the tool's check gave them ({ field, message },
 * first reason per field, the message without the field's name), and `errors`, the same as a map of
 * field to a message that starts with the field's name (what the API has always answered).
 * A field → message map (messages written the older way, `field: …`) is taken too.
 */
export function refuse(
	refusals: readonly Refusal[] | Record<string, string>,
	status = 400,
	extras: Record<string, unknown> = {}
): Response {
	const list = Array.isArray(refusals) ? (refusals as readonly Refusal[]) : refusalsFromMap(refusals as Record<string, string>);
	// A map is answered as given: a nested field's message (`params.teeth` → `teeth: …`) keeps the wording it always had.
	const errors = Array.isArray(refusals) ? namedErrors(list) : (refusals as Record<string, string>);
	return json(
		// Extras (a photo reading's advice, say) go beside the fixed fields, never over them.
		{ ...extras, message: 'Some parameters are out of range; see errors for each field.', code: 'invalid', errors, refusals: list },
		{ status }
	);
}

/**
 * A file download: content type, a file name, cacheable (the same query always gives the same
 * file). Workshop files are cached by the browser only (`private`).
 */
export function fileResponse(
	body: string | Buffer | Uint8Array,
	contentType: string,
	filename: string,
	cache: 'public' | 'private' = 'public'
): Response {
	return new Response(typeof body === 'string' ? body : new Uint8Array(body), {
		headers: {
			'content-type': contentType,
			'content-disposition': `attachment; filename="${filename}"`,
			'cache-control': `${cache}, max-age=3600`
		}
	});
}

export type Body<T> = { ok: true; data: T } | { ok: false; response: Response };

/** A JSON request body checked with a schema: the data, or the 400 that names each bad field. */
export async function jsonBody<S extends z.ZodType>(request: Request, schema: S): Promise<Body<z.infer<S>>> {
	let raw: unknown;
	try {
		raw = await request.json();
	} catch {
		return { ok: false, response: refuse({ body: 'body: a JSON object (content-type application/json)' }) };
	}
	const parsed = parseForm(schema, (raw ?? {}) as Record<string, unknown>);
	if (typeof raw !== 'object' || raw === null || Array.isArray(raw))
		return { ok: false, response: refuse({ body: 'body: a JSON object' }) };
	return parsed.ok ? { ok: true, data: parsed.data } : { ok: false, response: refuse(parsed.errors) };
}

/** A query string checked with a schema. */
export function queryOf<S extends z.ZodType>(url: URL, schema: S): Body<z.infer<S>> {
	const parsed = parseForm(schema, Object.fromEntries(url.searchParams));
	return parsed.ok ? { ok: true, data: parsed.data } : { ok: false, response: refuse(parsed.errors) };
}

/** 409: the save started from an older revision than the newest. */
export function conflict(message: string, detail: Record<string, unknown>): Response {
	return json({ message, code: 'stale', ...detail }, { status: 409 });
}
