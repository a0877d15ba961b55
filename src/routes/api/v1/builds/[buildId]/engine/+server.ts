import { error, json } from '@sveltejs/kit';
import { engineProfile } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { jsonBody, refuse } from '$lib/server/api';
import { saveEngineProfile } from '$lib/server/builds';
import { db } from '$lib/server/db';

/**
 * Stores the build's engine profile and sensor set-up: the phasing check's parameters (the same
 * names as `GET /api/v1/phasing`), checked the same way. Answers the phasing result for them.
 */
export async function PUT(event) {
	const access = await objectAccess(event, 'edit', 'build', event.params.buildId);
	const body = await jsonBody(event.request, engineProfile);
	if (!body.ok) return body.response;
	const result = await saveEngineProfile(db(), access.workshop.id, access.buildId, body.data.params, access.user.id);
	if (result.ok) return json({ params: result.params, layout: result.layout, phasing: result.phasing });
	if (result.reason === 'invalid') return refuse(result.refusals);
	error(404, { message: 'No such build in your workshops.', code: 'not-found' });
}
