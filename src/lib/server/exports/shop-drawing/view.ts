// The wheel's view on the shop drawing: the outline from the same contours the DXF writes, drawn at
// the drawing's scale, with centre lines, pitch circles and the dimensions a fabricator measures.
// Page coordinates are millimetres, y down (pdfkit's page space scaled by mm()).
import { contourPath, outlinesPath, segmentsPath } from '$lib/trade/svg';
import { gapPositions } from '$lib/trade/shop-drawing';
import type { Units } from '$lib/trade/units';
import { cutContours, drawDeg, drawWheel, holeCenters, rootRadius, type WheelSpec } from '$lib/trade/wheel';
import { mm } from '../pdf-kit';
import { boreText, dim, holesText, keywayText } from './notes';

/** ISO 128 line widths, mm: thick for visible edges, thin for centre, dimension and leader lines. */
const thick = 0.35;
const thin = 0.18;
const textSize = 6.5;
const arrowMm = 2.5;

/** The room the dimensions take round the wheel: above and below it, and beside it for the leaders' words. */
export const dimensionRoom = { verticalMm: 14, sideMm: 40 };

type P = { x: number; y: number };

export interface View {
	doc: PDFKit.PDFDocument;
	spec: WheelSpec;
	units: Units;
	/** Paper mm per part mm. */
	scale: number;
	centre: P;
}

/** A drawing angle (degrees counter-clockwise from +x, y up) to a page point `r` mm from the centre. */
const at = (v: View, r: number, a: number): P => ({
	x: v.centre.x + r * Math.cos((a * Math.PI) / 180),
	y: v.centre.y - r * Math.sin((a * Math.PI) / 180)
});

function arrow(doc: PDFKit.PDFDocument, tip: P, from: P) {
	const len = Math.hypot(tip.x - from.x, tip.y - from.y) || 1;
	const [ux, uy] = [(tip.x - from.x) / len, (tip.y - from.y) / len];
	const base = { x: tip.x - ux * arrowMm, y: tip.y - uy * arrowMm };
	doc
		.moveTo(mm(tip.x), mm(tip.y))
		.lineTo(mm(base.x - uy * 0.45), mm(base.y + ux * 0.45))
		.lineTo(mm(base.x + uy * 0.45), mm(base.y - ux * 0.45))
		.closePath()
		.fill('black');
}

/** Lines of words centred on y as a block, each aligned to x. */
function text(doc: PDFKit.PDFDocument, words: string | string[], x: number, y: number, align: 'left' | 'right' | 'center') {
	doc.font('mono').fontSize(textSize).fillColor('black');
	const lines = typeof words === 'string' ? [words] : words;
	const lh = doc.currentLineHeight(true);
	lines.forEach((line, i) => {
		const w = doc.widthOfString(line) / mm(1);
		const left = align === 'left' ? x : align === 'right' ? x - w : x - w / 2;
		doc.text(line, mm(left), mm(y) - (lines.length * lh) / 2 + i * lh, { lineBreak: false });
	});
}

/** A diameter dimension across the view, `offsetMm` above (negative) or below the centre, with its extension lines from y = centre. */
function diameter(v: View, radiusMm: number, offsetMm: number, words: string) {
	const { doc } = v;
	const r = radiusMm * v.scale;
	const y = v.centre.y + offsetMm;
	const a = { x: v.centre.x - r, y };
	const b = { x: v.centre.x + r, y };
	const overshoot = Math.sign(offsetMm) * 1.5;
	doc.lineWidth(mm(thin)).strokeColor('black');
	for (const x of [a.x, b.x])
		doc
			.moveTo(mm(x), mm(v.centre.y + Math.sign(offsetMm) * 1))
			.lineTo(mm(x), mm(y + overshoot))
			.stroke();
	doc.moveTo(mm(a.x), mm(y)).lineTo(mm(b.x), mm(y)).stroke();
	arrow(doc, a, b);
	arrow(doc, b, a);
	text(doc, words, v.centre.x, y - 2.2, 'center');
}

/** A leader from a feature to its words outside the wheel, along the drawing angle `a`. */
function leader(v: View, from: P, a: number, words: string[]) {
	const { doc } = v;
	const R = (v.spec.odMm / 2) * v.scale;
	const elbow = at(v, R + 6, a);
	const right = Math.cos((a * Math.PI) / 180) >= 0;
	// The words start clear of the diameters' extension lines (at the wheel's sides), however steep the leader.
	const end = { x: right ? Math.max(elbow.x + 4, v.centre.x + R + 3) : Math.min(elbow.x - 4, v.centre.x - R - 3), y: elbow.y };
	doc.lineWidth(mm(thin)).strokeColor('black');
	doc.moveTo(mm(elbow.x), mm(elbow.y)).lineTo(mm(end.x), mm(end.y)).stroke();
	doc.moveTo(mm(from.x), mm(from.y)).lineTo(mm(elbow.x), mm(elbow.y)).stroke();
	arrow(doc, from, elbow);
	text(doc, words, end.x + (right ? 1 : -1), end.y, right ? 'left' : 'right');
}

/** Words split at `at` into two lines (the second keeps the separator's words, less a leading comma). */
function twoLines(words: string, at: string): string[] {
	const i = words.indexOf(at);
	return i < 0 ? [words] : [words.slice(0, i), words.slice(i).replace(/^, /, '').trim()];
}

/** A thin chain line (centre lines, pitch circles): long dash, gap, short dash, gap (ISO 128). */
function chain(doc: PDFKit.PDFDocument) {
	doc
		.lineWidth(mm(thin))
		.strokeColor('#333')
		.dash(mm(6), { space: mm(1.5) });
}

/**
 * Angles the leaders take, kept 25° from each other and away from straight up and down (where the
 * diameter dimensions sit), so that no two sets of words land on each other.
 */
function spread(wanted: number[]): number[] {
	const taken: number[] = [];
	const clash = (a: number) =>
		taken.some((t) => Math.abs(((a - t + 540) % 360) - 180) < 25) || Math.abs(Math.sin((a * Math.PI) / 180)) > 0.82;
	return wanted.map((w) => {
		let a = w;
		for (let i = 0; i < 14 && clash(a); i++) a = w + (i % 2 ? -1 : 1) * 13 * Math.ceil((i + 1) / 2);
		taken.push(a);
		return a;
	});
}

export function drawView(v: View) {
	const { doc, spec, units } = v;
	const d = drawWheel(spec);
	const R = (spec.odMm / 2) * v.scale;

	// The outline and holes from the DXF's own contours, scaled about the centre.
	doc.save().translate(mm(v.centre.x), mm(v.centre.y)).scale(mm(v.scale));
	doc.lineWidth(thick / v.scale).strokeColor('black');
	for (const c of cutContours(d)) doc.path(contourPath(c)).stroke();
	doc.lineWidth(thin / v.scale).strokeColor('#1d47b0');
	if (d.etch.length) doc.path(segmentsPath(d.etch)).stroke();
	if (d.label) doc.path(outlinesPath(d.label.outlines)).fill('#1d47b0');
	doc.restore();

	// Centre lines, the keyway's and each gap's centre line, the hole circles.
	doc.save();
	chain(doc);
	const cross = R + 3;
	doc
		.moveTo(mm(v.centre.x - cross), mm(v.centre.y))
		.lineTo(mm(v.centre.x + cross), mm(v.centre.y))
		.moveTo(mm(v.centre.x), mm(v.centre.y - cross))
		.lineTo(mm(v.centre.x), mm(v.centre.y + cross))
		.stroke();
	const radial = (a: number) => {
		const p = at(v, R + 5, a);
		doc.moveTo(mm(v.centre.x), mm(v.centre.y)).lineTo(mm(p.x), mm(p.y)).stroke();
	};
	if (spec.keyway) radial(drawDeg(spec, spec.keywayDeg));
	const gaps = gapPositions(spec);
	for (const g of gaps) radial(g.drawDeg);
	for (const h of [spec.bolts, spec.balanceHoles])
		if (h && h.count > 0) doc.circle(mm(v.centre.x), mm(v.centre.y), mm((h.pcdMm / 2) * v.scale)).stroke();
	doc.undash();
	doc.restore();

	// The diameters over and under the view.
	diameter(v, spec.odMm / 2, -(R + 8), `Ø${dim(spec.odMm, units)}`);
	diameter(v, rootRadius(spec), R + 8, `Ø${dim(2 * rootRadius(spec), units)} root`);

	// Leaders to the bore, the keyway, each hole circle's first hole and each gap.
	const keyDeg = spec.keyway ? drawDeg(spec, spec.keywayDeg) : 90;
	const leaders: { from: P; a: number; words: string[] }[] = [];
	// Leader words go on two short lines each, so that they fit beside a 1:1 wheel on A4.
	const bore = boreText(spec, units);
	if (bore) leaders.push({ a: keyDeg + 135, from: at(v, (spec.boreMm / 2) * v.scale, keyDeg + 135), words: twoLines(bore, ' (') });
	const key = keywayText(spec, units);
	if (key && spec.keyway)
		leaders.push({ a: keyDeg, from: at(v, (spec.boreMm / 2 + spec.keyway.depthMm) * v.scale, keyDeg), words: twoLines(key, ', ') });
	for (const h of [spec.bolts, spec.balanceHoles]) {
		const text = holesText(h, units);
		if (!h || !text) continue;
		const words = twoLines(text, ' on ');
		const c = holeCenters(spec, h)[0]!;
		const a = (Math.atan2(c.y, c.x) * 180) / Math.PI;
		leaders.push({ a, from: at(v, Math.hypot(c.x, c.y) * v.scale + (h.holeMm / 2) * v.scale, a), words });
	}
	for (const [i, g] of gaps.entries())
		leaders.push({
			a: g.drawDeg,
			from: at(v, R, g.drawDeg),
			words: g.fromKeyway
				? [
						`Gap ${i + 1} centre`,
						`${Number(g.fromKeyway.deg.toFixed(2))}° ${g.fromKeyway.sense === 'clockwise' ? 'CW' : 'CCW'} from keyway`
					]
				: [`Gap ${i + 1} centre`]
		});
	const angles = spread(leaders.map((l) => l.a));
	// A leader whose angle moved starts at its feature still: it only leaves at another angle.
	leaders.forEach((l, i) => leader(v, l.from, angles[i]!, l.words));
}
