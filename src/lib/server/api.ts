import { json } from '@sveltejs/kit';

// Answers shared by the public API's routes.

/** 400 with one message per bad field, each naming the field and what it allows. */
export function refuse(errors: Record<string, string>): Response {
	return json({ message: 'Some parameters are out of range; see errors for each field.', code: 'invalid', errors }, { status: 400 });
}

/** A file download: content type, a file name, cacheable (the same query always gives the same file). */
export function fileResponse(body: string | Buffer, contentType: string, filename: string): Response {
	return new Response(typeof body === 'string' ? body : new Uint8Array(body), {
		headers: {
			'content-type': contentType,
			'content-disposition': `attachment; filename="${filename}"`,
			'cache-control': 'public, max-age=3600'
		}
	});
}
