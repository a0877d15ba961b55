import { error } from '@sveltejs/kit';
import { revisionNumber } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { fileResponse } from '$lib/server/api';
import { db } from '$lib/server/db';
import { revisionOf } from '$lib/server/designs';
import { wheelFile, wheelFileKinds, type WheelFileKind } from '$lib/server/exports/wheel-file';
import { checkWheel } from '$lib/server/wheel-request';

/** A saved revision as wheel.dxf, wheel.svg, wheel.pdf or wheel.stl; the file name carries the revision. */
export async function GET(event) {
	await objectAccess(event, 'read', 'design', event.params.designId);
	const kind = event.params.file.replace(/^wheel\./, '') as WheelFileKind;
	if (!event.params.file.startsWith('wheel.') || !wheelFileKinds.includes(kind))
		error(404, { message: 'file: wheel.dxf, wheel.svg, wheel.pdf or wheel.stl', code: 'not-found' });
	const number = revisionNumber.safeParse(event.params.number);
	const revision = number.success ? await revisionOf(db(), event.params.designId, number.data) : undefined;
	if (!revision) error(404, { message: `revision: this design has no revision ${event.params.number}`, code: 'not-found' });
	const wheel = checkWheel(revision.params);
	// Saved revisions passed the same check when they were written; a later tightening of a range shows here.
	if (!wheel.ok)
		error(422, {
			message: `Revision ${revision.number} no longer passes the wheel checks: ${Object.values(wheel.errors).join('; ')}`,
			code: 'invalid'
		});
	const file = await wheelFile(kind, wheel.wheel, wheel.summary, revision.number);
	return fileResponse(file.body, file.contentType, file.name, 'private');
}
