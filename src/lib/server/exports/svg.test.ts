// The SVG export read back as a drawing: its viewBox must hold the whole outline, stroke and all,
// and its width and height must state the view's size in the units (true scale).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseWheel } from '$lib/schemas/wheel';
import { acceptedSpec, wheelParams } from '../../../../tests/support/wheel-params';
import { wheelSvg } from './svg';

interface Read {
	width: number;
	height: number;
	units: string;
	view: [number, number, number, number];
	stroke: number;
	/** Every coordinate pair the cut path passes through (line and arc end points). */
	points: [number, number][];
}

/** The root element's attributes and the cut path's numbers, as any SVG reader takes them. */
function read(svg: string): Read {
	const root = /<svg\b([^>]*)>/.exec(svg)![1]!;
	const attr = (tag: string, name: string) => new RegExp(`\\b${name}="([^"]*)"`).exec(tag)?.[1] ?? '';
	const [, width, units] = /^([\d.]+)(mm|in)$/.exec(attr(root, 'width'))!;
	const [, height] = /^([\d.]+)(mm|in)$/.exec(attr(root, 'height'))!;
	const view = attr(root, 'viewBox').split(/[ ,]+/).map(Number) as Read['view'];
	const cut = /<g id="cut"([^>]*)><path[^>]*\bd="([^"]*)"/.exec(svg)!;
	const points: [number, number][] = [];
	// Path data as written by the export: absolute M, L, A (seven numbers, the end point last) and Z.
	for (const [, cmd, args] of cut[2]!.matchAll(/([MLAZ])([^MLAZ]*)/g)) {
		const n = args!.trim().split(/[ ,]+/).filter(Boolean).map(Number);
		if (cmd === 'M' || cmd === 'L') points.push([n[0]!, n[1]!]);
		if (cmd === 'A') points.push([n[5]!, n[6]!]);
	}
	return { width: Number(width), height: Number(height), units: units!, view, stroke: Number(attr(cut[1]!, 'stroke-width')), points };
}

describe('the SVG export', () => {
	it('has a viewBox holding the outline plus half its stroke, at true scale (property test)', () => {
		fc.assert(
			fc.property(wheelParams, (params) => {
				const spec = acceptedSpec(params);
				fc.pre(spec !== null);
				const parsed = parseWheel(params);
				if (!parsed.ok) return;
				const units = parsed.value.units;
				const k = units === 'in' ? 1 / 25.4 : 1;
				const svg = read(wheelSvg(spec!, units));
				const [x, y, w, h] = svg.view;
				// No cut line reaches past the tooth tips, on the outside diameter (the od parameter).
				const R = (spec!.odMm / 2) * k;
				expect(Math.max(...svg.points.map(([px, py]) => Math.hypot(px, py)))).toBeLessThanOrEqual(R + 1e-3);
				const reach = R + svg.stroke / 2;
				expect(x).toBeLessThanOrEqual(-reach);
				expect(y).toBeLessThanOrEqual(-reach);
				expect(x + w).toBeGreaterThanOrEqual(reach);
				expect(y + h).toBeGreaterThanOrEqual(reach);
				// One user unit is one mm or one inch: the stated size is the view's size.
				expect(svg.units).toBe(units);
				expect(svg.width).toBeCloseTo(w, 4);
				expect(svg.height).toBeCloseTo(h, 4);
			}),
			{ numRuns: 100 }
		);
	}, 60_000);

	it('shows the full stroke of a 100 mm wheel: 0.1 mm past the tips on every side', () => {
		const parsed = parseWheel({ units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', bore: '20' });
		if (!parsed.ok) throw new Error('refused');
		const svg = read(wheelSvg(parsed.value.spec, 'mm'));
		// Stroke 0.2 mm, centred on the 50 mm radius: ink reaches 50.1 mm from the centre.
		expect(svg.stroke).toBe(0.2);
		expect(svg.view[0]).toBeLessThanOrEqual(-50.1);
		expect(svg.view[0] + svg.view[2]).toBeGreaterThanOrEqual(50.1);
		expect(Math.max(...svg.points.map(([px, py]) => Math.hypot(px, py)))).toBeCloseTo(50, 4);
	});
});
