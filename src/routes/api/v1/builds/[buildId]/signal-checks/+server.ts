import { json } from '@sveltejs/kit';
import { saveRecord } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { jsonBody, refuse } from '$lib/server/api';
import { listAnswer } from '$lib/server/build-list-route';
import { db } from '$lib/server/db';
import { saveSignalCheck } from '$lib/server/signal-checks';

/** The newest 50 signal checks, or the 50 after `cursor`; `next` gives the page after (null on the last). */
export async function GET(event) {
	return listAnswer(event, 'signalChecks');
}

/**
 * Keeps a signal check in the build: the parameters GET /api/v1/signal takes, checked by the same
 * check; answers each case's sync margin as saved. Refusals name `params.<field>`.
 */
export async function POST(event) {
	const access = await objectAccess(event, 'edit', 'build', event.params.buildId);
	const body = await jsonBody(event.request, saveRecord);
	if (!body.ok) return body.response;
	const result = await saveSignalCheck(db(), access.buildId, body.data, access.user.id);
	if (!result.ok) return refuse(result.refusals.map((r) => ({ ...r, field: `params.${r.field}` })));
	return json({ id: result.id, cases: result.cases }, { status: 201 });
}
