import { error, json } from '@sveltejs/kit';
import { restoreRevision as restoreSchema } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { conflict, jsonBody, refuse } from '$lib/server/api';
import { db } from '$lib/server/db';
import { getDesign, restoreRevision } from '$lib/server/designs';

/** Restoring never rewrites history: the old revision's parameters, checked as any save is, become a new revision. */
export async function POST(event) {
	const access = await objectAccess(event, 'edit', 'design', event.params.designId);
	const body = await jsonBody(event.request, restoreSchema);
	if (!body.ok) return body.response;
	const design = (await getDesign(db(), event.params.designId))!;
	const result = await restoreRevision(db(), design, body.data, access.user.id);
	if (result.ok) return json({ revision: result.revision }, { status: 201 });
	if (result.reason === 'not-found')
		error(404, { message: `revision: this design has no revision ${body.data.revision}`, code: 'not-found' });
	if (result.reason === 'invalid') return refuse(result.refusals);
	return conflict(`Revision ${result.head.number} was saved after revision ${body.data.baseRevision}; look at it before restoring.`, {
		baseRevision: body.data.baseRevision,
		head: result.head
	});
}
