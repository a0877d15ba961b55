// The 1:1 wheel template: outline, centre cross, spec table, calibration bars, "print at actual size".
// Every line of text is measured and placed before it is drawn, so nothing prints over anything
// else whatever the input: a table longer than the page's room goes on over further pages, each
// with the caution and the calibration bars at its foot.
import type { WheelSummary } from '$lib/trade/summary';
import { missingPositions } from '$lib/trade/pattern';
import { formatLength, norm360, type Units } from '$lib/trade/units';
import { cutContours, drawWheel, indexMark, type WheelSpec } from '$lib/trade/wheel';
import { contourOps, outlinesOps, segmentsOps } from './pdf-path';
import { addPageMm, calibrationBars, finish, lineHeight, mm, newDocument, papers, printNote, wrapLines } from './pdf-kit';

export function specRows(spec: WheelSpec, summary: WheelSummary, units: Units): [string, string][] {
	const L = (v: number) => formatLength(v, units);
	return [
		['Pattern', `${summary.pattern}, ${summary.teethPresent} teeth, pitch ${summary.pitchDeg}°`],
		['Outside / root diameter', `${L(spec.odMm)} / ${L(summary.rootDiameterMm)}`],
		['Tooth depth, width', `${L(spec.depthMm)}, ${summary.toothWidthDeg}° (duty ${spec.duty})`],
		['Corner radius tip / root', `${L(spec.tipRadiusMm)} / ${L(spec.rootRadiusMm)}`],
		['Bore', spec.boreMm > 0 ? L(spec.boreMm) : 'none'],
		[
			'Keyway',
			spec.keyway ? `${L(spec.keyway.widthMm)} wide, ${L(spec.keyway.depthMm)} deep at ${spec.keywayDeg}° (${spec.keyway.source})` : 'none'
		],
		[
			'Bolt holes',
			spec.bolts ? `${spec.bolts.count} x ${L(spec.bolts.holeMm)} on ${L(spec.bolts.pcdMm)} PCD from ${spec.bolts.clockDeg}°` : 'none'
		],
		[
			'Balance holes',
			spec.balanceHoles
				? `${spec.balanceHoles.count} x ${L(spec.balanceHoles.holeMm)} on ${L(spec.balanceHoles.pcdMm)} PCD from ${spec.balanceHoles.clockDeg.toFixed(1)}°`
				: 'none'
		],
		['Material, thickness', `${spec.materialLabel}, ${L(spec.thicknessMm)}`],
		['Mass', `${summary.massG.toFixed(1)} g`],
		[
			'Static unbalance',
			`${summary.unbalance.gmm.toFixed(1)} g·mm (ISO 21940-11 G ${summary.permissible.grade} at ${summary.unbalance.rpm} rpm allows ${summary.permissible.gmm.toFixed(1)} g·mm)`
		],
		['Rotation (seen from this face)', spec.rotation === 'cw' ? 'clockwise' : 'counter-clockwise'],
		['Label', spec.label ? `"${spec.label}"` : 'none'],
		['Layers', layersRow(spec)]
	];
}

/** Where the etched index mark sits, in words a fabricator and a tuner read the same way. */
export function markWords(spec: WheelSpec): string | null {
	if (spec.indexMarkDeg === null || !indexMark(spec)) return null;
	const p = spec.pattern;
	const gone = new Set(missingPositions(p));
	// Wheel angles run from position 0's leading edge in the sense of rotation (pattern.ts).
	const from =
		p.kind === 'single'
			? "the tooth's leading edge"
			: !gone.has(0) && gone.has(p.teeth - 1)
				? 'the leading edge of the first tooth after the gap'
				: `the leading edge of tooth position 0${gone.has(0) ? ' (a missing position)' : ''}`;
	const a = norm360(spec.indexMarkDeg);
	const off = a <= 180 ? a : 360 - a;
	if (off < 0.005) return `index mark at ${from}`;
	const degrees = `${Number(off.toFixed(2))}°`;
	return a <= 180
		? `index mark ${degrees} after ${from} (it passes a fixed point ${degrees} of rotation later)`
		: `index mark ${degrees} before ${from} (it passes a fixed point ${degrees} of rotation earlier)`;
}

function layersRow(spec: WheelSpec): string {
	const etch = [markWords(spec), spec.label ? 'label' : null].filter((w) => w !== null);
	return `cut: red outline; ${etch.length ? `etch: blue ${etch.join('; ')}` : 'nothing etched'}`;
}

const margin = 12;
const gapMm = 1.2;
/** The key column's width and where the value column starts, mm from the margin. */
const keyMm = 45;
const valueAtMm = 47;
const caution =
	'Cut parts have sharp edges: deburr them. A missing-tooth wheel is out of balance by design; check it before running at speed.';

type Size = { widthMm: number; heightMm: number };
type Font = { font: 'text' | 'bold' | 'mono'; size: number };
const title: Font = { font: 'bold', size: 13 };
const note: Font = { font: 'text', size: 8.5 };
const heading: Font = { font: 'bold', size: 9 };
const key: Font = { font: 'text', size: 7.5 };
const value: Font = { font: 'mono', size: 7.5 };
const small: Font = { font: 'text', size: 7 };
const warningHeading: Font = { font: 'bold', size: 8 };

/** Lines of text, each set at its own position: everything this template writes, laid out before it is drawn. */
class Flow {
	y = margin;
	constructor(
		private doc: PDFKit.PDFDocument,
		private size: Size,
		private newPage: () => void
	) {}
	use(f: Font) {
		return this.doc.font(f.font).fontSize(f.size);
	}
	lines(f: Font, text: string, widthMm: number) {
		this.use(f);
		return wrapLines(this.doc, text, mm(widthMm));
	}
	lineMm(f: Font) {
		return lineHeight(this.use(f)) / mm(1);
	}
	/** The lowest y text may reach on this page: the footer's caution and bars sit below. */
	get bottom() {
		return footerTop(this.doc, this.size);
	}
	/** Room for `needMm` more, or a fresh page. */
	room(needMm: number, continued: string) {
		if (this.y + needMm <= this.bottom) return;
		this.newPage();
		this.y = margin;
		this.write(heading, continued, this.size.widthMm - 2 * margin);
		this.y += 1;
	}
	write(f: Font, text: string, widthMm: number, color = 'black') {
		const lh = this.lineMm(f);
		for (const line of this.lines(f, text, widthMm)) {
			this.use(f).fillColor(color).text(line, mm(margin), mm(this.y), { lineBreak: false });
			this.y += lh;
		}
	}
}

/** Where the footer starts: the caution, wrapped, then the calibration bars 12 mm above the bottom margin. */
function footerTop(doc: PDFKit.PDFDocument, size: Size) {
	doc.font(small.font).fontSize(small.size);
	const n = wrapLines(doc, caution, mm(size.widthMm - 2 * margin)).length;
	return barsAt(size) - 4 - (n * lineHeight(doc)) / mm(1) - 2;
}
const barsAt = (size: Size) => size.heightMm - margin - 12;

function footer(doc: PDFKit.PDFDocument, size: Size) {
	doc.font(small.font).fontSize(small.size).fillColor('black');
	const lh = lineHeight(doc);
	let y = mm(footerTop(doc, size) + 2);
	for (const line of wrapLines(doc, caution, mm(size.widthMm - 2 * margin))) {
		doc.text(line, mm(margin), y, { lineBreak: false });
		y += lh;
	}
	calibrationBars(doc, margin, barsAt(size));
}

export async function wheelPdf(spec: WheelSpec, summary: WheelSummary, units: Units, paper: keyof typeof papers): Promise<Buffer> {
	const d = drawWheel(spec);
	const chosen = papers[paper];
	const od = formatLength(spec.odMm, units);
	// The full pattern name can list hundreds of gap positions: the title keeps the short name.
	const heading1 = `Trigger wheel ${summary.pattern.split(' (')[0]}, ${od}: 1:1 template`;
	const larger = `Larger than ${paper === 'a4' ? 'A4' : 'Letter'}: print on a plotter at 100%, or send the DXF.`;
	const doc = newDocument(`Trigger wheel ${summary.pattern}, ${od}`, null);

	// The page: the chosen paper when the header, the wheel at 1:1, the start of the table and the
	// footer fit on it; else as large as they need (for a plotter), the rest of the table flowing on.
	const widthMm = Math.max(chosen.widthMm, spec.odMm + 2 * margin);
	const probe = new Flow(doc, { widthMm, heightMm: chosen.heightMm }, () => {});
	const textMm = widthMm - 2 * margin;
	const headerMm = (fits: boolean) =>
		probe.lines(title, heading1, textMm).length * probe.lineMm(title) +
		0.5 +
		(probe.lines(note, printNote, textMm).length + (fits ? 0 : probe.lines(note, larger, textMm).length)) * probe.lineMm(note);
	const firstRowsMm = probe.lineMm(heading) + 1 + 3 * (probe.lineMm(value) + gapMm);
	const footerMm = (h: number) => h - footerTop(doc, { widthMm, heightMm: h });
	const needMm = (fits: boolean) => margin + headerMm(fits) + 4 + spec.odMm + 6 + firstRowsMm + footerMm(chosen.heightMm);
	const fits = widthMm === chosen.widthMm && needMm(true) <= chosen.heightMm;
	const size: Size = fits ? chosen : { widthMm, heightMm: Math.max(chosen.heightMm, needMm(false)) };

	const newPage = () => {
		addPageMm(doc, size);
		footer(doc, size);
	};
	newPage();
	const flow = new Flow(doc, size, newPage);
	flow.write(title, heading1, textMm);
	flow.y += 0.5;
	flow.write(note, printNote, textMm);
	if (!fits) flow.write(note, larger, textMm);
	flow.y += 4;

	// The wheel at 1:1, in mm, y-down like PDF's page space under pdfkit (pdf-path.ts).
	const cx = size.widthMm / 2;
	const cy = flow.y + spec.odMm / 2;
	doc.save().translate(mm(cx), mm(cy)).scale(mm(1));
	doc.lineWidth(0.25).strokeColor('black');
	for (const c of cutContours(d)) doc.addContent(contourOps(c)).stroke();
	doc.strokeColor('#1d47b0');
	if (d.etch.length) doc.addContent(segmentsOps(d.etch)).stroke();
	// The etched label at 1:1, filled as it reads once etched (its outlines are the DXF's).
	if (d.label) doc.addContent(outlinesOps(d.label.outlines)).fill('#1d47b0');
	// Centre cross, to line the template up on the blank.
	const arm = Math.min(8, spec.odMm * 0.08);
	doc.lineWidth(0.15).strokeColor('#555').moveTo(-arm, 0).lineTo(arm, 0).moveTo(0, -arm).lineTo(0, arm).stroke();
	doc.restore();
	flow.y = cy + spec.odMm / 2 + 6;

	const continued = 'Specification, continued';
	flow.room(flow.lineMm(heading) + 1 + flow.lineMm(value), continued);
	flow.write(heading, 'Specification', textMm);
	flow.y += 1;
	const valueMm = textMm - valueAtMm;
	const lh = Math.max(flow.lineMm(key), flow.lineMm(value));
	for (const [k, v] of specRows(spec, summary, units)) {
		const keyLines = flow.lines(key, k, keyMm);
		const valueLines = flow.lines(value, v, valueMm);
		const n = Math.max(keyLines.length, valueLines.length);
		// A row stays whole when a page can hold it; a longer one is split line by line.
		if (n * lh <= flow.bottom - margin) flow.room(n * lh, continued);
		for (let i = 0; i < n; i++) {
			flow.room(lh, continued);
			if (keyLines[i]) flow.use(key).fillColor('black').text(keyLines[i]!, mm(margin), mm(flow.y), { lineBreak: false });
			if (valueLines[i])
				flow
					.use(value)
					.fillColor('black')
					.text(valueLines[i]!, mm(margin + valueAtMm), mm(flow.y), { lineBreak: false });
			flow.y += lh;
		}
		flow.y += gapMm;
	}
	if (summary.warnings.length) {
		flow.y += 1.5;
		flow.room(flow.lineMm(warningHeading) + flow.lineMm(small), continued);
		flow.write(warningHeading, 'Warnings', textMm, '#8a5200');
		for (const w of summary.warnings) {
			const text = `• ${w.message}`;
			const height = flow.lines(small, text, textMm).length * flow.lineMm(small);
			if (height <= flow.bottom - margin) flow.room(height, continued);
			for (const line of flow.lines(small, text, textMm)) {
				flow.room(flow.lineMm(small), continued);
				flow.use(small).fillColor('#8a5200').text(line, mm(margin), mm(flow.y), { lineBreak: false });
				flow.y += flow.lineMm(small);
			}
			flow.y += gapMm;
		}
	}
	doc.fillColor('black');
	return finish(doc);
}
