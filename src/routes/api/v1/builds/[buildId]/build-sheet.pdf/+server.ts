import { z } from 'zod';
import { revisionNumber } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { fileResponse, queryOf, refuse } from '$lib/server/api';
import { buildSheetFor } from '$lib/server/build-sheet';
import { db } from '$lib/server/db';
import { buildSheetPdf } from '$lib/server/exports/build-sheet-pdf';

const query = z.object({
	design: z.uuid({ error: 'design: a wheel design id of this build' }).optional(),
	revision: revisionNumber.optional()
});

/** The build sheet of the saved build (src/lib/server/build-sheet.ts says what it takes from it). */
export async function GET(event) {
	const access = await objectAccess(event, 'read', 'build', event.params.buildId);
	const q = queryOf(event.url, query);
	if (!q.ok) return q.response;
	const sheet = await buildSheetFor(db(), access, q.data);
	if (!sheet.ok) return refuse(sheet.refusals);
	return fileResponse(await buildSheetPdf(sheet.value.sheet), 'application/pdf', sheet.value.filename, 'private');
}
