// SVG at true scale: width and height in the design's units, one path per cut contour, etch in
// its own group; fill-rule evenodd so the bore and holes read as holes.
import { contourPath, outlinesPath, segmentsPath } from '$lib/trade/svg';
import { fromMm, type Units } from '$lib/trade/units';
import { cutContours, drawWheel, type WheelSpec } from '$lib/trade/wheel';

const escape = (s: string) => s.replace(/[<>&"]/g, (c) => `&#${c.charCodeAt(0)};`);

export function wheelSvg(spec: WheelSpec, units: Units): string {
	const k = units === 'in' ? 1 / 25.4 : 1;
	const d = drawWheel(spec);
	// The outline's stroke is centred on the cut line: the view reaches a full stroke width past the
	// outside diameter, so no reader clips the outer half of it. Width and height are the view's own
	// size in the units, so the drawing stays at true scale.
	const strokeWidth = 0.2 * k;
	const half = fromMm(spec.odMm, units) / 2 + strokeWidth;
	const size = 2 * half;
	const cut = cutContours(d)
		.map((c) => contourPath(c, k))
		.join('');
	// The label's letters as outlines, the same the DXF carries: no font left for a reader to choose.
	const label = d.label ? `<path id="label" d="${outlinesPath(d.label.outlines, k)}"/>` : '';
	const stroke = strokeWidth.toFixed(4);
	return [
		`<?xml version="1.0" encoding="UTF-8"?>`,
		`<svg xmlns="http://www.w3.org/2000/svg" width="${size.toFixed(4)}${units}" height="${size.toFixed(4)}${units}" viewBox="${(-half).toFixed(4)} ${(-half).toFixed(4)} ${size.toFixed(4)} ${size.toFixed(4)}">`,
		`<title>${escape(spec.label || 'Trigger wheel')}</title>`,
		`<g id="cut" fill="none" stroke="#d00000" stroke-width="${stroke}"><path fill-rule="evenodd" d="${cut}"/></g>`,
		`<g id="etch" fill="none" stroke="#1d47b0" stroke-width="${stroke}"><path d="${segmentsPath(d.etch, k)}"/>${label}</g>`,
		`</svg>`
	].join('\n');
}
