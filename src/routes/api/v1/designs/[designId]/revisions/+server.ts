import { json } from '@sveltejs/kit';
import { revisionListQuery, saveRevision as saveSchema } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { conflict, jsonBody, queryOf, refuse } from '$lib/server/api';
import { db } from '$lib/server/db';
import { getDesign, revisionPage, saveRevision } from '$lib/server/designs';

/** A page of the design's revisions, newest first; `next` is the `cursor` of the older ones. */
export async function GET(event) {
	const query = queryOf(event.url, revisionListQuery);
	if (!query.ok) return query.response;
	await objectAccess(event, 'read', 'design', event.params.designId);
	return json(await revisionPage(db(), event.params.designId, query.data));
}

/**
 * Saves a new revision. The body names the revision the edit started from (`baseRevision`); when
 * someone saved since, the answer is 409 with the newest revision, and nothing is written.
 */
export async function POST(event) {
	const access = await objectAccess(event, 'edit', 'design', event.params.designId);
	const body = await jsonBody(event.request, saveSchema);
	if (!body.ok) return body.response;
	const design = (await getDesign(db(), event.params.designId))!;
	const result = await saveRevision(db(), design, body.data, access.user.id);
	if (result.ok) return json({ revision: result.revision }, { status: 201 });
	if (result.reason === 'invalid') return refuse(result.refusals);
	return conflict(
		`Revision ${result.head.number} was saved by ${result.head.author ?? 'someone'} after revision ${body.data.baseRevision}, which this edit started from.`,
		{
			baseRevision: body.data.baseRevision,
			head: result.head,
			yours: { params: result.params, message: body.data.message }
		}
	);
}
