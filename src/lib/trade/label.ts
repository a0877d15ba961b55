// The etched part label as outlines of the shipped font's letters (label-font.ts), so that every
// file and every CAD program shows the same letters at the same size: no font is left for a
// reader to choose. Letters are spaced by their advances alone (no kerning).
import type { Point } from './geometry';
import { labelFont } from './label-font';

/** Characters of `text` the etching font has no outline for, each once, in order. */
export function missingCharacters(text: string): string[] {
	const out: string[] = [];
	for (const ch of text) if (!(ch in labelFont.glyphs) && !out.includes(ch)) out.push(ch);
	return out;
}

/** A character as a reader can find it again: the character itself and its code point. */
export const characterName = (ch: string) => `“${ch}” (U+${ch.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')})`;

export interface LabelShape {
	/** Closed outlines, font units, y up, the ink's box centred on the origin. */
	outlines: Point[][];
	/** Half the ink's width and height, in cap heights. */
	halfWidth: number;
	halfHeight: number;
}

const shapes = new Map<string, LabelShape | null>();

/** The label's letters laid out in a row, or null when nothing of it would be drawn. */
export function labelShape(text: string): LabelShape | null {
	if (shapes.has(text)) return shapes.get(text)!;
	if (shapes.size > 64) shapes.clear();
	const outlines: Point[][] = [];
	let pen = 0;
	for (const ch of text) {
		const glyph = labelFont.glyphs[ch];
		if (!glyph) continue;
		const [advance, ...contours] = glyph;
		for (const steps of contours) {
			const pts: Point[] = [];
			let [x, y] = [0, 0];
			for (let i = 0; i + 1 < steps.length; i += 2) {
				x += steps[i]!;
				y += steps[i + 1]!;
				pts.push({ x: pen + x, y });
			}
			outlines.push(pts);
		}
		pen += advance;
	}
	let [x0, y0, x1, y1] = [Infinity, Infinity, -Infinity, -Infinity];
	for (const o of outlines)
		for (const p of o) {
			x0 = Math.min(x0, p.x);
			x1 = Math.max(x1, p.x);
			y0 = Math.min(y0, p.y);
			y1 = Math.max(y1, p.y);
		}
	const cap = labelFont.capHeight;
	const shape = outlines.length
		? {
				outlines: outlines.map((o) => o.map((p) => ({ x: p.x - (x0 + x1) / 2, y: p.y - (y0 + y1) / 2 }))),
				halfWidth: (x1 - x0) / 2 / cap,
				halfHeight: (y1 - y0) / 2 / cap
			}
		: null;
	shapes.set(text, shape);
	return shape;
}

export interface PlacedLabel {
	/** Closed outlines on the wheel, mm, drawing coordinates. */
	outlines: Point[][];
	/** The ink's box on the wheel: four corners in order. */
	corners: [Point, Point, Point, Point];
	/** Cap height, mm. */
	heightMm: number;
	centre: Point;
	/** Direction the text runs, degrees counter-clockwise from +x. */
	angleDeg: number;
}

/** The shape at a cap height, centred on `centre`, running along `angleDeg`. */
export function placeShape(shape: LabelShape, heightMm: number, centre: Point, angleDeg: number): PlacedLabel {
	const s = heightMm / labelFont.capHeight;
	const c = Math.cos((angleDeg * Math.PI) / 180);
	const n = Math.sin((angleDeg * Math.PI) / 180);
	const at = (x: number, y: number): Point => ({ x: centre.x + x * c - y * n, y: centre.y + x * n + y * c });
	const [hx, hy] = [shape.halfWidth * heightMm, shape.halfHeight * heightMm];
	return {
		outlines: shape.outlines.map((o) => o.map((p) => at(p.x * s, p.y * s))),
		corners: [at(-hx, -hy), at(hx, -hy), at(hx, hy), at(-hx, hy)],
		heightMm,
		centre,
		angleDeg
	};
}
