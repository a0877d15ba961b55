import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { exampleSpec } from '$support/example-spec';
import { acceptedSpec, wheelParams } from '$support/wheel-params';
import type { WheelSpec } from '$lib/trade/wheel';
import { meshStl, wheelMesh, type Mesh } from './stl';

// The mesh is checked by its own definitions, not by the code that made it: a closed, consistently
// turned surface has every edge once each way (common practice for manifold meshes), and its volume
// is ∑ v0·(v1 × v2) / 6 over the facets (divergence theorem). The areas it must match are worked out
// here by hand for plain wheels.

function edgesPaired(m: Mesh): string[] {
	const count = new Map<string, number>();
	for (let i = 0; i < m.triangles.length; i += 3) {
		const t = [m.triangles[i]!, m.triangles[i + 1]!, m.triangles[i + 2]!];
		for (let k = 0; k < 3; k++) {
			const key = `${t[k]}>${t[(k + 1) % 3]}`;
			count.set(key, (count.get(key) ?? 0) + 1);
		}
	}
	const bad: string[] = [];
	for (const [key, n] of count) {
		const [a, b] = key.split('>');
		if (n !== 1 || count.get(`${b}>${a}`) !== 1) bad.push(key);
	}
	return bad;
}

function volumeOf(m: Mesh): number {
	const v = m.vertices;
	let sum = 0;
	for (let i = 0; i < m.triangles.length; i += 3) {
		const [a, b, c] = [3 * m.triangles[i]!, 3 * m.triangles[i + 1]!, 3 * m.triangles[i + 2]!];
		sum +=
			v[a]! * (v[b + 1]! * v[c + 2]! - v[b + 2]! * v[c + 1]!) -
			v[a + 1]! * (v[b]! * v[c + 2]! - v[b + 2]! * v[c]!) +
			v[a + 2]! * (v[b]! * v[c + 1]! - v[b + 1]! * v[c]!);
	}
	return sum / 6;
}

/** Facets with two corners the same point: what admesh counts as degenerate (its stl_remove_degenerate, from memory). */
function degenerateFacets(m: Mesh): number {
	const v = m.vertices;
	const at = (i: number) => `${v[3 * i]},${v[3 * i + 1]},${v[3 * i + 2]}`;
	let n = 0;
	for (let i = 0; i < m.triangles.length; i += 3) {
		const [a, b, c] = [at(m.triangles[i]!), at(m.triangles[i + 1]!), at(m.triangles[i + 2]!)];
		if (a === b || b === c || a === c) n++;
	}
	return n;
}

/** A plain N−M wheel with sharp corners: tooth sectors at the OD, the rest at the root, less the bore and holes. */
function plainArea(s: WheelSpec, teethPresent: number, holesMm: number[]): number {
	const R = s.odMm / 2;
	const r = R - s.depthMm;
	const toothShare = (teethPresent * s.duty) / (s.pattern.kind === 'missing' ? s.pattern.teeth : 1);
	return (
		Math.PI * (toothShare * R * R + (1 - toothShare) * r * r) -
		Math.PI * (s.boreMm / 2) ** 2 -
		holesMm.reduce((a, d) => a + (Math.PI * d * d) / 4, 0)
	);
}

describe('wheel STL mesh', () => {
	it('36-1, 100 mm, 20 mm bore, 3 mm: closed, no degenerate facets, volume = area × thickness within 0.1 %', () => {
		const spec = exampleSpec();
		const m = wheelMesh(spec);
		expect(edgesPaired(m)).toEqual([]);
		expect(degenerateFacets(m)).toBe(0);
		const want = plainArea(spec, 35, []) * 3;
		expect(Math.abs(volumeOf(m) / want - 1)).toBeLessThan(0.001);
	});

	it('60-2, 150 mm, 1/4 duty, four bolt holes, 6 mm plate', () => {
		const spec = exampleSpec({
			pattern: { kind: 'missing', teeth: 60, missing: 2 },
			duty: 0.25,
			odMm: 150,
			depthMm: 6,
			boreMm: 40,
			bolts: { count: 4, pcdMm: 80, holeMm: 8.5, clockDeg: 0 },
			thicknessMm: 6
		});
		const m = wheelMesh(spec);
		expect(edgesPaired(m)).toEqual([]);
		expect(degenerateFacets(m)).toBe(0);
		const want = plainArea(spec, 58, [8.5, 8.5, 8.5, 8.5]) * 6;
		expect(Math.abs(volumeOf(m) / want - 1)).toBeLessThan(0.001);
	});

	it('with a keyway: the bore and slot as one hole, area from the slot worked out here', () => {
		// Slot w × (Rb + depth − y0) above the chord at y0 = √(Rb² − (w/2)²), less the bore's segment beyond that chord.
		const spec = exampleSpec({ keyway: { widthMm: 6, depthMm: 2.8, source: 'custom keyway' }, keywayDeg: 30 });
		const Rb = 10;
		const half = Math.asin(3 / Rb);
		const y0 = Math.sqrt(Rb * Rb - 9);
		const segment = (Rb * Rb * (2 * half - Math.sin(2 * half))) / 2;
		const slot = 6 * (Rb + 2.8 - y0) - segment;
		const m = wheelMesh(spec);
		expect(edgesPaired(m)).toEqual([]);
		const want = (plainArea(spec, 35, []) - slot) * 3;
		expect(Math.abs(volumeOf(m) / want - 1)).toBeLessThan(0.001);
	});

	it('every accepted wheel (generated over the valid ranges) makes a closed part with its faces turned outward', () => {
		fc.assert(
			fc.property(wheelParams, (params) => {
				const spec = acceptedSpec(params);
				if (!spec) return;
				const m = wheelMesh(spec);
				expect(edgesPaired(m)).toEqual([]);
				expect(degenerateFacets(m)).toBe(0);
				expect(volumeOf(m)).toBeGreaterThan(0);
			}),
			{ numRuns: 25 }
		);
		// Generous: the machine is shared, and each run meshes a whole wheel.
	}, 60_000);

	it('binary layout: 80-byte header not starting with "solid", facet count, 50 bytes a facet, unit normals', () => {
		const m = wheelMesh(exampleSpec());
		const stl = meshStl(m, 'wheel-36-1-100mm');
		const facets = m.triangles.length / 3;
		expect(stl.subarray(0, 5).toString('ascii')).not.toBe('solid');
		expect(stl.readUInt32LE(80)).toBe(facets);
		expect(stl.length).toBe(84 + 50 * facets);
		for (const f of [0, facets >> 1, facets - 1]) {
			const n = [0, 1, 2].map((k) => stl.readFloatLE(84 + 50 * f + 4 * k));
			expect(Math.hypot(...n)).toBeCloseTo(1, 5);
		}
	});
});
