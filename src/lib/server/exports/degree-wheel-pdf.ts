// The degree wheel as a PDF to print at actual size: one disc the hub's diameter with its centre
// hole, the tape's scale round its edge (hub.ts's sides), the way it turns, the calibration bars.
import { discFittingWords, discMarks, discPage, discRing, discSideWords } from '$lib/trade/degree-wheel';
import { faceClockwiseDeg, tdcSideOf } from '$lib/trade/hub';
import { markName, tapeMarks, type TapeSpec } from '$lib/trade/tape';
import { formatLength, type Units } from '$lib/trade/units';
import { calibrationBars, finish, mm, newDocument, papers, printable, printNote } from './pdf-kit';
import { keyOf, Recent } from './recent';

const recent = new Recent<Promise<Buffer>>(16);

export function degreeWheelPdf(spec: TapeSpec, shaftMm: number, units: Units, paper: keyof typeof papers): Promise<Buffer> {
	const key = keyOf([spec, shaftMm, units, paper]);
	let made = recent.get(key);
	if (!made) {
		made = recent.set(key, drawDisc(spec, shaftMm, units, paper));
		made.catch(() => recent.delete(key));
	}
	return made;
}

async function drawDisc(spec: TapeSpec, shaftMm: number, units: Units, paper: keyof typeof papers): Promise<Buffer> {
	const size = papers[paper];
	const { marginMm: margin, headerMm: header, footerMm: footer } = discPage;
	const R = spec.hubDiameterMm / 2;
	const doc = newDocument(`Degree wheel, ${formatLength(spec.hubDiameterMm, units)} hub`, size);
	const width = mm(size.widthMm - 2 * margin);

	doc
		.font('bold')
		.fontSize(11)
		.fillColor('black')
		.text(
			`Degree wheel: ${formatLength(spec.hubDiameterMm, units)} disc, ${shaftMm > 0 ? `${formatLength(shaftMm, units)} centre hole` : 'centre mark'}`,
			mm(margin),
			mm(margin),
			{ width }
		);
	doc
		.font('text')
		.fontSize(7)
		.text(printNote, mm(margin), doc.y + 2, { width });
	doc.text(`${discFittingWords} ${discSideWords(spec.rotation)}`, mm(margin), doc.y + 2, { width });
	doc.text(
		'Engine off and ignition off while fitting the disc. Rotating pulleys and belts: keep hands, hair and leads clear. Verify timing with a timing light before load; defer to the ECU maker’s instructions.',
		mm(margin),
		doc.y + 2,
		{ width }
	);

	// The disc in the room between header and footer, its centre (cx, cy) in mm from the page's top left.
	const room = size.heightMm - 2 * margin - header - footer;
	const cx = size.widthMm / 2;
	const cy = margin + header + room / 2;
	const at = (clockwiseDeg: number, r: number): [number, number] => {
		const a = (clockwiseDeg * Math.PI) / 180;
		return [mm(cx + r * Math.sin(a)), mm(cy - r * Math.cos(a))];
	};
	doc.save().lineWidth(0.4).dash(2, { space: 1.5 }).strokeColor('#888').circle(mm(cx), mm(cy), mm(R)).stroke();
	if (shaftMm > 0) doc.circle(mm(cx), mm(cy), mm(shaftMm / 2)).stroke();
	doc.undash().restore();
	doc
		.save()
		.lineWidth(0.3)
		.strokeColor('black')
		.moveTo(mm(cx - 2), mm(cy))
		.lineTo(mm(cx + 2), mm(cy))
		.moveTo(mm(cx), mm(cy - 2))
		.lineTo(mm(cx), mm(cy + 2))
		.stroke()
		.restore();

	const side = (atdc: number) => tdcSideOf(atdc) ?? 'TDC';
	for (const t of discMarks(spec)) {
		const length = t.size === 'major' ? discRing.majorMm : t.size === 'mid' ? discRing.midMm : discRing.minorMm;
		doc
			.lineWidth(t.atdcDeg === 0 ? 0.8 : 0.25)
			.strokeColor('black')
			.moveTo(...at(t.clockwiseDeg, R))
			.lineTo(...at(t.clockwiseDeg, R - length))
			.stroke();
		if (!t.label) continue;
		// Upright, centred on the mark's ray: read from where you stand whatever the pointer's place.
		doc.font('mono').fontSize(7).fillColor('black');
		const [nx, ny] = at(t.clockwiseDeg, R - discRing.numberFromEdgeMm);
		doc.text(t.label, nx - doc.widthOfString(t.label) / 2, ny - doc.currentLineHeight() / 2, { lineBreak: false });
		const word = side(t.atdcDeg);
		doc.font(t.atdcDeg === 0 ? 'bold' : 'text').fontSize(4.5);
		const [sx, sy] = at(t.clockwiseDeg, R - discRing.sideFromEdgeMm);
		doc.text(word, sx - doc.widthOfString(word) / 2, sy - doc.currentLineHeight() / 2, { lineBreak: false });
	}

	// Spec timings (brown) and other cylinders' TDC (blue), inside the ring, named beside their line.
	for (const m of tapeMarks(spec)) {
		if (!m.onTape) continue;
		const a = faceClockwiseDeg(spec.rotation, m.atdcDeg);
		const color = m.kind === 'timing' ? '#8a5200' : '#1d47b0';
		const inner = R - discRing.widthMm;
		doc
			.save()
			.lineWidth(0.6)
			.strokeColor(color)
			.moveTo(...at(a, R - discRing.majorMm))
			.lineTo(...at(a, inner))
			.stroke()
			.restore();
		const name = printable(markName(m)).text;
		doc.font('text').fontSize(5).fillColor(color);
		// Far enough in along the ray that the upright name's box clears the ring, at any angle.
		const rad = (a * Math.PI) / 180;
		const reach = (Math.abs(Math.sin(rad)) * doc.widthOfString(name) + Math.abs(Math.cos(rad)) * doc.currentLineHeight()) / 2 / mm(1);
		const [tx, ty] = at(a, inner - 1 - reach);
		doc.text(name, tx - doc.widthOfString(name) / 2, ty - doc.currentLineHeight() / 2, { lineBreak: false });
		doc.fillColor('black');
	}

	rotationArrow(doc, spec, cx, cy, R, shaftMm);
	calibrationBars(doc, margin, size.heightMm - margin - 12);
	return finish(doc);
}

/** The way the disc turns: an arc with its head inside the ring, and the words, when the hole leaves room; else the header says it alone. */
function rotationArrow(doc: PDFKit.PDFDocument, spec: TapeSpec, cx: number, cy: number, R: number, shaftMm: number) {
	const r = R - discRing.widthMm - 8;
	if (r < shaftMm / 2 + 4) return;
	const travel = spec.rotation === 'cw' ? 1 : -1;
	const pt = (clockwiseDeg: number, radius: number): [number, number] => {
		const a = (clockwiseDeg * Math.PI) / 180;
		return [mm(cx + radius * Math.sin(a)), mm(cy + -radius * Math.cos(a))];
	};
	const [from, to] = [180 - travel * 25, 180 + travel * 25];
	doc
		.save()
		.lineWidth(0.6)
		.strokeColor('black')
		.path(`M ${pt(from, r).join(' ')} A ${mm(r)} ${mm(r)} 0 0 ${travel === 1 ? 1 : 0} ${pt(to, r).join(' ')}`)
		.stroke();
	doc.polygon(pt(to + travel * 6, r), pt(to, r - 1.5), pt(to, r + 1.5)).fill('black');
	const words = `turns ${spec.rotation === 'cw' ? 'clockwise' : 'counter-clockwise'}`;
	doc.font('text').fontSize(5.5);
	const [wx, wy] = pt(180, r - 4);
	doc.text(words, wx - doc.widthOfString(words) / 2, wy - doc.currentLineHeight() / 2, { lineBreak: false });
	doc.restore();
}
