import { parseBuildSheet } from '$lib/schemas/phasing';
import { fileResponse, refuse } from '$lib/server/api';
import { buildSheetPdf } from '$lib/server/exports/build-sheet-pdf';
import { phasing } from '$lib/trade/phasing';

/** A build sheet from parameters alone: the wheel's, the phasing check's, and the optional records. */
export async function GET({ url }) {
	const parsed = parseBuildSheet(Object.fromEntries(url.searchParams));
	if (!parsed.ok) return refuse(parsed.errors);
	const sheet = parsed.value;
	const pdf = await buildSheetPdf({ ...sheet, date: new Date().toISOString().slice(0, 10), result: phasing(sheet.phasing.input) });
	const slug = sheet.buildName.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'build';
	return fileResponse(pdf, 'application/pdf', `build-sheet-${slug}.pdf`);
}
