import { json } from '@sveltejs/kit';
import { saveRecord } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { jsonBody, refuse } from '$lib/server/api';
import { listAnswer } from '$lib/server/build-list-route';
import { db } from '$lib/server/db';
import { saveTape } from '$lib/server/records';

/** The newest 50 degree tapes, or the 50 after `cursor`; `next` gives the page after (null on the last). */
export async function GET(event) {
	return listAnswer(event, 'tapes');
}

/** Saves a record with the tool's own parameters (the names its API route takes); refusals name `params.<field>`. */
export async function POST(event) {
	const access = await objectAccess(event, 'edit', 'build', event.params.buildId);
	const body = await jsonBody(event.request, saveRecord);
	if (!body.ok) return body.response;
	const result = await saveTape(db(), access.buildId, body.data, access.user.id);
	if (!result.ok) return refuse(result.refusals.map((r) => ({ ...r, field: `params.${r.field}` })));
	return json({ id: result.id }, { status: 201 });
}
