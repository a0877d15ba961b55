import { checkTimingCard } from '$lib/schemas/timing-card';
import { timingCardPdf } from '$lib/server/exports/timing-card-pdf';
import { fileResponse, refuse } from '$lib/server/api';
import { timingRows } from '$lib/trade/timing';

export async function GET({ url }) {
	const parsed = checkTimingCard(Object.fromEntries(url.searchParams));
	if (!parsed.ok) return refuse(parsed.refusals);
	const { hub, points, rotation, units, paper, name } = parsed.value;
	return fileResponse(
		await timingCardPdf(timingRows(points, { ...hub, rotation }), hub, rotation, units, paper, name),
		'application/pdf',
		'timing-light-card.pdf'
	);
}
