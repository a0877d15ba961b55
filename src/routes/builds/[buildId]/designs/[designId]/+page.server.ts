import { error } from '@sveltejs/kit';
import { objectAccess } from '$lib/server/access';
import { getBuild } from '$lib/server/builds';
import { db } from '$lib/server/db';
import { getDesign, revisionsOf } from '$lib/server/designs';
import type { PageServerLoad } from './$types';

const notHere = () => error(404, { message: 'No such wheel design in this build.', code: 'not-found' });

/** A wheel design's revisions, newest first. The design must belong to the build in the path. */
export const load: PageServerLoad = async (event) => {
	const access = await objectAccess(event, 'read', 'design', event.params.designId);
	if (access.buildId !== event.params.buildId) notHere();
	const [design, revisions, build] = await Promise.all([
		getDesign(db(), event.params.designId),
		revisionsOf(db(), event.params.designId),
		getBuild(db(), access.buildId)
	]);
	if (!design || !build || design.buildId !== event.params.buildId) notHere();
	return {
		build: { id: build!.id, name: build!.name },
		design: { id: design!.id, name: design!.name },
		revisions,
		workshop: { name: access.workshop.name, role: access.workshop.role },
		can: access.can
	};
};
