import { error } from '@sveltejs/kit';
import { revisionListQuery, revisionNumber } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { getBuild } from '$lib/server/builds';
import { db } from '$lib/server/db';
import { getDesign, headRevisionOf, revisionOf, revisionPage } from '$lib/server/designs';
import type { PageServerLoad } from './$types';

const notHere = () => error(404, { message: 'No such wheel design in this build.', code: 'not-found' });

/**
 * A wheel design's history: a page of its revisions, newest first (`cursor` for older ones, `q` to
 * find some by number or message), and the two compared (`a`, `b` in the address; the two newest
 * unless chosen). Each compared revision is one index probe, wherever it sits in the history. An
 * address the schema refuses (a hand-edited cursor) shows the newest page rather than an error.
 */
export const load: PageServerLoad = async (event) => {
	const access = await objectAccess(event, 'read', 'design', event.params.designId);
	if (access.buildId !== event.params.buildId) notHere();
	const designId = event.params.designId;
	const params = event.url.searchParams;
	const query = revisionListQuery.safeParse(Object.fromEntries(params));
	const view = query.success ? query.data : revisionListQuery.parse({});
	const chosen = (name: 'a' | 'b') => {
		const parsed = revisionNumber.safeParse(params.get(name) ?? undefined);
		return parsed.success ? parsed.data : undefined;
	};
	const [design, build, head, page] = await Promise.all([
		getDesign(db(), designId),
		getBuild(db(), access.buildId),
		headRevisionOf(db(), designId),
		revisionPage(db(), designId, view)
	]);
	if (!design || !build || design.buildId !== event.params.buildId) notHere();
	const a = chosen('a') ?? Math.max(1, head - 1);
	const b = chosen('b') ?? head;
	const [revA, revB] = await Promise.all([revisionOf(db(), designId, a), revisionOf(db(), designId, b)]);
	return {
		build: { id: build!.id, name: build!.name },
		design: { id: design!.id, name: design!.name },
		head,
		revisions: page.revisions,
		next: page.next,
		q: view.q,
		older: view.cursor !== undefined,
		compare: { a, b, revA: revA ?? null, revB: revB ?? null },
		workshop: { name: access.workshop.name, role: access.workshop.role },
		can: access.can
	};
};
