import { parsePhasing } from '$lib/schemas/phasing';
import { parseTdc } from '$lib/schemas/tape';
import { parseWheel } from '$lib/schemas/wheel';
import { fileResponse, refuse } from '$lib/server/api';
import { buildSheetPdf } from '$lib/server/exports/build-sheet-pdf';
import { phasing } from '$lib/trade/phasing';
import { summarize } from '$lib/trade/summary';
import { tdcFromMarks } from '$lib/trade/tdc';
import { parseLength, toMm } from '$lib/trade/units';
import { z } from 'zod';

const extra = z.object({
	build: z.string().trim().min(1).max(80, { error: 'build: at most 80 characters' }).default('Untitled build'),
	revision: z.string().trim().max(20, { error: 'revision: at most 20 characters' }).default('unsaved'),
	tdcA: z.string().optional(),
	tdcB: z.string().optional(),
	tapeDiameter: z.string().optional()
});

/** A build sheet from parameters alone: the wheel's, the phasing check's, and the optional records. */
export async function GET({ url }) {
	const params = Object.fromEntries(url.searchParams);
	const wheel = parseWheel(params);
	const phase = parsePhasing(params);
	const more = extra.safeParse(params);
	const errors = { ...(wheel.ok ? {} : wheel.errors), ...(phase.ok ? {} : phase.errors) };
	if (!more.success) for (const i of more.error.issues) errors[String(i.path[0])] ??= i.message;
	if (!wheel.ok || !phase.ok || !more.success) return refuse(errors);

	const summary = summarize(wheel.value.spec, wheel.value.units, wheel.value.running);
	if (!summary.ok) return refuse(Object.fromEntries(summary.refusals.map((r) => [r.field, r.message])));

	let tdc = null;
	if (more.data.tdcA !== undefined || more.data.tdcB !== undefined) {
		const marks = parseTdc({ a: more.data.tdcA, b: more.data.tdcB });
		if (!marks.ok) return refuse(Object.fromEntries(Object.entries(marks.errors).map(([k, v]) => [`tdc${k.toUpperCase()}`, `tdc${k.toUpperCase()}${v.slice(1)}`])));
		if (marks.value.kind !== 'marks') return refuse({ tdcA: 'tdcA: a piston-stop reading in degrees' });
		const answer = tdcFromMarks(marks.value.a, marks.value.b, marks.value.scale, marks.value.arc);
		if (!answer.ok) return refuse({ tdcB: `tdcB${answer.message.slice(1)}` });
		tdc = { a: marks.value.a, b: marks.value.b, result: answer.result };
	}
	let tapeHubMm: number | null = null;
	if (more.data.tapeDiameter !== undefined) {
		tapeHubMm = toMm(parseLength(more.data.tapeDiameter), wheel.value.units);
		if (!(tapeHubMm >= 10 && tapeHubMm <= 2000)) return refuse({ tapeDiameter: 'tapeDiameter: the timing hub diameter, 10 mm to 2000 mm' });
	}
	const pdf = await buildSheetPdf({
		buildName: more.data.build,
		revision: more.data.revision,
		date: new Date().toISOString().slice(0, 10),
		wheel: wheel.value,
		summary: summary.summary,
		phasing: phase.value,
		result: phasing(phase.value.input),
		tdc,
		tapeHubMm
	});
	const slug = more.data.build.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'build';
	return fileResponse(pdf, 'application/pdf', `build-sheet-${slug}.pdf`);
}
