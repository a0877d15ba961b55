import { error, json } from '@sveltejs/kit';
import { restoreRevision } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { conflict, jsonBody } from '$lib/server/api';
import { db } from '$lib/server/db';
import { getDesign, revisionOf, saveRevision } from '$lib/server/designs';

/** Restoring never rewrites history: the old revision's parameters become a new revision. */
export async function POST(event) {
	const access = await objectAccess(event, 'edit', 'design', event.params.designId);
	const body = await jsonBody(event.request, restoreRevision);
	if (!body.ok) return body.response;
	const old = await revisionOf(db(), event.params.designId, body.data.revision);
	if (!old) error(404, { message: `revision: this design has no revision ${body.data.revision}`, code: 'not-found' });
	const design = (await getDesign(db(), event.params.designId))!;
	const message = body.data.message ?? `Restores revision ${old.number}`;
	const result = await saveRevision(db(), design, { baseRevision: body.data.baseRevision, params: old.params, message, restoredFrom: old.number }, access.user.id);
	if (!result.ok) return conflict(`Revision ${result.head.number} was saved after revision ${body.data.baseRevision}; look at it before restoring.`, { baseRevision: body.data.baseRevision, head: result.head });
	return json({ revision: result.revision }, { status: 201 });
}
