// The timing-light card: a table to take to the engine of where the mark should appear at each
// speed, on this hub's tape.
import { btdcSide, tdcSideOf, travelWords, type Rotation } from '$lib/trade/hub';
import { fittingWords, mmPerDegree } from '$lib/trade/tape';
import type { CardRow } from '$lib/trade/timing';
import { formatLength, fromMm, type Units } from '$lib/trade/units';
import { calibrationBars, finish, missingNote, mm, newDocument, papers, printable, printNote } from './pdf-kit';

const margin = 15;

export async function timingCardPdf(
	rows: CardRow[],
	hub: { hubDiameterMm: number; paperThicknessMm: number },
	rotation: Rotation,
	units: Units,
	paper: keyof typeof papers,
	name = ''
): Promise<Buffer> {
	const size = papers[paper];
	const title = printable(name, 'bold');
	const doc = newDocument(title.text ? `Timing-light card: ${title.text}` : 'Timing-light card', size);
	const k = mmPerDegree(hub);
	const width = mm(size.widthMm - 2 * margin);
	doc
		.font('bold')
		.fontSize(14)
		.text(title.text ? `Timing-light card: ${title.text}` : 'Timing-light card', mm(margin), mm(margin), { width });
	if (title.missing.length)
		doc.font('text').fontSize(8).fillColor('#8a5200').text(missingNote(title.missing), { width }).fillColor('black');
	// The direction of travel on a line of its own: what a person checks first with the engine turning.
	const toward = btdcSide(rotation);
	doc
		.font('bold')
		.fontSize(9.5)
		.text(
			`Direction of travel: the tape moves ${toward === 'right' ? 'left to right' : 'right to left'} past the pointer; BTDC marks (${toward} of TDC) reach it first.`,
			mm(margin),
			doc.y + mm(1.5),
			{ width }
		);
	doc
		.font('text')
		.fontSize(8.5)
		.text(
			`Hub ${formatLength(hub.hubDiameterMm, units)}, ${formatLength(k, units)} per degree on the tape. ${travelWords(rotation)} Left and right below are as you read the tape upright. ${printNote}`,
			mm(margin),
			doc.y + mm(1.5),
			{ width }
		);
	doc.fontSize(7.5).text(fittingWords, { width });

	const cols = [margin, margin + 30, margin + 62, margin + 135];
	let y = Math.max(margin + 30, doc.y / mm(1) + 5);
	doc.font('bold').fontSize(9);
	['Engine speed', 'Mark at', 'Pointer on the tape', ''].forEach((h, i) => doc.text(h, mm(cols[i]!), mm(y), { lineBreak: false }));
	y += 6;
	doc
		.lineWidth(0.4)
		.moveTo(mm(margin), mm(y - 1.5))
		.lineTo(mm(size.widthMm - margin), mm(y - 1.5))
		.stroke();
	for (const r of rows) {
		doc.font('mono').fontSize(10);
		doc.text(`${r.rpm} rpm`, mm(cols[0]!), mm(y), { lineBreak: false });
		doc.text(r.advanceDeg === 0 ? 'TDC' : `${Math.abs(r.advanceDeg)}° ${tdcSideOf(-r.advanceDeg)}`, mm(cols[1]!), mm(y), {
			lineBreak: false
		});
		doc.text(
			r.side ? `${fromMm(r.fromTdcMm, units).toFixed(units === 'in' ? 3 : 1)} ${units} ${r.side} of TDC` : 'on the TDC line',
			mm(cols[2]!),
			mm(y),
			{ lineBreak: false }
		);
		doc
			.font('text')
			.fontSize(8)
			.text('checked: ____', mm(cols[3]!), mm(y + 0.5), { lineBreak: false });
		y += 7.5;
	}
	y += 6;
	doc.font('bold').fontSize(9).fillColor('#8a5200').text('Before you start the engine', mm(margin), mm(y));
	doc
		.font('text')
		.fontSize(8)
		.fillColor('black')
		.list(
			[
				'Keep hands, hair, sleeves, the timing light and its leads clear of the pulley, belts and fan.',
				"Wrong timing can kick back through a kick-starter or crank and can damage the engine; start with the ECU maker's safe base map.",
				'Check for fuel leaks first; no open flames or sparks near fuel.',
				"Check timing with the light at each speed before putting the engine under load. The curve here is yours to verify: follow the ECU maker's instructions, local codes and licensed professionals."
			],
			mm(margin),
			mm(y + 6),
			{ width: mm(size.widthMm - 2 * margin), bulletRadius: 1.2 }
		);
	calibrationBars(doc, margin, size.heightMm - margin - 12);
	return finish(doc);
}
