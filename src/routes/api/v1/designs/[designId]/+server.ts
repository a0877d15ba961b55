import { json } from '@sveltejs/kit';
import { objectAccess } from '$lib/server/access';
import { db } from '$lib/server/db';
import { getDesign, revisionsOf } from '$lib/server/designs';

/** The design and its revisions, newest first (each with its parameters, author, time and message). */
export async function GET(event) {
	const access = await objectAccess(event, 'read', 'design', event.params.designId);
	const [design, revisions] = await Promise.all([getDesign(db(), event.params.designId), revisionsOf(db(), event.params.designId)]);
	return json({ role: access.workshop.role, design, headRevision: revisions[0]?.number ?? 0, revisions });
}
