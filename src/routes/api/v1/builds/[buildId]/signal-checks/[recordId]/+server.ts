import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { objectAccess } from '$lib/server/access';
import { db } from '$lib/server/db';
import { deleteSignalCheck } from '$lib/server/signal-checks';

export async function DELETE(event) {
	const access = await objectAccess(event, 'edit', 'build', event.params.buildId);
	const ok =
		z.uuid().safeParse(event.params.recordId).success &&
		(await deleteSignalCheck(db(), access.buildId, event.params.recordId, access.user.id));
	if (!ok) error(404, { message: 'No such signal check in this build.', code: 'not-found' });
	return new Response(null, { status: 204 });
}
