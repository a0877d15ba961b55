// The cutting package's shop drawing: the wheel to a stated scale from the DXF's own contours, its
// dimensions and fits, the notes a fabricator works to, calibration bars to check the print, and a
// title block (part, build, revision, date, scale, material, thickness, quantity, finish, DXF).
import type { WheelSummary } from '$lib/trade/summary';
import { scaleFor } from '$lib/trade/shop-drawing';
import { formatLength, type Units } from '$lib/trade/units';
import type { WheelSpec } from '$lib/trade/wheel';
import { calibrationBars, finish, lineHeight, missingNote, mm, newDocument, papers, printable, printNote, wrapLines } from './pdf-kit';
import { drawingNotes } from './shop-drawing/notes';
import { dimensionRoom, drawView } from './shop-drawing/view';

export interface CuttingSpec {
	buildName: string;
	designName: string;
	revision: number;
	quantity: number;
	notes: string;
	/** Surface finish or treatment asked for; empty when the sender gave none. */
	finish?: string;
	dxfName: string;
	date: string;
	spec: WheelSpec;
	summary: WheelSummary;
	units: Units;
	paper: keyof typeof papers;
}

const margin = 10;
const pad = 2;
const titleBlockMm = 30;
const barsMm = 22;
const noteSize = 7;

export const paperName = (paper: keyof typeof papers) => (paper === 'a4' ? 'A4' : 'Letter');

export async function cuttingSpecPdf(s: CuttingSpec): Promise<Buffer> {
	const size = papers[s.paper];
	const inner = size.widthMm - 2 * margin - 2 * pad;
	const left = margin + pad;
	const doc = newDocument(`Shop drawing: ${s.designName} revision ${s.revision}`, size);
	const named = [printable(s.designName, 'bold'), printable(s.buildName), printable(s.notes), printable(s.finish ?? '')];
	const [design, build, notes, finishText] = named.map((n) => n.text) as [string, string, string, string];
	const missing = [...new Set(named.flatMap((n) => n.missing))];

	// The frame.
	doc
		.lineWidth(mm(0.5))
		.strokeColor('black')
		.rect(mm(margin), mm(margin), mm(size.widthMm - 2 * margin), mm(size.heightMm - 2 * margin))
		.stroke();

	// The header: what this is and how to print it.
	let y = margin + pad;
	doc.font('bold').fontSize(12).fillColor('black');
	for (const line of wrapLines(doc, `Shop drawing: ${design}, revision ${s.revision}`, mm(inner))) {
		doc.text(line, mm(left), mm(y), { lineBreak: false });
		y += lineHeight(doc) / mm(1);
	}
	doc.font('text').fontSize(7.5).fillColor('#444');
	for (const line of wrapLines(doc, printNote, mm(inner))) {
		doc.text(line, mm(left), mm(y), { lineBreak: false });
		y += lineHeight(doc) / mm(1);
	}
	if (missing.length) {
		doc.fillColor('#8a5200');
		for (const line of wrapLines(doc, missingNote(missing), mm(inner))) {
			doc.text(line, mm(left), mm(y), { lineBreak: false });
			y += lineHeight(doc) / mm(1);
		}
	}
	const viewTop = y + 2;

	// The notes, laid out first: the view takes the room they leave.
	doc.font('text').fontSize(noteSize);
	const noteLh = lineHeight(doc) / mm(1);
	const numbered = drawingNotes(s.spec, s.units, s.dxfName).map((n, i) => printable(`${i + 1}. ${n}`).text);
	if (notes) numbered.push(`From the sender: ${notes}`);
	const noteLines = numbered.flatMap((n) => wrapLines(doc, n, mm(inner)));
	const titleTop = size.heightMm - margin - titleBlockMm;
	const notesTop = titleTop - 2 - noteLines.length * noteLh;
	const barsTop = notesTop - barsMm;

	// The view: the largest ISO 5455 scale at which the wheel and its dimensions fit.
	const roomMm = Math.min(inner - 2 * dimensionRoom.sideMm, barsTop - viewTop - 2 * dimensionRoom.verticalMm);
	const scale = scaleFor(s.spec.odMm, Math.max(roomMm, 1));
	drawView({
		doc,
		spec: s.spec,
		units: s.units,
		scale: scale.factor,
		centre: { x: size.widthMm / 2, y: (viewTop + barsTop) / 2 }
	});

	// Calibration bars at full size whatever the scale (they check the print), and at any other
	// scale a bar of the part's own millimetres drawn at that scale.
	calibrationBars(doc, left, barsTop + 6);
	doc.font('bold').fontSize(9).fillColor('black');
	doc.text(`Scale ${scale.label}`, mm(left + 118), mm(barsTop + 2), { lineBreak: false });
	if (scale.factor !== 1) scaleBar(doc, left + 118, barsTop + 12, scale.factor, scale.label);

	doc.font('text').fontSize(noteSize).fillColor('black');
	let ny = notesTop;
	for (const line of noteLines) {
		doc.text(line, mm(left), mm(ny), { lineBreak: false });
		ny += noteLh;
	}

	titleBlock(doc, titleTop, size.widthMm, [
		['Part', design],
		['Build', build],
		['Revision', String(s.revision)],
		['Date', s.date],
		['Material', s.spec.materialLabel],
		['Thickness', formatLength(s.spec.thicknessMm, s.units)],
		['Quantity', `${s.quantity} off`],
		['Finish', finishText || 'as cut, deburred'],
		['Scale', `${scale.label} on ${paperName(s.paper)}`],
		['Units', s.units === 'in' ? 'inches' : 'millimetres'],
		['Tolerances', 'ISO 2768-m unless stated'],
		['DXF', s.dxfName]
	]);
	return finish(doc);
}

/** A bar 100 mm of the part long, drawn at the drawing's scale, ticked every 10 mm of the part. */
function scaleBar(doc: PDFKit.PDFDocument, x: number, y: number, factor: number, label: string) {
	const length = 100 * factor;
	doc.save().lineWidth(0.5).strokeColor('black');
	doc
		.moveTo(mm(x), mm(y))
		.lineTo(mm(x + length), mm(y))
		.stroke();
	for (let i = 0; i <= 10; i++)
		doc
			.moveTo(mm(x + (i * length) / 10), mm(y))
			.lineTo(mm(x + (i * length) / 10), mm(y - (i % 5 ? 1.5 : 3)))
			.stroke();
	doc.font('mono').fontSize(6).fillColor('black');
	doc.text('0', mm(x) - 10, mm(y + 1), { width: 20, align: 'center' });
	doc.text('100', mm(x + length) - 10, mm(y + 1), { width: 20, align: 'center' });
	doc
		.font('text')
		.fontSize(7)
		.text(`mm of the part at ${label}`, mm(x + length + 4), mm(y - 2), { lineBreak: false });
	doc.restore();
}

/** The title block: captions over values, four to a row, across the foot of the frame. */
function titleBlock(doc: PDFKit.PDFDocument, top: number, widthMm: number, cells: [string, string][]) {
	const across = 4;
	const rows = Math.ceil(cells.length / across);
	const w = (widthMm - 2 * margin) / across;
	const h = titleBlockMm / rows;
	doc.lineWidth(mm(0.35)).strokeColor('black');
	cells.forEach(([caption, value], i) => {
		const x = margin + (i % across) * w;
		const y = top + Math.floor(i / across) * h;
		doc.rect(mm(x), mm(y), mm(w), mm(h)).stroke();
		doc
			.font('text')
			.fontSize(5.5)
			.fillColor('#555')
			.text(caption, mm(x + 1.2), mm(y + 0.8), { lineBreak: false });
		doc.font('mono').fontSize(7).fillColor('black');
		// A long value keeps to its cell: its first line, cut with an ellipsis.
		const lines = wrapLines(doc, value, mm(w - 2.4));
		const shown = lines.length > 1 ? `${lines[0]!.slice(0, -1)}…` : lines[0]!;
		doc.text(shown, mm(x + 1.2), mm(y + 4), { lineBreak: false });
	});
}
