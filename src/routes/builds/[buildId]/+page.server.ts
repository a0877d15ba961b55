import { error } from '@sveltejs/kit';
import { objectAccess } from '$lib/server/access';
import { buildLists, pageSize, type BuildList } from '$lib/server/build-lists';
import { buildOverview } from '$lib/server/build-overview';
import { db } from '$lib/server/db';
import { cursorParam, type Cursor } from '$lib/server/keyset';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const access = await objectAccess(event, 'read', 'build', event.params.buildId);
	// "Older photos" and the like are plain links: the list's name in the query holds where it starts.
	const cursors: Partial<Record<BuildList, Cursor>> = {};
	for (const list of buildLists) {
		const read = cursorParam(event.url.searchParams.get(list), list);
		if (!read.ok) error(400, { message: `${list}: ${read.refusal.message}`, code: 'invalid' });
		if (read.cursor) cursors[list] = read.cursor;
	}
	const overview = await buildOverview(db(), access.buildId, { limit: pageSize.page, cursors });
	if (!overview) error(404, { message: 'No such build in your workshops.', code: 'not-found' });
	return {
		...overview,
		paged: Object.keys(cursors) as BuildList[],
		workshop: { id: access.workshop.id, name: access.workshop.name, role: access.workshop.role },
		can: access.can
	};
};
