import { json } from '@sveltejs/kit';
import { revisionListQuery } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { queryOf } from '$lib/server/api';
import { db } from '$lib/server/db';
import { getDesign, headRevisionOf, revisionPage } from '$lib/server/designs';

/**
 * The design, its newest revision's number and a page of its revisions, newest first (each with
 * its parameters, author, time and message); `next` is the `cursor` of the older ones.
 */
export async function GET(event) {
	const query = queryOf(event.url, revisionListQuery);
	if (!query.ok) return query.response;
	const access = await objectAccess(event, 'read', 'design', event.params.designId);
	const [design, headRevision, page] = await Promise.all([
		getDesign(db(), event.params.designId),
		headRevisionOf(db(), event.params.designId),
		revisionPage(db(), event.params.designId, query.data)
	]);
	return json({ role: access.workshop.role, design, headRevision, ...page });
}
