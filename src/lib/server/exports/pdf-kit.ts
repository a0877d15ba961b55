// Shared by every printable PDF: the shipped fonts, millimetre units, the "print at actual size"
// line and the calibration bars (100 mm and 4 in) to measure after printing.
import PDFDocument from 'pdfkit';
import { fontFile, pdfFonts } from './fonts';

/** PDF user space: 1 pt = 1/72 in (ISO 32000-1). */
export const PT_PER_MM = 72 / 25.4;
export const mm = (v: number) => v * PT_PER_MM;

export { papers } from '$lib/trade/paper';

export function newDocument(title: string, size: { widthMm: number; heightMm: number }) {
	const doc = new PDFDocument({ size: [mm(size.widthMm), mm(size.heightMm)], margin: 0, info: { Title: title, Creator: 'Phasewright' }, autoFirstPage: true });
	doc.registerFont('text', fontFile(pdfFonts.text));
	doc.registerFont('bold', fontFile(pdfFonts.bold));
	doc.registerFont('mono', fontFile(pdfFonts.mono));
	doc.font('text');
	return doc;
}

export function finish(doc: PDFKit.PDFDocument): Promise<Buffer> {
	return new Promise((resolve, reject) => {
		const chunks: Buffer[] = [];
		doc.on('data', (c: Buffer) => chunks.push(c));
		doc.on('end', () => resolve(Buffer.concat(chunks)));
		doc.on('error', reject);
		doc.end();
	});
}

export const printNote = 'Print at 100% / actual size (no "fit to page"). Measure both bars before you use this print.';

/** A 100 mm bar with millimetre ticks and a 4 in bar with quarter-inch ticks, starting at (x, y) mm. */
export function calibrationBars(doc: PDFKit.PDFDocument, xMm: number, yMm: number) {
	doc.save().lineWidth(0.5).strokeColor('black').fillColor('black');
	const bar = (y: number, lengthMm: number, step: number, major: number, labels: (i: number) => string | null) => {
		doc.moveTo(mm(xMm), mm(y)).lineTo(mm(xMm + lengthMm), mm(y)).stroke();
		const count = Math.round(lengthMm / step);
		for (let i = 0; i <= count; i++) {
			const x = mm(xMm + i * step);
			const tall = i % major === 0;
			doc.moveTo(x, mm(y)).lineTo(x, mm(y - (tall ? 3 : 1.5))).stroke();
			const label = labels(i);
			if (label) doc.font('mono').fontSize(6).text(label, x - 10, mm(y + 1), { width: 20, align: 'center' });
		}
	};
	bar(yMm, 100, 1, 10, (i) => (i % 10 === 0 ? `${i}` : null));
	doc.font('text').fontSize(7).text('100 mm', mm(xMm + 102), mm(yMm - 2));
	bar(yMm + 10, 101.6, 25.4 / 4, 4, (i) => (i % 4 === 0 ? `${i / 4}` : null));
	doc.font('text').fontSize(7).text('4 in', mm(xMm + 104), mm(yMm + 8));
	doc.restore();
}
