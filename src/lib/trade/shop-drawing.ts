// What a shop drawing of a wheel states beyond the outline: its scale, and where the gap sits
// from the keyway as a fabricator sees it on the drawing.
import { norm360 } from './units';
import { drawDeg, gapOpenings, type WheelSpec } from './wheel';

/** ISO 5455's recommended scales from full size down: a drawing takes the largest that fits. */
export const drawingScales = [
	{ label: '1:1', factor: 1 },
	{ label: '1:2', factor: 0.5 },
	{ label: '1:5', factor: 0.2 },
	{ label: '1:10', factor: 0.1 },
	{ label: '1:20', factor: 0.05 }
] as const;

export type DrawingScale = (typeof drawingScales)[number];

/**
 * The scale for a wheel of `odMm` in a square of `roomMm`: 1:1 whenever it fits (the print can be
 * laid on the blank as a template), else the largest reduction that fits, 1:20 at the least.
 */
export function scaleFor(odMm: number, roomMm: number): DrawingScale {
	return drawingScales.find((s) => odMm * s.factor <= roomMm) ?? drawingScales[drawingScales.length - 1]!;
}

export interface GapPosition {
	/** The gap's centre line, drawing degrees (counter-clockwise from +x). */
	drawDeg: number;
	/** The opening's width, degrees. */
	widthDeg: number;
	/** The smaller angle from the keyway's centre line to the gap's, as drawn; null without a keyway. */
	fromKeyway: { deg: number; sense: 'clockwise' | 'counter-clockwise' } | null;
}

/** Each gap's centre line and its angle from the keyway, measured on the drawing (the face the DXF shows). */
export function gapPositions(spec: WheelSpec): GapPosition[] {
	return gapOpenings(spec).map((g) => {
		const at = drawDeg(spec, (g.fromDeg + g.toDeg) / 2);
		const ccw = spec.keyway ? norm360(at - drawDeg(spec, spec.keywayDeg)) : null;
		return {
			drawDeg: at,
			widthDeg: g.toDeg - g.fromDeg,
			fromKeyway: ccw === null ? null : ccw <= 180 ? { deg: ccw, sense: 'counter-clockwise' } : { deg: 360 - ccw, sense: 'clockwise' }
		};
	});
}
