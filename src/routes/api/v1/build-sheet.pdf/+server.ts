import { fileResponse, refuse } from '$lib/server/api';
import { sheetFromParams } from '$lib/server/build-sheet';
import { buildSheetPdf } from '$lib/server/exports/build-sheet-pdf';

/** A build sheet from parameters alone: the wheel's, the phasing check's, and the optional records. */
export async function GET({ url }) {
	const sheet = sheetFromParams(Object.fromEntries(url.searchParams));
	if (!sheet.ok) return refuse(sheet.refusals);
	return fileResponse(await buildSheetPdf(sheet.value.sheet), 'application/pdf', sheet.value.filename);
}
