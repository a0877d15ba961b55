import { json } from '@sveltejs/kit';
import { createDesign as createSchema } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { jsonBody, refuse } from '$lib/server/api';
import { db } from '$lib/server/db';
import { createDesign, designsOf } from '$lib/server/designs';

export async function GET(event) {
	const access = await objectAccess(event, 'read', 'build', event.params.buildId);
	return json({ designs: await designsOf(db(), access.buildId) });
}

/** A new wheel design in the build, saved as its revision 1. The wheel parameters are the designer's (`GET /api/v1/wheel`). */
export async function POST(event) {
	const access = await objectAccess(event, 'edit', 'build', event.params.buildId);
	const body = await jsonBody(event.request, createSchema);
	if (!body.ok) return body.response;
	const result = await createDesign(db(), access.buildId, body.data, access.user.id);
	if (!result.ok && result.reason === 'invalid') return refuse(result.refusals);
	if (!result.ok)
		return json(
			{
				message: 'name: this build has a wheel design of that name',
				code: 'conflict',
				errors: { name: 'name: this build has a wheel design of that name' }
			},
			{ status: 409 }
		);
	return json({ id: result.designId, revision: 1 }, { status: 201, headers: { location: `/api/v1/designs/${result.designId}` } });
}
