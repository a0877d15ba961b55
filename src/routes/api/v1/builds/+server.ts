import { error, json } from '@sveltejs/kit';
import { z } from 'zod';
import { workshopAccess } from '$lib/server/access';
import { listBuilds } from '$lib/server/builds';
import { db } from '$lib/server/db';

const query = z.object({ workshop: z.uuid({ error: 'workshop: a workshop id' }).optional() });

/** The builds of the caller's current workshop, or of ?workshop=<id> among theirs. */
export async function GET(event) {
	const parsed = query.safeParse(Object.fromEntries(event.url.searchParams));
	if (!parsed.success) error(400, { message: parsed.error.issues[0]!.message, code: 'invalid' });
	const access = await workshopAccess(event, 'read', parsed.data.workshop);
	const builds = await listBuilds(db(), access.workshop.id);
	return json({ workshop: { id: access.workshop.id, name: access.workshop.name }, role: access.workshop.role, builds });
}
