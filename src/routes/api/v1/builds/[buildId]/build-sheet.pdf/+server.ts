import { buildSheetQuery as query } from '$lib/schemas/build';
import { objectAccess } from '$lib/server/access';
import { logActivity } from '$lib/server/activity';
import { fileResponse, queryOf, refuse } from '$lib/server/api';
import { buildSheetFor } from '$lib/server/build-sheet';
import { db } from '$lib/server/db';
import { buildSheetPdf } from '$lib/server/exports/build-sheet-pdf';

/**
 * The build sheet of the saved build (src/lib/server/build-sheet.ts says what it takes from it).
 * Each download is logged: the build's steps read the newest one as the sheet issued, and which
 * wheel revision it printed.
 */
export async function GET(event) {
	const access = await objectAccess(event, 'read', 'build', event.params.buildId);
	const q = queryOf(event.url, query);
	if (!q.ok) return q.response;
	const sheet = await buildSheetFor(db(), access, q.data);
	if (!sheet.ok) return refuse(sheet.refusals);
	const pdf = await buildSheetPdf(sheet.value.sheet);
	const summary = `Build sheet issued, wheel revision ${sheet.value.sheet.revision}`;
	// A HEAD (link checkers, previews) asks about the file; only a download issues the sheet.
	if (event.request.method === 'GET')
		await logActivity(db(), { buildId: access.buildId, actorId: access.user.id, kind: 'build-sheet', summary });
	return fileResponse(pdf, 'application/pdf', sheet.value.filename, 'private');
}
