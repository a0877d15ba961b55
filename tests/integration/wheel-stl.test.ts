// The wheel's STL (a 3D-printed test-fit copy) as the API serves it, read by Debian's admesh: one
// closed part (every edge shared, nothing to fix), no degenerate facets, its volume the wheel's
// area times the thickness within 0.1 %, its box OD × OD × thickness in mm. The areas are worked
// out here in closed form for plain N−M wheels: tooth sectors at the OD, the rest at the root
// diameter, less the bore and the holes (πd²/4 each).
import { execFile } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { freshEmail, signUp } from '../support/client';

const app = process.env.APP_URL!;
const dir = mkdtempSync(join(tmpdir(), 'phasewright-wheel-stl-'));
// Asynchronous, so the test process keeps answering its sockets while admesh works.
const run = promisify(execFile);
let n = 0;

interface Admesh {
	parts: number;
	degenerate: number;
	volume: number;
	disconnected: number;
	fixed: number;
	box: { x: [number, number]; y: [number, number]; z: [number, number] };
}

/** admesh's report, read from its "Results" table (ADMesh 0.98's wording). */
async function admesh(stl: Buffer): Promise<Admesh> {
	const file = join(dir, `wheel-${++n}.stl`);
	writeFileSync(file, stl);
	const { stdout } = await run('admesh', [file]);
	const num = (label: RegExp) => {
		const m = label.exec(stdout);
		expect(m, `${label} in admesh's report`).not.toBeNull();
		return Number(m![1]);
	};
	const fixes = ['Edges fixed', 'Facets removed', 'Facets added', 'Facets reversed', 'Backwards edges', 'Normals fixed'];
	return {
		parts: num(/Number of parts\s*:\s*(\d+)/),
		degenerate: num(/Degenerate facets\s*:\s*(\d+)/),
		volume: num(/Volume\s*:\s*([\d.]+)/),
		disconnected: num(/Total disconnected facets\s*:\s*(\d+)/),
		fixed: fixes.reduce((a, f) => a + num(new RegExp(`${f}\\s*:\\s*(\\d+)`)), 0),
		box: {
			x: [num(/Min X =\s*(-?[\d.]+)/), num(/Max X =\s*(-?[\d.]+)/)],
			y: [num(/Min Y =\s*(-?[\d.]+)/), num(/Max Y =\s*(-?[\d.]+)/)],
			z: [num(/Min Z =\s*(-?[\d.]+)/), num(/Max Z =\s*(-?[\d.]+)/)]
		}
	};
}

async function download(path: string, params: Record<string, string>) {
	const res = await fetch(`${app}${path}?${new URLSearchParams(params)}`);
	expect(res.status, await res.clone().text()).toBe(200);
	return res;
}

/** Area of a plain N−M wheel with sharp corners, mm². */
function plainArea(o: { teeth: number; missing: number; duty: number; odMm: number; depthMm: number; boreMm: number; holesMm?: number[] }) {
	const R = o.odMm / 2;
	const r = R - o.depthMm;
	const share = ((o.teeth - o.missing) * o.duty) / o.teeth;
	const holes = (o.holesMm ?? []).reduce((a, d) => a + (Math.PI * d * d) / 4, 0);
	return Math.PI * (share * R * R + (1 - share) * r * r) - (Math.PI * o.boreMm ** 2) / 4 - holes;
}

const cases: { name: string; params: Record<string, string>; area: number; odMm: number; thicknessMm: number }[] = [
	{
		name: '36-1, 100 mm, 20 mm bore, 3 mm plate',
		params: { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', thickness: '3' },
		area: plainArea({ teeth: 36, missing: 1, duty: 0.5, odMm: 100, depthMm: 5, boreMm: 20 }),
		odMm: 100,
		thicknessMm: 3
	},
	{
		name: '60-2, 150 mm, four 8.5 mm bolt holes on 90 mm, 6 mm plate',
		params: {
			units: 'mm',
			teeth: '60',
			missing: '2',
			od: '150',
			depth: '6',
			bore: '40',
			thickness: '6',
			bolts: '4',
			pcd: '90',
			boltHole: '8.5',
			boltAngle: '0'
		},
		area: plainArea({ teeth: 60, missing: 2, duty: 0.5, odMm: 150, depthMm: 6, boreMm: 40, holesMm: [8.5, 8.5, 8.5, 8.5] }),
		odMm: 150,
		thicknessMm: 6
	},
	{
		name: '12-1 in inches (4 in, 3/16 deep, 3/4 bore, 1/4 plate): the STL still in mm',
		params: { units: 'in', teeth: '12', missing: '1', od: '4', depth: '3/16', bore: '3/4', thickness: '1/4', duty: '0.5' },
		area: plainArea({ teeth: 12, missing: 1, duty: 0.5, odMm: 101.6, depthMm: 4.7625, boreMm: 19.05 }),
		odMm: 101.6,
		thicknessMm: 6.35
	}
];

describe('wheel STL read by admesh', () => {
	it.each(cases)('$name: one closed part, no degenerate facets, volume = area × thickness, box OD × OD × thickness', async (c) => {
		const res = await download('/api/v1/wheel.stl', c.params);
		expect(res.headers.get('content-type')).toBe('model/stl');
		expect(res.headers.get('content-disposition')).toMatch(/filename="wheel-[\d-]+-[\d.]+mm\.stl"/);
		const m = await admesh(Buffer.from(await res.arrayBuffer()));
		expect(m.parts).toBe(1);
		expect(m.degenerate).toBe(0);
		expect(m.disconnected).toBe(0);
		expect(m.fixed, 'nothing for admesh to repair: edges, facets or normals').toBe(0);
		expect(Math.abs(m.volume / (c.area * c.thicknessMm) - 1)).toBeLessThan(0.001);
		// Arcs are cut into chords no more than 0.01 mm inside the true arc; admesh prints six decimals.
		const R = c.odMm / 2;
		for (const [lo, hi] of [m.box.x, m.box.y]) {
			expect(Math.abs(lo + R)).toBeLessThan(0.02);
			expect(Math.abs(hi - R)).toBeLessThan(0.02);
		}
		expect(m.box.z[0]).toBe(0);
		expect(Math.abs(m.box.z[1] - c.thicknessMm)).toBeLessThan(1e-5);
	});

	it('refuses a wheel that cannot be made, naming the field, as wheel.dxf does', async () => {
		const res = await fetch(`${app}/api/v1/wheel.stl?${new URLSearchParams({ teeth: '36', od: '100', depth: '5', bore: '95' })}`);
		expect(res.status).toBe(400);
		const body = (await res.json()) as { refusals: { field: string }[] };
		expect(body.refusals.map((r) => r.field)).toContain('bore');
	});

	it('from a saved revision: the same checks, the revision in the file name', async () => {
		const client = await signUp('stl owner', freshEmail('stl'));
		const build = await client.send<{ id: string }>('POST', '/api/v1/builds', { name: 'STL fit', engine: '' });
		expect(build.status).toBe(201);
		const params = { units: 'mm', teeth: '36', missing: '1', od: '100', depth: '5', thickness: '3', bore: '20' };
		const design = await client.send<{ id: string }>('POST', `/api/v1/builds/${build.body.id}/designs`, {
			name: 'Crank',
			params,
			message: 'as drawn'
		});
		expect(design.status).toBe(201);
		const res = await client.get(`/api/v1/designs/${design.body.id}/revisions/1/wheel.stl`);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-disposition')).toContain('wheel-36-1-100mm-r1.stl');
		const m = await admesh(Buffer.from(await res.arrayBuffer()));
		expect({ parts: m.parts, degenerate: m.degenerate, fixed: m.fixed }).toEqual({ parts: 1, degenerate: 0, fixed: 0 });
		expect(Math.abs(m.volume / (cases[0]!.area * 3) - 1)).toBeLessThan(0.001);
	});
});
