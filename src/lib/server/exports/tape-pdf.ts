// The degree tape as a PDF to print at actual size: strips stacked on the page, tiled over pages
// with overlap and join marks when the hub is large, calibration bars on every page.
import { mmPerDegree, tapePage, tapeStrips, tapeWarnings, tapeX, ticks, type TapeSpec } from '$lib/trade/tape';
import { formatLength, type Units } from '$lib/trade/units';
import { calibrationBars, finish, mm, newDocument, papers, printable, printNote } from './pdf-kit';
import { keyOf, Recent } from './recent';

const { marginMm: margin, headerMm: header, footerMm: footer, stripHeightMm: stripHeight, rowGapMm: rowGap, overlapMm } = tapePage;

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

async function drawTape(spec: TapeSpec, units: Units, paper: keyof typeof papers): Promise<Buffer> {
	const size = papers[paper];
	const k = mmPerDegree(spec);
	const strips = tapeStrips(spec, paper);
	const pages = strips.at(-1)!.page;
	const all = ticks(spec);
	const doc = newDocument(`Degree tape, ${formatLength(spec.hubDiameterMm, units)} hub`, size);
	const side = (atdc: number) => (Math.abs(atdc) < 1e-9 ? 'TDC' : atdc < 0 ? 'BTDC' : 'ATDC');
	const direction = spec.rotation === 'cw' ? 'left to right' : 'right to left';

	for (let page = 1; page <= pages; page++) {
		if (page > 1) doc.addPage({ size: [mm(size.widthMm), mm(size.heightMm)], margin: 0 });
		doc.font('bold').fontSize(11).fillColor('black').text(`Degree tape: ${formatLength(spec.hubDiameterMm, units)} hub, ${(units === 'in' ? k / 25.4 : k).toFixed(4)} ${units} per degree`, mm(margin), mm(margin), { lineBreak: false });
		doc.font('text').fontSize(7.5).text(printNote, mm(margin), mm(margin + 6), { lineBreak: false });
		doc.text(`Crank turns ${spec.rotation === 'cw' ? 'clockwise' : 'counter-clockwise'} seen from the tape side: the tape passes the pointer ${direction}, so BTDC comes first. Page ${page} of ${pages}; cut along the dashed lines and join the strips in order.`, mm(margin), mm(margin + 10), { width: mm(size.widthMm - 2 * margin) });
		tapeWarnings(spec).forEach((w, i) => doc.fillColor('#8a5200').text(w, mm(margin), mm(margin + 17 + i * 3.5), { lineBreak: false }));

		strips.filter((s) => s.page === page).forEach((strip, row) => {
			const top = margin + header + row * (stripHeight + rowGap);
			const width = strip.toMm - strip.fromMm;
			const x = (tapeMm: number) => mm(margin + tapeMm - strip.fromMm);
			doc.save().lineWidth(0.3).dash(2, { space: 1.5 }).strokeColor('#888').rect(mm(margin), mm(top), mm(width), mm(stripHeight)).stroke().undash().restore();
			if (strip.index > 1) {
				// The overlap: glue the previous strip's end over it, lining up the join marks.
				doc.save().fillColor('#eeeeee').rect(mm(margin), mm(top), mm(overlapMm), mm(stripHeight)).fill().restore();
				doc.font('text').fontSize(5).fillColor('#555').text(`glue strip ${strip.index - 1} here`, mm(margin + 0.5), mm(top + stripHeight - 4), { width: mm(overlapMm - 1), lineBreak: false });
				doc.save().fillColor('black').polygon([x(strip.fromMm + overlapMm), mm(top + stripHeight)], [x(strip.fromMm + overlapMm) - mm(1.2), mm(top + stripHeight + 2)], [x(strip.fromMm + overlapMm) + mm(1.2), mm(top + stripHeight + 2)]).fill().restore();
			}
			if (strip.index < strips.length) {
				const joinAt = x(strip.toMm - overlapMm);
				doc.save().fillColor('black').polygon([joinAt, mm(top + stripHeight)], [joinAt - mm(1.2), mm(top + stripHeight + 2)], [joinAt + mm(1.2), mm(top + stripHeight + 2)]).fill().restore();
			}
			doc.font('text').fontSize(5.5).fillColor('#555').text(`strip ${strip.index} of ${strips.length}`, mm(margin), mm(top + stripHeight + 2.5), { lineBreak: false });

			doc.lineWidth(0.25).strokeColor('black').fillColor('black').font('mono').fontSize(7);
			for (const t of all) {
				if (t.xMm < strip.fromMm - 1e-9 || t.xMm > strip.toMm + 1e-9) continue;
				const length = t.size === 'major' ? 9 : t.size === 'mid' ? 6 : 3.5;
				doc.moveTo(x(t.xMm), mm(top)).lineTo(x(t.xMm), mm(top + length)).stroke();
				if (t.label) {
					const w = doc.widthOfString(t.label);
					// Only whole labels: a label cut by the strip's end would be read wrongly.
					if (x(t.xMm) - w / 2 < mm(margin) || x(t.xMm) + w / 2 > mm(margin + width)) continue;
					doc.text(t.label, x(t.xMm) - w / 2, mm(top + 10), { lineBreak: false });
					doc.font(t.atdcDeg === 0 ? 'bold' : 'text').fontSize(4.5).text(side(t.atdcDeg), x(t.xMm) - mm(2.5), mm(top + 14), { width: mm(5), align: 'center', lineBreak: false });
					doc.font('mono').fontSize(7);
				}
			}
			const marks = [
				...spec.timingMarks.map((m) => ({ at: -m.btdcDeg, label: m.label, color: '#8a5200' })),
				...spec.otherTdc.map((m) => ({ at: m.atdcDeg > 180 ? m.atdcDeg - 360 : m.atdcDeg, label: m.label, color: '#1d47b0' }))
			];
			for (const m of marks) {
				if (Math.abs(m.at) > spec.windowDeg) continue;
				const at = tapeX(spec, m.at);
				if (at < strip.fromMm || at > strip.toMm) continue;
				doc.save().lineWidth(0.6).strokeColor(m.color).moveTo(x(at), mm(top + 16.5)).lineTo(x(at), mm(top + stripHeight)).stroke().restore();
				// A mark's own name: a character the font lacks shows as "?" rather than vanishing (pdf-kit.ts).
				doc.font('text').fontSize(5.5).fillColor(m.color).text(printable(m.label).text, x(at) + mm(0.8), mm(top + 18), { lineBreak: false });
				doc.fillColor('black');
			}
		});
		doc.font('text').fontSize(6.5).fillColor('black').text('Engine off and ignition off while fitting the tape. Verify timing with a timing light before load; keep hands and leads clear of the pulley.', mm(margin), mm(size.heightMm - margin - footer + 2), { width: mm(size.widthMm - 2 * margin) });
		calibrationBars(doc, margin, size.heightMm - margin - 12);
	}
	return finish(doc);
}
