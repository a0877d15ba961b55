import { error, json } from '@sveltejs/kit';
import { updateBuild as updateSchema } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { jsonBody } from '$lib/server/api';
import { pageSize } from '$lib/server/build-lists';
import { buildOverview, deleteBuild } from '$lib/server/build-overview';
import { changeBuild } from '$lib/server/builds';
import { db } from '$lib/server/db';

/**
 * The build with the newest 50 of each list it holds (records, tapes, signal checks, photos,
 * cutting packages, activity); `next.<list>` is the cursor for that list's own route.
 */
export async function GET(event) {
	const access = await objectAccess(event, 'read', 'build', event.params.buildId);
	const overview = await buildOverview(db(), access.buildId, { limit: pageSize.api });
	if (!overview) error(404, { message: 'No such build in your workshops.', code: 'not-found' });
	return json({ role: access.workshop.role, ...overview });
}

export async function PATCH(event) {
	const access = await objectAccess(event, 'edit', 'build', event.params.buildId);
	const body = await jsonBody(event.request, updateSchema);
	if (!body.ok) return body.response;
	const result = await changeBuild(db(), access.workshop.id, access.buildId, body.data, access.user.id);
	if (!result.ok)
		return json(
			{
				message: 'name: another build in this workshop has that name',
				code: 'conflict',
				errors: { name: 'name: another build in this workshop has that name' }
			},
			{ status: 409 }
		);
	return json({ id: result.id });
}

/** Removes the build and everything in it, its photos' files included. */
export async function DELETE(event) {
	const access = await objectAccess(event, 'edit', 'build', event.params.buildId);
	await deleteBuild(db(), access.workshop.id, access.buildId);
	return new Response(null, { status: 204 });
}
