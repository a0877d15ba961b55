// DXF for a cutting order: plain LINE/ARC/CIRCLE entities, every contour closed, cut and etch
// geometry on separate layers with distinct colours, units in the header ($INSUNITS). The file is
// makerjs's DXF of the wheel's model (wheelModel), written here straight from the drawing: the
// same text, character for character (checked in dxf.test.ts), without makerjs's walk of the model
// and its object per entity, which were three quarters of an export's time.
import makerjs from 'makerjs';
import type { Contour, Segment } from '$lib/trade/geometry';
import type { Units } from '$lib/trade/units';
import { cutContours, drawWheel, labelSegments, type WheelSpec } from '$lib/trade/wheel';

export const layers = {
	cut: { name: 'CUT', color: makerjs.exporter.colors.red },
	etch: { name: 'ETCH', color: makerjs.exporter.colors.blue }
} as const;

function toPath(s: Segment, k: number): makerjs.IPath {
	if (s.kind === 'line') return new makerjs.paths.Line([s.from.x * k, s.from.y * k], [s.to.x * k, s.to.y * k]);
	// makerjs arcs run counter-clockwise from start to end; a clockwise one is the same arc reversed.
	const [start, end] = s.ccw ? [s.startDeg, s.endDeg] : [s.endDeg, s.startDeg];
	return new makerjs.paths.Arc([s.center.x * k, s.center.y * k], s.radius * k, start, end);
}

function contourPaths(c: Contour, k: number): makerjs.IPath[] {
	if (c.kind === 'circle') return [new makerjs.paths.Circle([c.center.x * k, c.center.y * k], c.radius * k)];
	return c.segments.map((s) => toPath(s, k));
}

export function wheelModel(spec: WheelSpec, units: Units): makerjs.IModel {
	const k = units === 'in' ? 1 / 25.4 : 1;
	const d = drawWheel(spec);
	const cut = cutContours(d);
	const paths: Record<string, makerjs.IPath> = {};
	// Each path is made here and nowhere else, so its layer is set on it rather than on a copy.
	const onLayer = (p: makerjs.IPath, layer: string) => ((p.layer = layer), p);
	cut.forEach((c, i) => contourPaths(c, k).forEach((p, j) => (paths[`cut${i}_${j}`] = onLayer(p, layers.cut.name))));
	d.etch.forEach((s, i) => (paths[`etch${i}`] = onLayer(toPath(s, k), layers.etch.name)));
	// The label as its letters' outlines, not text: a CAD program has no font of its own to pick.
	labelSegments(d).forEach((s, i) => (paths[`label${i}`] = onLayer(toPath(s, k), layers.etch.name)));
	return { paths, units: units === 'in' ? makerjs.unitType.Inch : makerjs.unitType.Millimeter };
}

/** What makerjs.exporter.toDXF is given for the wheel's model. */
export function dxfOptions(spec: WheelSpec, units: Units): makerjs.exporter.IDXFRenderOptions {
	return {
		units: units === 'in' ? makerjs.unitType.Inch : makerjs.unitType.Millimeter,
		layerOptions: {
			[layers.cut.name]: { color: layers.cut.color },
			[layers.etch.name]: { color: layers.etch.color }
		}
	};
}

// makerjs's rounding (to 1e-7, integers as they are) and its fixed tables, as its toDXF writes them.
const r = makerjs.round;
const lineTypes = ['0\nLTYPE\n72\n65\n70\n0\n2\nCONTINUOUS\n3\n______\n73\n0\n40\n0', '0\nLTYPE\n72\n65\n70\n0\n2\nDASHED\n3\n_ _ _ \n73\n2\n40\n7.5\n49\n5\n49\n-2.5', '0\nLTYPE\n72\n65\n70\n0\n2\nDOTTED\n3\n. . . \n73\n2\n40\n1.5\n49\n0.5\n49\n-1'].join('\n');
const layerRow = (l: { name: string; color: number }) => `0\nLAYER\n2\n${l.name}\n70\n0\n62\n${l.color}\n6\nCONTINUOUS`;

function entity(s: Segment, k: number, layer: string): string {
	if (s.kind === 'line') return `0\nLINE\n8\n${layer}\n6\nCONTINUOUS\n10\n${r(s.from.x * k)}\n20\n${r(s.from.y * k)}\n11\n${r(s.to.x * k)}\n21\n${r(s.to.y * k)}`;
	const [start, end] = s.ccw ? [s.startDeg, s.endDeg] : [s.endDeg, s.startDeg];
	return `0\nARC\n8\n${layer}\n6\nCONTINUOUS\n10\n${r(s.center.x * k)}\n20\n${r(s.center.y * k)}\n40\n${r(s.radius * k)}\n50\n${r(start)}\n51\n${r(end)}`;
}

function contourEntities(c: Contour, k: number, layer: string): string[] {
	if (c.kind === 'circle') return [`0\nCIRCLE\n8\n${layer}\n6\nCONTINUOUS\n10\n${r(c.center.x * k)}\n20\n${r(c.center.y * k)}\n40\n${r(c.radius * k)}`];
	return c.segments.map((s) => entity(s, k, layer));
}

export function wheelDxf(spec: WheelSpec, units: Units): string {
	const k = units === 'in' ? 1 / 25.4 : 1;
	const d = drawWheel(spec);
	const entities = cutContours(d).flatMap((c) => contourEntities(c, k, layers.cut.name));
	const etch = [...d.etch, ...labelSegments(d)];
	for (const s of etch) entities.push(entity(s, k, layers.etch.name));
	const used = [layers.cut, ...(etch.length ? [layers.etch] : [])];
	return [
		`0\nSECTION\n2\nHEADER\n9\n$INSUNITS\n70\n${units === 'in' ? 1 : 4}\n0\nENDSEC`,
		`0\nSECTION\n2\nTABLES\n0\nTABLE\n2\nLTYPE\n${lineTypes}\n0\nENDTAB\n0\nTABLE\n2\nLAYER\n${used.map(layerRow).join('\n')}\n0\nENDTAB\n0\nENDSEC`,
		`0\nSECTION\n2\nENTITIES${entities.length ? `\n${entities.join('\n')}` : ''}\n0\nENDSEC`,
		'0\nEOF'
	].join('\n');
}
