import { error, json } from '@sveltejs/kit';
import { updateBuild as updateSchema } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { jsonBody } from '$lib/server/api';
import { buildOverview, deleteBuild } from '$lib/server/build-overview';
import { changeBuild } from '$lib/server/builds';
import { db } from '$lib/server/db';

/** The build with everything it holds: engine profile, wheel designs, records, photos, cutting packages, activity. */
export async function GET(event) {
	const access = await objectAccess(event, 'read', 'build', event.params.buildId);
	const overview = await buildOverview(db(), access.buildId);
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
