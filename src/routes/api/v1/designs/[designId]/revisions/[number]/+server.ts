import { error, json } from '@sveltejs/kit';
import { revisionNumber } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { db } from '$lib/server/db';
import { revisionOf } from '$lib/server/designs';

export async function GET(event) {
	await objectAccess(event, 'read', 'design', event.params.designId);
	const number = revisionNumber.safeParse(event.params.number);
	const revision = number.success ? await revisionOf(db(), event.params.designId, number.data) : undefined;
	if (!revision) error(404, { message: `revision: this design has no revision ${event.params.number}`, code: 'not-found' });
	return json({ revision });
}
