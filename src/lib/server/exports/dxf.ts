// DXF for a cutting order: plain LINE/ARC/CIRCLE entities, every contour closed, cut and etch
// geometry on separate layers with distinct colours, version, code page and units in the header.
// The entities and tables are makerjs's DXF of the wheel's model (tests/support/wheel-model.ts),
// written here straight from the drawing (checked in dxf.test.ts), without makerjs's walk of the model and its
// object per entity, which were three quarters of an export's time; the header is our own, and
// angles are brought into [0, 360) where makerjs writes them as they come.
import makerjs from 'makerjs';
import type { Contour, Segment } from '$lib/trade/geometry';
import type { Units } from '$lib/trade/units';
import { etchRing, etchRingSegments } from '$lib/trade/etch-ring';
import { cutContours, drawWheel, labelSegments, type WheelSpec } from '$lib/trade/wheel';

export const layers = {
	cut: { name: 'CUT', color: makerjs.exporter.colors.red },
	etch: { name: 'ETCH', color: makerjs.exporter.colors.blue },
	// The degree ring on a layer of its own: etched like ETCH, but a shop may run it or leave it out.
	etchDegrees: { name: 'ETCH-DEGREES', color: makerjs.exporter.colors.green }
} as const;

// makerjs's rounding (to 1e-7, integers as they are) and its fixed tables, as its toDXF writes them.
const r = makerjs.round;
const lineTypes = [
	'0\nLTYPE\n72\n65\n70\n0\n2\nCONTINUOUS\n3\n______\n73\n0\n40\n0',
	'0\nLTYPE\n72\n65\n70\n0\n2\nDASHED\n3\n_ _ _ \n73\n2\n40\n7.5\n49\n5\n49\n-2.5',
	'0\nLTYPE\n72\n65\n70\n0\n2\nDOTTED\n3\n. . . \n73\n2\n40\n1.5\n49\n0.5\n49\n-1'
].join('\n');
/**
 * A coordinate as makerjs's DXF writes it, String(makerjs.round(v)), without its cost: turning a
 * fraction into its shortest decimal is most of a DXF's time, and a rounded value's shortest
 * decimal is its whole ten-millionths with the point put in while there are at most 15 digits of
 * them (a double keeps any 15; at 16, from 1e8 mm, the nearest double's shortest decimal may drop
 * the last). Values past that, far past any wheel, and below 1e-6, which JavaScript writes with an
 * exponent, go the long way.
 */
export function dxfNumber(v: number): string {
	if (v % 1 === 0) return String(v);
	const q = Math.round((v + Number.EPSILON) * 1e7);
	const a = q < 0 ? -q : q;
	if (!(a >= 10 && a < 1e15)) return String(q / 1e7);
	const whole = Math.floor(a / 1e7);
	let f = a - whole * 1e7;
	const text = q < 0 ? '-' + whole : '' + whole;
	if (!f) return text;
	let digits = 7;
	while (f % 10 === 0) {
		f /= 10;
		digits--;
	}
	const fraction = '' + f;
	return text + '.' + '000000'.slice(0, digits - fraction.length) + fraction;
}
const n = dxfNumber;

const layerRow = (l: { name: string; color: number }) => `0\nLAYER\n2\n${l.name}\n70\n0\n62\n${l.color}\n6\nCONTINUOUS`;

/**
 * An angle as the DXF reference writes one, in [0, 360): the drawing's arcs may run past a turn
 * (a bore arc from 72.5° to 432.5°), which some readers take for a different arc or refuse. Rounded
 * first, so 359.99999999 comes out as 0 rather than 360.
 */
export function dxfAngle(deg: number): number {
	const a = r(((deg % 360) + 360) % 360);
	return a >= 360 || a === 0 ? 0 : a;
}

function entity(s: Segment, k: number, layer: string): string {
	if (s.kind === 'line')
		return `0\nLINE\n8\n${layer}\n6\nCONTINUOUS\n10\n${n(s.from.x * k)}\n20\n${n(s.from.y * k)}\n11\n${n(s.to.x * k)}\n21\n${n(s.to.y * k)}`;
	const [start, end] = s.ccw ? [s.startDeg, s.endDeg] : [s.endDeg, s.startDeg];
	return `0\nARC\n8\n${layer}\n6\nCONTINUOUS\n10\n${n(s.center.x * k)}\n20\n${n(s.center.y * k)}\n40\n${n(s.radius * k)}\n50\n${dxfAngle(start)}\n51\n${dxfAngle(end)}`;
}

/**
 * The header: the version the file is written to (AC1009, DXF R12: plain entities, no handles),
 * its code page, and its units twice over: $INSUNITS (1 inches, 4 millimetres) for readers that
 * scale drawings on insertion, $MEASUREMENT (0 imperial, 1 metric) for those that pick their
 * defaults from it. AutoCAD DXF reference, HEADER section.
 */
export function dxfHeader(units: Units): string {
	const vars: [string, number, string | number][] = [
		['$ACADVER', 1, 'AC1009'],
		['$DWGCODEPAGE', 3, 'ANSI_1252'],
		['$INSUNITS', 70, units === 'in' ? 1 : 4],
		['$MEASUREMENT', 70, units === 'in' ? 0 : 1]
	];
	return `0\nSECTION\n2\nHEADER\n${vars.map(([name, code, value]) => `9\n${name}\n${code}\n${value}`).join('\n')}\n0\nENDSEC`;
}

function contourEntities(c: Contour, k: number, layer: string): string[] {
	if (c.kind === 'circle')
		return [`0\nCIRCLE\n8\n${layer}\n6\nCONTINUOUS\n10\n${n(c.center.x * k)}\n20\n${n(c.center.y * k)}\n40\n${n(c.radius * k)}`];
	return c.segments.map((s) => entity(s, k, layer));
}

export function wheelDxf(spec: WheelSpec, units: Units): string {
	const k = units === 'in' ? 1 / 25.4 : 1;
	const d = drawWheel(spec);
	const entities = cutContours(d).flatMap((c) => contourEntities(c, k, layers.cut.name));
	const etch = [...d.etch, ...labelSegments(d)];
	for (const s of etch) entities.push(entity(s, k, layers.etch.name));
	const ring = etchRing(spec);
	for (const s of ring ? etchRingSegments(ring) : []) entities.push(entity(s, k, layers.etchDegrees.name));
	const used = [layers.cut, ...(etch.length ? [layers.etch] : []), ...(ring ? [layers.etchDegrees] : [])];
	return [
		dxfHeader(units),
		`0\nSECTION\n2\nTABLES\n0\nTABLE\n2\nLTYPE\n${lineTypes}\n0\nENDTAB\n0\nTABLE\n2\nLAYER\n${used.map(layerRow).join('\n')}\n0\nENDTAB\n0\nENDSEC`,
		`0\nSECTION\n2\nENTITIES${entities.length ? `\n${entities.join('\n')}` : ''}\n0\nENDSEC`,
		'0\nEOF'
	].join('\n');
}
