// The wheel DXF as the API serves it, read by two independent readers: ezdxf (audit, header,
// arc angles, the CUT layer's area by its own path flattening and the shoelace formula:
// tests/support/dxf_area.py) and Debian's OpenSCAD (imports the CUT layer, extrudes it 1 unit,
// exports STL: its volume is the part's area). Both must agree with each other and, where the
// shape allows, with the area worked out here in closed form. Also the PDF templates' file names.
import { execFile } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { acceptedSpec, wheelParams } from '../support/wheel-params';
import { wheel36x1x1Bolts, wheel60x2InchB17 } from '$support/example-wheels';

const app = process.env.APP_URL!;
const dir = mkdtempSync(join(tmpdir(), 'phasewright-wheel-dxf-'));
const script = join(import.meta.dirname, '..', 'support', 'dxf_area.py');
let n = 0;
// Asynchronous, so the test process keeps answering its sockets while OpenSCAD works.
const run = promisify(execFile);

interface Facts {
	auditErrors: number;
	auditFixes: number;
	acadver: string;
	codepage: string;
	insunits: number;
	measurement: number;
	arcAngleMin: number | null;
	arcAngleMax: number | null;
	texts: string[];
	loops: number;
	unchained: number;
	area: number;
	stlVolume: number;
}

const get = (params: Record<string, string>) => fetch(`${app}/api/v1/wheel.dxf?${new URLSearchParams(params)}`);

/** The DXF from the API, read by ezdxf, and OpenSCAD's extrusion of its CUT layer. */
async function read(params: Record<string, string>): Promise<Facts> {
	const res = await get(params);
	expect(res.status).toBe(200);
	const name = `w${n++}`;
	const dxf = join(dir, `${name}.dxf`);
	writeFileSync(dxf, Buffer.from(await res.arrayBuffer()));
	// OpenSCAD cuts arcs into chords of at most 1° (at least 0.05 mm / 0.002 in long): a circle's
	// area then comes out short by about (1° in rad)² / 6 = 5e-5, well inside the 1e-3 asked.
	const fs = params.units === 'in' ? 0.002 : 0.05;
	writeFileSync(join(dir, `${name}.scad`), `linear_extrude(1) import("${name}.dxf", layer="CUT", $fa=1, $fs=${fs});\n`);
	await run('/usr/bin/openscad', ['-o', `${name}.stl`, `${name}.scad`], { cwd: dir, timeout: 180_000 });
	const { stdout } = await run('/usr/bin/python3', [script, dxf, join(dir, `${name}.stl`)], { encoding: 'utf8', maxBuffer: 16 << 20 });
	return JSON.parse(stdout) as Facts;
}

function expectSound(f: Facts, units: 'mm' | 'in') {
	expect(f.auditErrors).toBe(0);
	expect(f.auditFixes).toBe(0);
	// AutoCAD DXF reference, HEADER section: AC1009 = R12; $INSUNITS 1 inches, 4 millimetres;
	// $MEASUREMENT 0 imperial, 1 metric.
	expect(f.acadver).toBe('AC1009');
	expect(f.codepage).toBe('ANSI_1252');
	expect(f.insunits).toBe(units === 'in' ? 1 : 4);
	expect(f.measurement).toBe(units === 'in' ? 0 : 1);
	// Angles in [0, 360) (DXF reference: start and end angles of an ARC, counter-clockwise).
	if (f.arcAngleMin !== null) {
		expect(f.arcAngleMin).toBeGreaterThanOrEqual(0);
		expect(f.arcAngleMax!).toBeLessThan(360);
	}
	expect(f.unchained).toBe(0);
	// The two readers agree on the part's area to 1 part in 1000.
	expect(Math.abs(f.stlVolume - f.area) / f.area).toBeLessThan(1e-3);
}

describe('the wheel DXF in ezdxf and OpenSCAD', () => {
	it('36-1, 100 mm, sharp corners, 20 mm bore: both readers give the area worked out by hand', async () => {
		const f = await read({ teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', mark: 'none', units: 'mm' });
		expectSound(f, 'mm');
		// Ring from the bore (r 10) to the roots (r 45), plus 35 tooth sectors of half a 10° pitch
		// from r 45 to r 50: A = pi (45² - 10²) + 35 (5° in rad / 2) (50² - 45²). Geometry.
		const expected = Math.PI * (45 ** 2 - 10 ** 2) + 35 * ((5 * Math.PI) / 180 / 2) * (50 ** 2 - 45 ** 2);
		expect(f.area).toBeCloseTo(expected, 2);
		expect(Math.abs(f.stlVolume - expected) / expected).toBeLessThan(2e-4);
		expect(f.loops).toBe(2);
	}, 60_000);

	it.each([
		['60-2, inches, B17.1 keyway, filleted', 'in', wheel60x2InchB17],
		['36-1-1, bolt circle', 'mm', wheel36x1x1Bolts],
		[
			"24-2, DIN 6885-1 keyway at 12 o'clock, label past ASCII",
			'mm',
			{
				teeth: '24',
				missing: '2',
				od: '90',
				depth: '6',
				bore: '20',
				keyway: 'din6885',
				shaft: '20',
				keywayAngle: '0',
				label: 'Zündung vorn',
				units: 'mm'
			}
		]
	] as const)(
		'%s',
		async (_, units, params) => {
			const f = await read(params);
			expectSound(f, units);
		},
		60_000
	);

	it('agrees over generated wheels (property test)', async () => {
		await fc.assert(
			fc.asyncProperty(wheelParams, async (p) => {
				const spec = acceptedSpec(p);
				// OpenSCAD's DXF import merges points closer than 0.001 of a unit and cuts each arc
				// into whole fragments (from memory of its source): on a wheel of a few mm with
				// hundreds of teeth that is its own error, not the file's. Wheels of 40 mm or more
				// whose tooth pitch at the root spans 2 mm or more stay well clear of it.
				fc.pre(spec !== null && spec.odMm >= 40 && (Math.PI * (spec.odMm - 2 * spec.depthMm)) / spec.pattern.teeth >= 2);
				// OpenSCAD reads LINE/ARC/CIRCLE; the label is the etch layer's business, not the cut's.
				const given = Object.fromEntries(Object.entries({ ...p, label: '' }).filter((e): e is [string, string] => e[1] !== undefined));
				expectSound(await read(given), p.units as 'mm' | 'in');
			}),
			{ numRuns: 8 }
		);
	}, 600_000);
});

describe('the PDF template file names', () => {
	it('differ between A4 and Letter', async () => {
		const params = { teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', units: 'mm' };
		const names = [];
		for (const paper of ['a4', 'letter']) {
			const res = await fetch(`${app}/api/v1/wheel.pdf?${new URLSearchParams({ ...params, paper })}`);
			expect(res.status).toBe(200);
			await res.arrayBuffer();
			names.push(res.headers.get('content-disposition'));
		}
		expect(names).toEqual(['attachment; filename="wheel-36-1-100mm-a4.pdf"', 'attachment; filename="wheel-36-1-100mm-letter.pdf"']);
	});
});
