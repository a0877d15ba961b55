// The cutting package's one-page spec: what to cut, from what, how many, which revision.
import type { WheelSummary } from '$lib/trade/summary';
import { formatLength, type Units } from '$lib/trade/units';
import type { WheelSpec } from '$lib/trade/wheel';
import { finish, missingNote, mm, newDocument, papers, printable } from './pdf-kit';
import { specRows } from './wheel-pdf';

export interface CuttingSpec {
	buildName: string;
	designName: string;
	revision: number;
	quantity: number;
	notes: string;
	dxfName: string;
	date: string;
	spec: WheelSpec;
	summary: WheelSummary;
	units: Units;
	paper: keyof typeof papers;
}

const margin = 15;

export async function cuttingSpecPdf(s: CuttingSpec): Promise<Buffer> {
	const size = papers[s.paper];
	const width = size.widthMm - 2 * margin;
	const doc = newDocument(`Cutting spec: ${s.designName} revision ${s.revision}`, size);
	const design = printable(s.designName, 'bold');
	const build = printable(s.buildName);
	const notes = printable(s.notes);
	const missing = [...new Set([...design.missing, ...build.missing, ...notes.missing])];
	let y = margin;
	doc
		.font('bold')
		.fontSize(15)
		.text(`Cutting spec: ${design.text}, revision ${s.revision}`, mm(margin), mm(y), { width: mm(width) });
	y += 9;
	doc
		.font('text')
		.fontSize(9)
		.fillColor('#444')
		.text(`${build.text} · ${s.date} · drawing: ${s.dxfName}`, mm(margin), mm(y), { width: mm(width) });
	y += 5;
	if (missing.length)
		doc
			.font('text')
			.fontSize(8)
			.fillColor('#8a5200')
			.text(missingNote(missing), mm(margin), mm(y), { width: mm(width) });
	y += 5;
	const order: [string, string][] = [
		['Quantity', String(s.quantity)],
		['Material', s.spec.materialLabel],
		['Thickness', formatLength(s.spec.thicknessMm, s.units)],
		['Revision', String(s.revision)],
		['Drawing units', s.units === 'mm' ? 'millimetres (DXF $INSUNITS 4)' : 'inches (DXF $INSUNITS 1)'],
		['Layers', 'CUT (red): through-cut outline, bore and holes. ETCH (blue): mark only, do not cut through.']
	];
	const rows = (list: [string, string][], fontSize: number) => {
		for (const [k, v] of list) {
			doc
				.font('text')
				.fontSize(fontSize)
				.fillColor('black')
				.text(k, mm(margin), mm(y), { width: mm(48) });
			doc
				.font('mono')
				.fontSize(fontSize)
				.text(v, mm(margin + 50), mm(y), { width: mm(width - 50) });
			y += Math.max(5.5, doc.heightOfString(v, { width: mm(width - 50) }) / mm(1) + 1.5);
		}
	};
	doc.font('bold').fontSize(11).text('Order', mm(margin), mm(y));
	y += 7;
	rows(order, 10);
	y += 4;
	doc.font('bold').fontSize(11).fillColor('black').text('Wheel', mm(margin), mm(y));
	y += 7;
	rows(specRows(s.spec, s.summary, s.units), 8.5);
	if (s.notes) {
		y += 4;
		doc.font('bold').fontSize(11).fillColor('black').text('Notes', mm(margin), mm(y));
		y += 7;
		doc
			.font('text')
			.fontSize(9.5)
			.text(notes.text, mm(margin), mm(y), { width: mm(width) });
		y += doc.heightOfString(notes.text, { width: mm(width) }) / mm(1) + 4;
	}
	doc
		.font('text')
		.fontSize(8)
		.fillColor('#444')
		.text(
			'Deburr all edges: cut parts are sharp. Keep the outline to the drawing; the gap and tooth edges set the engine’s timing.',
			mm(margin),
			mm(size.heightMm - margin - 8),
			{ width: mm(width) }
		);
	return finish(doc);
}
