// The 1:1 wheel template: outline, centre cross, spec table, calibration bars, "print at actual size".
import { contourPath, outlinesPath, segmentsPath } from '$lib/trade/svg';
import type { WheelSummary } from '$lib/trade/summary';
import { formatLength, type Units } from '$lib/trade/units';
import { cutContours, drawWheel, type WheelSpec } from '$lib/trade/wheel';
import { calibrationBars, finish, mm, newDocument, papers, printNote } from './pdf-kit';

const margin = 12;
const tableHeight = 95;

export function specRows(spec: WheelSpec, summary: WheelSummary, units: Units): [string, string][] {
	const L = (v: number) => formatLength(v, units);
	return [
		['Pattern', `${summary.pattern}, ${summary.teethPresent} teeth, pitch ${summary.pitchDeg}°`],
		['Outside / root diameter', `${L(spec.odMm)} / ${L(summary.rootDiameterMm)}`],
		['Tooth depth, width', `${L(spec.depthMm)}, ${summary.toothWidthDeg}° (duty ${spec.duty})`],
		['Corner radius tip / root', `${L(spec.tipRadiusMm)} / ${L(spec.rootRadiusMm)}`],
		['Bore', spec.boreMm > 0 ? L(spec.boreMm) : 'none'],
		['Keyway', spec.keyway ? `${L(spec.keyway.widthMm)} wide, ${L(spec.keyway.depthMm)} deep at ${spec.keywayDeg}° (${spec.keyway.source})` : 'none'],
		['Bolt holes', spec.bolts ? `${spec.bolts.count} x ${L(spec.bolts.holeMm)} on ${L(spec.bolts.pcdMm)} PCD from ${spec.bolts.clockDeg}°` : 'none'],
		['Balance holes', spec.balanceHoles ? `${spec.balanceHoles.count} x ${L(spec.balanceHoles.holeMm)} on ${L(spec.balanceHoles.pcdMm)} PCD from ${spec.balanceHoles.clockDeg.toFixed(1)}°` : 'none'],
		['Material, thickness', `${spec.materialLabel}, ${L(spec.thicknessMm)}`],
		['Mass', `${summary.massG.toFixed(1)} g`],
		['Static unbalance', `${summary.unbalance.gmm.toFixed(1)} g·mm (ISO 21940-11 G ${summary.permissible.grade} at ${summary.unbalance.rpm} rpm allows ${summary.permissible.gmm.toFixed(1)} g·mm)`],
		['Rotation (seen from this face)', spec.rotation === 'cw' ? 'clockwise' : 'counter-clockwise'],
		['Layers', 'cut: red outline; etch: blue index mark at the first tooth after the gap' + (spec.label ? ' and label' : '')]
	];
}

export async function wheelPdf(spec: WheelSpec, summary: WheelSummary, units: Units, paper: keyof typeof papers): Promise<Buffer> {
	const d = drawWheel(spec);
	const chosen = papers[paper];
	const needW = spec.odMm + 2 * margin;
	const needH = spec.odMm + 2 * margin + tableHeight + 30;
	const fits = needW <= chosen.widthMm && needH <= chosen.heightMm;
	const size = fits ? chosen : { widthMm: Math.max(needW, chosen.widthMm), heightMm: Math.max(needH, chosen.heightMm) };
	const doc = newDocument(`Trigger wheel ${summary.pattern}, ${formatLength(spec.odMm, units)}`, size);

	doc.font('bold').fontSize(13).text(`Trigger wheel ${summary.pattern}, ${formatLength(spec.odMm, units)}: 1:1 template`, mm(margin), mm(margin));
	doc.font('text').fontSize(8.5).text(printNote, mm(margin), mm(margin + 7));
	if (!fits) doc.text(`Larger than ${paper === 'a4' ? 'A4' : 'Letter'}: print on a plotter at 100%, or send the DXF.`, mm(margin), mm(margin + 11));

	// The wheel at 1:1: the SVG path data is already y-down, like PDF's page space under pdfkit.
	const cx = size.widthMm / 2;
	const cy = margin + 18 + spec.odMm / 2;
	doc.save().translate(mm(cx), mm(cy)).scale(mm(1));
	doc.lineWidth(0.25).strokeColor('black');
	for (const c of cutContours(d)) doc.path(contourPath(c)).stroke();
	doc.strokeColor('#1d47b0');
	if (d.etch.length) doc.path(segmentsPath(d.etch)).stroke();
	// The etched label at 1:1, filled as it reads once etched (its outlines are the DXF's).
	if (d.label) doc.path(outlinesPath(d.label.outlines)).fill('#1d47b0');
	// Centre cross, to line the template up on the blank.
	const arm = Math.min(8, spec.odMm * 0.08);
	doc.lineWidth(0.15).strokeColor('#555').moveTo(-arm, 0).lineTo(arm, 0).moveTo(0, -arm).lineTo(0, arm).stroke();
	doc.restore();

	let y = cy + spec.odMm / 2 + 8;
	doc.font('bold').fontSize(9).fillColor('black').text('Specification', mm(margin), mm(y));
	y += 5;
	for (const [k, v] of specRows(spec, summary, units)) {
		doc.font('text').fontSize(7.5).text(k, mm(margin), mm(y), { width: mm(45) });
		doc.font('mono').fontSize(7.5).text(v, mm(margin + 47), mm(y), { width: mm(size.widthMm - 2 * margin - 47) });
		y += 4.6;
	}
	if (summary.warnings.length) {
		y += 2;
		doc.font('bold').fontSize(8).fillColor('#8a5200').text('Warnings', mm(margin), mm(y));
		y += 4;
		for (const w of summary.warnings) {
			doc.font('text').fontSize(7).text(`• ${w.message}`, mm(margin), mm(y), { width: mm(size.widthMm - 2 * margin) });
			y += 7;
		}
	}
	doc.font('text').fontSize(7).fillColor('black').text('Cut parts have sharp edges: deburr them. A missing-tooth wheel is out of balance by design; check it before running at speed.', mm(margin), mm(size.heightMm - margin - 24), { width: mm(size.widthMm - 2 * margin) });
	calibrationBars(doc, margin, size.heightMm - margin - 12);
	return finish(doc);
}
