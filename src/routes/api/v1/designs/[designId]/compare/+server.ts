import { error, json } from '@sveltejs/kit';
import { compareQuery } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { queryOf } from '$lib/server/api';
import { db } from '$lib/server/db';
import { revisionOf } from '$lib/server/designs';
import { diffParams } from '$lib/params';
import { wheelParams } from '$lib/schemas/wheel-params';

/** What changed from revision `a` to revision `b`, parameter by parameter, each with its label and its values in words. */
export async function GET(event) {
	await objectAccess(event, 'read', 'design', event.params.designId);
	const query = queryOf(event.url, compareQuery);
	if (!query.ok) return query.response;
	const [a, b] = await Promise.all([
		revisionOf(db(), event.params.designId, query.data.a),
		revisionOf(db(), event.params.designId, query.data.b)
	]);
	if (!a || !b)
		error(404, { message: `${!a ? 'a' : 'b'}: this design has no revision ${!a ? query.data.a : query.data.b}`, code: 'not-found' });
	return json({ a, b, changes: diffParams(a.params, b.params, wheelParams) });
}
