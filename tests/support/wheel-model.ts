// The wheel as a makerjs model, the reference the DXF writer (src/lib/server/exports/dxf.ts) is
// checked against: makerjs's own toDXF of this model must give the same entities and tables.
import makerjs from 'makerjs';
import { layers } from '$lib/server/exports/dxf';
import type { Contour, Segment } from '$lib/trade/geometry';
import type { Units } from '$lib/trade/units';
import { cutContours, drawWheel, labelSegments, type WheelSpec } from '$lib/trade/wheel';

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
