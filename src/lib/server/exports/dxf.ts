// DXF for a cutting order, through makerjs: plain LINE/ARC/CIRCLE entities, every contour closed,
// cut and etch geometry on separate layers with distinct colours, units in the header ($INSUNITS).
import makerjs from 'makerjs';
import type { Contour, Segment } from '$lib/trade/geometry';
import type { Units } from '$lib/trade/units';
import { cutContours, drawWheel, type WheelSpec } from '$lib/trade/wheel';

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
	cut.forEach((c, i) => contourPaths(c, k).forEach((p, j) => (paths[`cut${i}_${j}`] = { ...p, layer: layers.cut.name } as makerjs.IPath)));
	d.etch.forEach((s, i) => (paths[`etch${i}`] = { ...toPath(s, k), layer: layers.etch.name } as makerjs.IPath));
	const model: makerjs.IModel = { paths, units: units === 'in' ? makerjs.unitType.Inch : makerjs.unitType.Millimeter };
	if (d.labelAt && spec.label) {
		const { point, angleDeg } = d.labelAt;
		const half = 10;
		const dx = Math.cos((angleDeg * Math.PI) / 180) * half;
		const dy = Math.sin((angleDeg * Math.PI) / 180) * half;
		model.caption = {
			text: spec.label,
			anchor: new makerjs.paths.Line([(point.x - dx) * k, (point.y - dy) * k], [(point.x + dx) * k, (point.y + dy) * k])
		};
		model.layer = layers.etch.name;
	}
	return model;
}

export function wheelDxf(spec: WheelSpec, units: Units): string {
	const k = units === 'in' ? 1 / 25.4 : 1;
	const fontSize = (drawWheel(spec).labelAt?.heightMm ?? 3) * k;
	return makerjs.exporter.toDXF(wheelModel(spec, units), {
		units: units === 'in' ? makerjs.unitType.Inch : makerjs.unitType.Millimeter,
		fontSize,
		layerOptions: {
			[layers.cut.name]: { color: layers.cut.color },
			[layers.etch.name]: { color: layers.etch.color, fontSize }
		}
	});
}
