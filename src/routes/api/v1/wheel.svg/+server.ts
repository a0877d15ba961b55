import { fileResponse } from '$lib/server/api';
import { wheelFile } from '$lib/server/exports/wheel-file';
import { wheelShapeFromQuery } from '$lib/server/wheel-request';

export async function GET({ url }) {
	const r = wheelShapeFromQuery(url);
	if (!r.ok) return r.response;
	const file = await wheelFile('svg', r.wheel, null);
	return fileResponse(file.body, file.contentType, file.name);
}
