import { json } from '@sveltejs/kit';
import { buildQuery, createBuild as createSchema } from '$lib/schemas/build';
import { workshopAccess } from '$lib/server/access';
import { jsonBody, queryOf } from '$lib/server/api';
import { createBuild, listBuilds } from '$lib/server/builds';
import { db } from '$lib/server/db';

/** One page of the builds of the caller's current workshop (or ?workshop=<id> among theirs): ?q= searches name and engine. */
export async function GET(event) {
	const query = queryOf(event.url, buildQuery);
	if (!query.ok) return query.response;
	const access = await workshopAccess(event, 'read', query.data.workshop);
	const page = await listBuilds(db(), access.workshop.id, query.data);
	return json({ workshop: { id: access.workshop.id, name: access.workshop.name }, role: access.workshop.role, ...page });
}

/** A new build in the current workshop (editor or owner). */
export async function POST(event) {
	const access = await workshopAccess(event, 'edit', event.url.searchParams.get('workshop') ?? undefined);
	const body = await jsonBody(event.request, createSchema);
	if (!body.ok) return body.response;
	const result = await createBuild(db(), access.workshop.id, body.data, access.user.id);
	if (!result.ok)
		return json(
			{
				message: 'name: another build in this workshop has that name',
				code: 'conflict',
				errors: { name: 'name: another build in this workshop has that name' }
			},
			{ status: 409 }
		);
	return json({ id: result.id }, { status: 201, headers: { location: `/api/v1/builds/${result.id}` } });
}
