import { json, type RequestEvent } from '@sveltejs/kit';
import { objectAccess } from './access';
import { refuse } from './api';
import { listPage, pageSize, type BuildList } from './build-lists';
import { db } from './db';
import { cursorParam } from './keyset';

/**
 * `GET /api/v1/builds/:id/<list>?cursor=`: one page of the list, newest first, and `next` for the
 * page after it (null on the last). Access first, so a stranger learns nothing from a bad cursor.
 */
export async function listAnswer(event: RequestEvent<{ buildId: string }>, list: BuildList): Promise<Response> {
	const access = await objectAccess(event, 'read', 'build', event.params.buildId);
	const read = cursorParam(event.url.searchParams.get('cursor'));
	if (!read.ok) return refuse([read.refusal]);
	const page = await listPage[list](db(), access.buildId, { cursor: read.cursor, limit: pageSize.api });
	return json({ [list]: page.items, next: page.next });
}
