// The degree tape as a PDF to print at actual size: strips stacked on the page, tiled over pages
// with overlap and join marks when the hub is large, calibration bars on every page.
import { tapeEnds, tapeTravel, tdcSideOf, travelWords, type Rotation } from '$lib/trade/hub';
import {
	fittingWords,
	markName,
	mmPerDegree,
	outsideNote,
	tapeMarks,
	tapePage,
	tapeStrips,
	tapeWarnings,
	tapeX,
	ticks,
	type Strip,
	type TapeSpec
} from '$lib/trade/tape';
import { formatLength, type Units } from '$lib/trade/units';
import { alignedAt, calibrationBars, finish, mm, newDocument, papers, printable, printNote } from './pdf-kit';
import { keyOf, Recent } from './recent';

const { marginMm: margin, headerMm: header, footerMm: footer, stripHeightMm: stripHeight, rowGapMm: rowGap } = tapePage;

/** Recent tapes by what makes them (see recent.ts); kept as promises so identical requests share one. */
const recent = new Recent<Promise<Buffer>>(32);

export function tapePdf(spec: TapeSpec, units: Units, paper: keyof typeof papers): Promise<Buffer> {
	const key = keyOf([spec, units, paper]);
	let made = recent.get(key);
	if (!made) {
		made = recent.set(key, drawTape(spec, units, paper));
		made.catch(() => recent.delete(key));
	}
	return made;
}

/** Where two neighbouring strips line up: the middle of the stretch both print. */
const joinMm = (strips: Strip[], i: number) => (strips[i + 1]!.fromMm + strips[i]!.toMm) / 2;

async function drawTape(spec: TapeSpec, units: Units, paper: keyof typeof papers): Promise<Buffer> {
	const size = papers[paper];
	const k = mmPerDegree(spec);
	const strips = tapeStrips(spec, paper);
	const pages = strips.at(-1)!.page;
	const all = ticks(spec);
	const doc = newDocument(`Degree tape, ${formatLength(spec.hubDiameterMm, units)} hub`, size);
	const side = (atdc: number) => tdcSideOf(atdc) ?? 'TDC';
	const textWidth = size.widthMm - 2 * margin - fitting.widthMm - 4;

	for (let page = 1; page <= pages; page++) {
		if (page > 1) doc.addPage({ size: [mm(size.widthMm), mm(size.heightMm)], margin: 0 });
		doc
			.font('bold')
			.fontSize(11)
			.fillColor('black')
			.text(
				`Degree tape: ${formatLength(spec.hubDiameterMm, units)} hub, ${(units === 'in' ? k / 25.4 : k).toFixed(4)} ${units} per degree`,
				mm(margin),
				mm(margin),
				{ width: mm(textWidth) }
			);
		doc
			.font('text')
			.fontSize(7)
			.text(printNote, mm(margin), doc.y + 2, { width: mm(textWidth) });
		doc.text(`${fittingWords} ${travelWords(spec.rotation)}`, mm(margin), doc.y + 2, { width: mm(textWidth) });
		doc.text(
			`Page ${page} of ${pages}. Cut along the dashed lines; glue each strip's end over the grey end of the next strip, their join marks one on the other.`,
			mm(margin),
			doc.y + 2,
			{ width: mm(textWidth) }
		);
		tapeWarnings(spec).forEach((w) => doc.fillColor('#8a5200').text(w, mm(margin), doc.y + 1, { width: mm(textWidth) }));
		if (spec.otherTdc.length)
			doc
				.font('text')
				.fontSize(6.5)
				.fillColor('black')
				.text("0 is cylinder 1's TDC; each other cylinder's TDC (blue) and spec timings (brown) are marked too.", mm(margin), doc.y + 1, {
					width: mm(textWidth)
				});
		fittingDiagram(doc, spec.rotation, size.widthMm - margin - fitting.widthMm, margin);

		strips
			.filter((s) => s.page === page)
			.forEach((strip, row) => {
				const top = margin + header + row * (stripHeight + rowGap);
				const width = strip.toMm - strip.fromMm;
				const x = (tapeMm: number) => mm(margin + tapeMm - strip.fromMm);
				const i = strip.index - 1;
				doc
					.save()
					.lineWidth(0.3)
					.dash(2, { space: 1.5 })
					.strokeColor('#888')
					.rect(mm(margin), mm(top), mm(width), mm(stripHeight))
					.stroke()
					.undash()
					.restore();
				// Join marks: the same tape point on both strips of a join, so lining them up lines up the scale.
				const joinMark = (at: number, join: number) => {
					doc
						.save()
						.fillColor('black')
						.polygon(
							[x(at), mm(top + stripHeight)],
							[x(at) - mm(1.2), mm(top + stripHeight + 2)],
							[x(at) + mm(1.2), mm(top + stripHeight + 2)]
						)
						.fill()
						.restore();
					doc
						.font('text')
						.fontSize(5.5)
						.fillColor('black')
						.text(...alignedAt(doc, `join ${join}`, x(at) - mm(6), mm(top + stripHeight + 2.5), mm(12)));
				};
				if (i > 0) {
					// The overlap: the previous strip's end is glued over it.
					doc
						.save()
						.fillColor('#eeeeee')
						.rect(mm(margin), mm(top), mm(strips[i - 1]!.toMm - strip.fromMm), mm(stripHeight))
						.fill()
						.restore();
					doc
						.font('text')
						.fontSize(5)
						.fillColor('#555')
						.text(`glue strip ${i} here`, mm(margin + 0.5), mm(top + stripHeight - 4), { lineBreak: false });
					joinMark(joinMm(strips, i - 1), i);
				}
				if (i < strips.length - 1) joinMark(joinMm(strips, i), i + 1);
				const labelAt = i > 0 ? strips[i - 1]!.toMm - strip.fromMm + 1 : 0;
				doc
					.font('text')
					.fontSize(5.5)
					.fillColor('#555')
					.text(`strip ${strip.index} of ${strips.length}`, mm(margin + labelAt), mm(top + stripHeight + 2.5), { lineBreak: false });

				doc.lineWidth(0.25).strokeColor('black').fillColor('black').font('mono').fontSize(7);
				for (const t of all) {
					if (t.xMm < strip.fromMm - 1e-9 || t.xMm > strip.toMm + 1e-9) continue;
					const length = t.size === 'major' ? 9 : t.size === 'mid' ? 6 : 3.5;
					doc
						.moveTo(x(t.xMm), mm(top))
						.lineTo(x(t.xMm), mm(top + length))
						.stroke();
					if (t.label) {
						const w = doc.widthOfString(t.label);
						// Only whole labels: a label cut by the strip's end would be read wrongly.
						if (x(t.xMm) - w / 2 < mm(margin) || x(t.xMm) + w / 2 > mm(margin + width)) continue;
						doc.text(t.label, x(t.xMm) - w / 2, mm(top + 10), { lineBreak: false });
						doc
							.font(t.atdcDeg === 0 ? 'bold' : 'text')
							.fontSize(4.5)
							.text(...alignedAt(doc, side(t.atdcDeg), x(t.xMm) - mm(2.5), mm(top + 14), mm(5)));
						doc.font('mono').fontSize(7);
					}
				}
				for (const m of tapeMarks(spec)) {
					if (!m.onTape) continue;
					const at = tapeX(spec, m.atdcDeg);
					const color = m.kind === 'timing' ? '#8a5200' : '#1d47b0';
					if (at < strip.fromMm || at > strip.toMm) continue;
					doc
						.save()
						.lineWidth(0.6)
						.strokeColor(color)
						.moveTo(x(at), mm(top + 16.5))
						.lineTo(x(at), mm(top + stripHeight))
						.stroke()
						.restore();
					// A mark's own name: a character the font lacks shows as "?" rather than vanishing (pdf-kit.ts).
					doc
						.font('text')
						.fontSize(5.5)
						.fillColor(color)
						// Timing labels on a line of their own: a long one never runs over a TDC label beside it.
						.text(printable(markName(m)).text, x(at) + mm(0.8), mm(top + (m.kind === 'tdc' ? 18 : 21)), { lineBreak: false });
					doc.fillColor('black');
				}
			});
		const onPage = strips.filter((s) => s.page === page).length;
		outsideNotes(doc, spec, margin + header + onPage * (stripHeight + rowGap), size.heightMm - margin - footer, size.widthMm - 2 * margin);
		doc
			.font('text')
			.fontSize(6.5)
			.fillColor('black')
			.text(
				'Engine off and ignition off while fitting the tape. Verify timing with a timing light before load; keep hands and leads clear of the pulley.',
				mm(margin),
				mm(size.heightMm - margin - footer + 1),
				{ width: mm(size.widthMm - 2 * margin), lineBreak: false }
			);
		calibrationBars(doc, margin, size.heightMm - margin - 12);
	}
	return finish(doc);
}

/**
 * Below the page's strips, above the footer: every mark the window leaves off, said rather than
 * dropped; as many as the room holds, then how many more.
 */
function outsideNotes(doc: PDFKit.PDFDocument, spec: TapeSpec, fromMm: number, toMm: number, widthMm: number) {
	const notes = tapeMarks(spec)
		.filter((m) => !m.onTape)
		.map((m) => printable(outsideNote(spec, m)).text);
	if (!notes.length) return;
	const width = mm(widthMm);
	doc.font('text').fontSize(6.5);
	for (let shown = notes.length; shown >= 0; shown--) {
		const rest = notes.length - shown;
		const text = `Not on this tape: ${notes.slice(0, shown).join('; ')}${rest ? `${shown ? '; and ' : ''}${rest} more outside its window` : ''}.`;
		if (fromMm + doc.heightOfString(text, { width }) / mm(1) <= toMm || shown === 0) {
			doc.fillColor('#8a5200').text(text, mm(margin), mm(fromMm), { width });
			doc.fillColor('black');
			return;
		}
	}
}

/** The fitting diagram's box, mm. */
const fitting = { widthMm: 72, heightMm: 38 } as const;

/**
 * How the tape goes on, drawn for this rotation: the hub seen from the wheel side with the
 * pointer, the way it turns and the side BTDC takes; and the tape at the pointer, its top edge
 * toward the engine, its bottom edge toward the wheel face, with the way it moves. No numbers, so
 * nothing here reads as a tape label.
 */
function fittingDiagram(doc: PDFKit.PDFDocument, rotation: Rotation, left: number, top: number) {
	const P = (v: number) => mm(v);
	const travel = tapeTravel(rotation);
	const ends = tapeEnds(rotation);
	doc.save().lineWidth(0.3).strokeColor('#888').rect(P(left), P(top), P(fitting.widthMm), P(fitting.heightMm)).stroke();

	// The hub from the wheel side: pointer at the top, the tape on the rim, the crank's sense of rotation.
	const cx = left + 15;
	const cy = top + 19;
	const r = 9;
	const at = (deg: number, radius: number): [number, number] => [
		P(cx + radius * Math.cos((deg * Math.PI) / 180)),
		P(cy - radius * Math.sin((deg * Math.PI) / 180))
	];
	doc.lineWidth(0.5).strokeColor('black').circle(P(cx), P(cy), P(r)).stroke();
	doc.circle(P(cx), P(cy), P(1.2)).fill('black');
	// The tape on the rim round the pointer.
	doc.lineWidth(P(1.2)).strokeColor('#bbbbbb');
	doc.path(`M ${at(150, r + 0.7).join(' ')} A ${P(r + 0.7)} ${P(r + 0.7)} 0 0 1 ${at(30, r + 0.7).join(' ')}`).stroke();
	doc.lineWidth(0.3).strokeColor('black');
	doc.polygon([P(cx), P(cy - r - 1.6)], [P(cx - 1.3), P(cy - r - 4)], [P(cx + 1.3), P(cy - r - 4)]).fill('black');
	doc
		.font('text')
		.fontSize(5)
		.fillColor('black')
		.text('pointer', P(cx + 1.8), P(cy - r - 4.6), { lineBreak: false });
	// Rotation arrow inside the hub.
	const a0 = 120;
	const a1 = 60;
	const [from, to] = travel === 1 ? [a0, a1] : [a1, a0];
	doc
		.lineWidth(0.5)
		.strokeColor('black')
		.path(`M ${at(from, 5.5).join(' ')} A ${P(5.5)} ${P(5.5)} 0 0 ${travel === 1 ? 1 : 0} ${at(to, 5.5).join(' ')}`)
		.stroke();
	const tip = at(to - travel * 14, 5.5);
	const b1 = at(to, 4.2);
	const b2 = at(to, 6.8);
	doc.polygon(tip, b1, b2).fill('black');
	doc.font('bold').fontSize(5).fillColor('#8a5200');
	// BTDC beside the tape's end ahead of the pointer in the sense of rotation, ATDC beside the other.
	const rightEnd = at(38, r + 2.4);
	const leftEnd = at(142, r + 2.4);
	const ink = (word: string) => (word === 'BTDC' ? '#8a5200' : 'black');
	doc.fillColor(ink(ends.left)).text(...alignedAt(doc, ends.left, leftEnd[0] - P(8), leftEnd[1] - P(2), P(8), 'right'));
	doc.fillColor(ink(ends.right)).text(ends.right, rightEnd[0], rightEnd[1] - P(2), { lineBreak: false });
	doc
		.font('text')
		.fontSize(5)
		.fillColor('black')
		.text(
			`seen from the wheel side, turning ${rotation === 'cw' ? 'clockwise' : 'counter-clockwise'}`,
			P(left + 1),
			P(top + fitting.heightMm - 4.5),
			{ width: P(30), align: 'center' }
		);

	// The tape at the pointer, looking at the rim: engine beyond, wheel face toward you.
	const bx = left + 33;
	const bw = fitting.widthMm - 35;
	doc.rect(P(bx), P(top + 2), P(bw), P(4)).fill('#dddddd');
	doc
		.fillColor('black')
		.font('bold')
		.fontSize(5.5)
		.text(...alignedAt(doc, 'ENGINE', P(bx), P(top + 2.8), P(bw)));
	const tx = bx + bw / 2;
	doc.polygon([P(tx), P(top + 9.5)], [P(tx - 1.3), P(top + 6.5)], [P(tx + 1.3), P(top + 6.5)]).fill('black');
	const tapeTop = top + 9.5;
	const tapeH = 9;
	doc
		.lineWidth(0.4)
		.strokeColor('black')
		.rect(P(bx + 1), P(tapeTop), P(bw - 2), P(tapeH))
		.stroke();
	for (let d = -7; d <= 7; d++) {
		const xx = tx + d * 2.2;
		doc
			.lineWidth(d === 0 ? 0.6 : 0.25)
			.moveTo(P(xx), P(tapeTop))
			.lineTo(P(xx), P(tapeTop + (d === 0 ? 3.5 : d % 5 === 0 ? 2.5 : 1.5)))
			.stroke();
	}
	doc
		.font('bold')
		.fontSize(4.5)
		.text(...alignedAt(doc, 'TDC', P(tx - 3), P(tapeTop + 3.4), P(6)));
	doc
		.font('bold')
		.fontSize(4.5)
		.fillColor(ink(ends.left))
		.text(...alignedAt(doc, ends.left, P(tx - 13), P(tapeTop + 3.4), P(8)));
	doc.fillColor(ink(ends.right)).text(...alignedAt(doc, ends.right, P(tx + 5), P(tapeTop + 3.4), P(8)));
	doc
		.font('text')
		.fontSize(4.5)
		.text(...alignedAt(doc, 'top edge (header side) toward the engine', P(bx), P(tapeTop + tapeH - 2.9), P(bw)));
	// The way the tape moves past the pointer.
	const ay = tapeTop + tapeH + 3;
	const half = bw / 2 - 5;
	const [ax0, ax1] = [tx - travel * half, tx + travel * half];
	doc
		.lineWidth(0.6)
		.moveTo(P(ax0), P(ay))
		.lineTo(P(ax1 - travel * 1.8), P(ay))
		.stroke();
	doc.polygon([P(ax1), P(ay)], [P(ax1 - travel * 2.2), P(ay - 1.2)], [P(ax1 - travel * 2.2), P(ay + 1.2)]).fill('black');
	doc
		.font('text')
		.fontSize(5)
		.text(...alignedAt(doc, 'tape moves this way', P(bx), P(ay + 1.6), P(bw)));
	doc.rect(P(bx), P(ay + 5), P(bw), P(4)).fill('#eef3ff');
	doc
		.fillColor('black')
		.font('bold')
		.fontSize(5.5)
		.text(...alignedAt(doc, 'WHEEL FACE: YOU', P(bx), P(ay + 5.8), P(bw)));
	doc.restore();
}
