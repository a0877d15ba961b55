// Shared by every printable PDF: the shipped fonts, millimetre units, the "print at actual size"
// line and the calibration bars (100 mm and 4 in) to measure after printing.
import type * as Fontkit from 'fontkit';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import PDFDocument from 'pdfkit';
import { fontFile, pdfFonts } from './fonts';

/** PDF user space: 1 pt = 1/72 in (ISO 32000-1). */
export const PT_PER_MM = 72 / 25.4;
export const mm = (v: number) => v * PT_PER_MM;

export { papers } from '$lib/trade/paper';

// Given a font by its path, pdfkit reads and parses the file afresh for every document, and with
// it the OpenType layout tables (GSUB, GPOS) it shapes every string with: for Inter, most of what
// a PDF cost (measured in `npm run bench`). Given a font object already parsed, it takes it as it
// is; so each font is parsed once per process, by the very fontkit pdfkit itself depends on.
const fontkit = createRequire(createRequire(import.meta.url).resolve('pdfkit'))('fontkit') as typeof Fontkit;

/** Shaped words kept per font, at most this many (a page of text has a few hundred). */
const shapedLimit = 20_000;

/**
 * pdfkit keeps each word it shapes (glyphs and positions, already scaled) in its font's
 * `layoutCache`, one per document, and never changes an entry once made; so one cache per font
 * serves every document, and a word shaped once is measured and written from it ever after (the
 * shaping and measuring were half of a wheel PDF's time). The font's layout() runs only on a miss,
 * which is what counts the entries: past the limit, documents begun afterwards start a new cache.
 *
 * Each document embeds the subset of the font its text used, glyphs numbered in the order they
 * first appear; the subset's bytes follow from that list alone, so they are made once per list
 * (making them was a quarter of a wheel PDF's time). Every document takes the glyphs of `seeded`
 * first (newDocument), so the numbers a template prints, which change from file to file, do not
 * change the list.
 */
interface Shared {
	font: Fontkit.Font;
	cache: Record<string, unknown>;
	entries: number;
}
const subsetLimit = 200;
type Subset = Fontkit.Subset & { glyphs: number[] };

function shared(font: Fontkit.Font): Shared {
	const s: Shared = { font: Object.create(font) as Fontkit.Font, cache: Object.create(null) as Record<string, unknown>, entries: 0 };
	s.font.layout = (...args: Parameters<Fontkit.Font['layout']>) => {
		s.entries++;
		return font.layout(...args);
	};
	const subsets = new Map<string, Uint8Array>();
	s.font.createSubset = () => {
		const subset = font.createSubset() as Subset;
		const encode = subset.encode.bind(subset);
		subset.encode = () => {
			const key = subset.glyphs.join(',');
			let bytes = subsets.get(key);
			if (!bytes) {
				if (subsets.size >= subsetLimit) subsets.clear();
				subsets.set(key, (bytes = encode()));
			}
			return bytes;
		};
		return subset;
	};
	return s;
}

/** The characters of numbers, one word each so each is its own glyph: embedded in every document, first. */
const seeded = '0 1 2 3 4 5 6 7 8 9 . , - ° / ( ) %';

const fonts = new Map<string, Shared>();
function sharedFont(file: string): Shared {
	let font = fonts.get(file);
	if (!font) fonts.set(file, (font = shared(fontkit.create(readFileSync(fontFile(file))) as Fontkit.Font)));
	if (font.entries > shapedLimit) {
		font.cache = Object.create(null) as Record<string, unknown>;
		font.entries = 0;
	}
	return font;
}
const parsedFont = (file: string) => sharedFont(file).font;

/**
 * A user-given name as this PDF can print it. The shipped fonts cover Latin, Greek and Cyrillic;
 * a character they have no glyph for (CJK, emoji, many symbols) would print as nothing, so a name
 * could vanish without a trace. Each such character is shown as "?" instead, and listed by code
 * point for missingNote(). (A fallback font was weighed: one covering CJK is 10–20 MB per weight, and
 * pdfkit cannot draw colour emoji at all.)
 */
export function printable(text: string, font: keyof typeof pdfFonts = 'text'): { text: string; missing: string[] } {
	const face = parsedFont(pdfFonts[font]);
	const missing = new Set<string>();
	let out = '';
	for (const ch of text) {
		const cp = ch.codePointAt(0)!;
		if (cp < 0x20 || face.hasGlyphForCodePoint(cp)) out += ch;
		else {
			out += '?';
			missing.add(`U+${cp.toString(16).toUpperCase().padStart(4, '0')}`);
		}
	}
	return { text: out, missing: [...missing] };
}

/** The line a PDF carries when a name lost characters to "?": which ones, so the reader knows the name is not whole. */
export const missingNote = (missing: string[]) =>
	`Characters the PDF font cannot print are shown as “?”: ${missing.slice(0, 12).join(', ')}${missing.length > 12 ? ` and ${missing.length - 12} more` : ''}.`;

/** What pdfkit keeps of a document's current font that newDocument reaches into. */
type Internals = { _font: { layoutCache?: Record<string, unknown>; encode(text: string): unknown } };

/** A document with the shipped fonts; its first page `size`, or none yet when size is null (add it with addPageMm). */
export function newDocument(title: string, size: { widthMm: number; heightMm: number } | null) {
	const doc = new PDFDocument({
		size: size ? [mm(size.widthMm), mm(size.heightMm)] : 'A4',
		margin: 0,
		info: { Title: title, Creator: 'Phasewright' },
		autoFirstPage: size !== null,
		// No Helvetica to start with (pdfkit would parse its metrics for every document): the shipped fonts follow.
		font: null as unknown as string
	});
	for (const [name, file] of Object.entries(pdfFonts)) {
		const font = sharedFont(file);
		// pdfkit takes a parsed font (anything with layout()), though its types list only files and bytes.
		doc.registerFont(name, font.font as unknown as PDFKit.Mixins.PDFFontSource);
		doc.font(name);
		const embedded = (doc as unknown as Internals)._font;
		embedded.layoutCache = font.cache;
		embedded.encode(seeded);
	}
	doc.font('text');
	return doc;
}

export function addPageMm(doc: PDFKit.PDFDocument, size: { widthMm: number; heightMm: number }) {
	doc.addPage({ size: [mm(size.widthMm), mm(size.heightMm)], margin: 0 });
}

/**
 * The height, in pt, one line of the current font and size takes: its ascent to its descent plus
 * the font's line gap, the same ascent and descent the PDF's font descriptor states (so the boxes a
 * reader such as poppler draws round the words of neighbouring lines never overlap).
 */
export const lineHeight = (doc: PDFKit.PDFDocument) => doc.currentLineHeight(true);

/** Lines already broken, by font, size, width and text: a template breaks the same texts in every document. */
const broken = new Map<string, string[]>();
const brokenLimit = 5000;

/**
 * `text` broken into lines no wider than `widthPt` in the current font and size: at spaces, and
 * inside a word only when the word alone is wider than the line. Written a line at a time (with
 * lineBreak off) they sit exactly where a layout put them, so a table can measure, move a row to
 * the next page, or split it, before it draws anything.
 */
export function wrapLines(doc: PDFKit.PDFDocument, text: string, widthPt: number): string[] {
	const { _font: font, _fontSize: size } = doc as unknown as { _font: { name: string }; _fontSize: number };
	const key = `${font.name}\u0000${size}\u0000${widthPt}\u0000${text}`;
	let lines = broken.get(key);
	if (!lines) {
		if (broken.size >= brokenLimit) broken.clear();
		broken.set(key, (lines = breakLines(doc, text, widthPt)));
	}
	return [...lines];
}

function breakLines(doc: PDFKit.PDFDocument, text: string, widthPt: number): string[] {
	const lines: string[] = [];
	let line = '';
	const fits = (s: string) => doc.widthOfString(s) <= widthPt;
	for (const word of text.split(/ +/)) {
		const joined = line ? `${line} ${word}` : word;
		if (fits(joined)) {
			line = joined;
			continue;
		}
		if (line) lines.push(line);
		let rest = word;
		while (!fits(rest)) {
			// The longest head of the word that fits, at least one character.
			let n = 1;
			while (n < rest.length && fits(rest.slice(0, n + 1))) n++;
			lines.push(rest.slice(0, n));
			rest = rest.slice(n);
		}
		line = rest;
	}
	if (line || !lines.length) lines.push(line);
	return lines;
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

/**
 * The arguments of doc.text() for one line set as pdfkit's `align` sets it in a box `widthPt` wide
 * from x, measured here in the current font instead of by pdfkit's line wrapper, which costs more
 * than the text it sets (a tape has a label per tick). For a line that fits its box, as every
 * caller's does: `doc.font(f).fontSize(s).text(...alignedAt(doc, ...))` measures in f at s.
 */
export function alignedAt(
	doc: PDFKit.PDFDocument,
	text: string,
	x: number,
	y: number,
	widthPt: number,
	align: 'center' | 'right' = 'center'
) {
	const w = doc.widthOfString(text);
	return [text, x + (align === 'center' ? (widthPt - w) / 2 : widthPt - w), y, { lineBreak: false }] as const;
}

export const printNote = 'Print at 100% / actual size (no "fit to page"). Measure both bars before you use this print.';

/** A 100 mm bar with millimetre ticks and a 4 in bar with quarter-inch ticks, starting at (x, y) mm. */
export function calibrationBars(doc: PDFKit.PDFDocument, xMm: number, yMm: number) {
	doc.save().lineWidth(0.5).strokeColor('black').fillColor('black');
	const bar = (y: number, lengthMm: number, step: number, major: number, labels: (i: number) => string | null) => {
		doc
			.moveTo(mm(xMm), mm(y))
			.lineTo(mm(xMm + lengthMm), mm(y))
			.stroke();
		const count = Math.round(lengthMm / step);
		for (let i = 0; i <= count; i++) {
			const x = mm(xMm + i * step);
			const tall = i % major === 0;
			doc
				.moveTo(x, mm(y))
				.lineTo(x, mm(y - (tall ? 3 : 1.5)))
				.stroke();
			const label = labels(i);
			if (label)
				doc
					.font('mono')
					.fontSize(6)
					.text(...alignedAt(doc, label, x - 10, mm(y + 1), 20));
		}
	};
	bar(yMm, 100, 1, 10, (i) => (i % 10 === 0 ? `${i}` : null));
	doc
		.font('text')
		.fontSize(7)
		.text('100 mm', mm(xMm + 102), mm(yMm - 2));
	bar(yMm + 10, 101.6, 25.4 / 4, 4, (i) => (i % 4 === 0 ? `${i / 4}` : null));
	doc
		.font('text')
		.fontSize(7)
		.text('4 in', mm(xMm + 104), mm(yMm + 8));
	doc.restore();
}
