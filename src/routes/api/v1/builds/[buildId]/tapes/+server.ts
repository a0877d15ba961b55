import { json } from '@sveltejs/kit';
import { saveRecord } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { jsonBody, refuse } from '$lib/server/api';
import { db } from '$lib/server/db';
import { saveTape } from '$lib/server/records';

/** Saves a record with the tool's own parameters (the names its API route takes); refusals name `params.<field>`. */
export async function POST(event) {
	const access = await objectAccess(event, 'edit', 'build', event.params.buildId);
	const body = await jsonBody(event.request, saveRecord);
	if (!body.ok) return body.response;
	const result = await saveTape(db(), access.buildId, body.data, access.user.id);
	if (!result.ok) return refuse(result.refusals);
	return json({ id: result.id }, { status: 201 });
}
