import { error } from '@sveltejs/kit';
import { objectAccess } from '$lib/server/access';
import { buildOverview } from '$lib/server/build-overview';
import { db } from '$lib/server/db';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const access = await objectAccess(event, 'read', 'build', event.params.buildId);
	const overview = await buildOverview(db(), access.buildId);
	if (!overview) error(404, { message: 'No such build in your workshops.', code: 'not-found' });
	return { ...overview, workshop: { id: access.workshop.id, name: access.workshop.name, role: access.workshop.role }, can: access.can };
};
