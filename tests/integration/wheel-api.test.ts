import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkWheel } from '../../src/lib/schemas/wheel';
import { wheel36x1x1Bolts, wheel60x2InchB17 } from '$support/example-wheels';

const app = process.env.APP_URL!;
const dir = mkdtempSync(join(tmpdir(), 'phasewright-wheel-'));
const facts = join(import.meta.dirname, '..', 'support', 'dxf_facts.py');

const get = (path: string, params: Record<string, string>) => fetch(`${app}${path}?${new URLSearchParams(params)}`);

interface DxfFacts {
	auditErrors: number;
	auditFixes: number;
	insunits: number;
	layers: Record<string, number>;
	kinds: string[];
	kindsByLayer: Record<string, number>;
	openEnds: number;
	extent: [number, number];
	reach: number;
	tipArcs: number;
	flankAngles: number[];
	etchBox: [number, number, number, number] | null;
}

/** Debian's python3-ezdxf reads the file back (tests/support/dxf_facts.py). */
async function dxfFacts(params: Record<string, string>, od: number): Promise<DxfFacts> {
	const res = await get('/api/v1/wheel.dxf', params);
	expect(res.status).toBe(200);
	const file = join(
		dir,
		`${Object.values(params)
			.join('_')
			.replace(/[^\w.-]/g, '')}.dxf`
	);
	writeFileSync(file, Buffer.from(await res.arrayBuffer()));
	return JSON.parse(execFileSync('/usr/bin/python3', [facts, file, String(od)], { encoding: 'utf8' })) as DxfFacts;
}

interface Case {
	name: string;
	params: Record<string, string>;
	od: number;
	teeth: number;
	pitch: number;
	duty: number;
	insunits: number;
}

const cases: Case[] = [
	{
		name: '36-1, mm, sharp corners',
		params: { teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', units: 'mm' },
		od: 100,
		teeth: 35,
		pitch: 10,
		duty: 0.5,
		insunits: 4
	},
	{
		name: '60-2, inches, B17.1 keyway, filleted',
		params: wheel60x2InchB17,
		od: 6,
		teeth: 58,
		pitch: 6,
		duty: 0.45,
		insunits: 1
	},
	{
		name: '36-1-1 (two gaps 180° apart), bolt circle',
		params: wheel36x1x1Bolts,
		od: 120,
		teeth: 34,
		pitch: 10,
		duty: 0.5,
		insunits: 4
	},
	{
		name: '24-2 with DIN 6885-1 keyway',
		params: { teeth: '24', missing: '2', od: '90', depth: '6', bore: '20', keyway: 'din6885', shaft: '20', units: 'mm' },
		od: 90,
		teeth: 22,
		pitch: 15,
		duty: 0.5,
		insunits: 4
	}
];

describe('GET /api/v1/wheel (JSON)', () => {
	// Seed document (fact of the trade): a 24-2 wheel has a 15° pitch and 22 teeth.
	it('24-2: pitch 15°, 22 teeth, leading edges at multiples of the pitch', async () => {
		const res = await get('/api/v1/wheel', { teeth: '24', missing: '2', od: '90', depth: '6', units: 'mm' });
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body).toMatchObject({ pattern: '24-2', pitchDeg: 15, teethPresent: 22, units: 'mm' });
		expect(body.teeth.map((t: { leadDeg: number }) => t.leadDeg)).toEqual(Array.from({ length: 22 }, (_, k) => k * 15));
		// Gap from the last trailing edge to the first leading edge: (M + 1)·p − tooth width = 3·15 − 7.5.
		expect(body.gaps).toEqual([{ firstPosition: 22, positions: 2, spanDeg: 37.5 }]);
		expect(body.massG).toBeGreaterThan(0);
		expect(body.permissible.standard).toBe('ISO 21940-11');
	});

	it('refuses bad parameters with 400, naming each field and its range', async () => {
		const res = await get('/api/v1/wheel', { teeth: '0', od: 'big', depth: '5', duty: '2', units: 'mm' });
		expect(res.status).toBe(400);
		const body = await res.json();
		expect(body.errors).toEqual({
			teeth: 'teeth: a whole number from 1 to 720',
			// A length that is no number says so before its range (issue 16).
			od: 'od: not a number; 10 mm to 2000 mm',
			duty: 'duty: a number from 0.05 to 0.95'
		});
	});

	it.each<[Record<string, string>, string, RegExp]>([
		[{ teeth: '36', missing: '36', od: '100', depth: '5' }, 'missing', /at most 35/],
		[{ teeth: '36', missing: '1', od: '100', depth: '45', bore: '20' }, 'depth', /less than 39\.00 mm/],
		[
			{ teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', bolts: '3', pcd: '30', boltHole: '12' },
			'pcd',
			/so the holes keep 1\.00 mm from the bore, keyway and tooth roots/
		],
		[{ teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', keyway: 'din6885' }, 'shaft', /shaft diameter/],
		// ANSI B17.2 lists its key numbers; 999, 1299 and 1650 are none of them.
		[
			{ teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', keyway: 'woodruff', woodruff: '999' },
			'woodruff',
			/one of the ANSI B17\.2 key numbers 202, 202\.5, .*1212/
		],
		[{ teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', keyway: 'woodruff', woodruff: '1299' }, 'woodruff', /key numbers/],
		[{ teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', keyway: 'woodruff', woodruff: '1650' }, 'woodruff', /key numbers/],
		// B17.1's square keys stop at 6 1/2 in shafts; DIN 6885-1 at 500 mm.
		[
			{ teeth: '36', missing: '1', od: '12', depth: '1/4', bore: '7', keyway: 'b17.1', shaft: '7', thickness: '1/4', units: 'in' },
			'shaft',
			/to 6\.500 in for ANSI B17\.1 square keys \(the standard's square-key sizes end there\)/
		],
		[{ teeth: '36', missing: '1', od: '4', depth: '3/16', units: 'yards' }, 'units', /one of mm, in/],
		// One line of text: a line break or control character has no place in an etched label.
		[{ teeth: '36', missing: '1', od: '100', depth: '5', label: 'R1\n  0\nLINE' }, 'label', /no line breaks/]
	])('refuses an impossible wheel %#', async (params, field, message) => {
		const res = await get('/api/v1/wheel.dxf', params);
		expect(res.status).toBe(400);
		expect((await res.json()).errors[field]).toMatch(message);
	});

	it('reads fractional inches', async () => {
		const res = await get('/api/v1/wheel', {
			teeth: '36',
			missing: '1',
			od: '3 1/2',
			depth: '3/16',
			bore: '5/8',
			thickness: '1/8',
			units: 'in'
		});
		expect(res.status).toBe(200);
		expect((await res.json()).rootDiameterMm).toBeCloseTo((3.5 - 2 * 0.1875) * 25.4, 3);
	});
});

describe('the designer page and the API refuse alike', () => {
	// The page runs checkWheel in the browser; the API runs it on the server. The expected first
	// reason is typed here from the README's ranges (1 in = 25.4 mm) and the trade's rules.
	const base = { teeth: '36', missing: '1', od: '100', depth: '5' };
	it.each<[string, Record<string, string>, string, string]>([
		['an outside diameter over 2000 mm', { ...base, od: '2500', units: 'mm' }, 'od', '10 mm to 2000 mm'],
		// 10 mm = 0.3937 in, 2000 mm = 78.740 in.
		['an outside diameter under 10 mm, in inches', { ...base, od: '1/4', depth: '1/16', units: 'in' }, 'od', '0.394 in to 78.74 in'],
		['a depth that is no length', { ...base, depth: 'deep', units: 'mm' }, 'depth', '0.2 mm to 200 mm'],
		['bolt holes without their circle', { ...base, bore: '20', bolts: '3', boltHole: '6' }, 'pcd', 'needed with bolt holes'],
		[
			'a keyway without a bore',
			{ ...base, bore: '0', keyway: 'custom', keyWidth: '5', keyDepth: '2' },
			'bore',
			'needed for a keyway (more than 0)'
		],
		// 36 positions with 36 missing leave no tooth: at most N − 1 = 35.
		['every tooth missing', { ...base, missing: '36' }, 'missing', 'at most 35'],
		['a bore with its unit before the number', { ...base, bore: 'mm 20', units: 'mm' }, 'bore', 'units go after the number'],
		['a bore in a unit nobody cuts in', { ...base, bore: '20 furlongs', units: 'mm' }, 'bore', 'unknown unit: use mm or in'],
		// 100 mm OD, 5 mm teeth, 1 mm to the roots: a bore up to 2 × (50 − 5 − 1) = 88 mm (arithmetic).
		['a bore too large for the wheel, which is the bore’s error', { ...base, bore: '98', units: 'mm' }, 'bore', 'at most 88.00 mm']
	])('%s', async (_, params, field, expected) => {
		const page = checkWheel(params);
		expect(page.ok).toBe(false);
		if (page.ok) return;
		const res = await get('/api/v1/wheel', params);
		expect(res.status).toBe(400);
		const body = (await res.json()) as { errors: Record<string, string>; refusals: { field: string; message: string }[] };
		const first = page.refusals.find((r) => r.field === field);
		expect(first?.message).toContain(expected);
		// The same reasons, in the same order, first per field; the old map still names the field.
		expect(body.refusals).toEqual(page.refusals);
		expect(body.errors[field]).toBe(`${field}: ${first!.message}`);
		expect(new Set(body.refusals.map((r) => r.field)).size).toBe(body.refusals.length);
	});
});

describe('DXF for a cutting order, read back by ezdxf', () => {
	it.each(cases)('$name', async (c) => {
		const f = await dxfFacts(c.params, c.od);
		expect(f.auditErrors).toBe(0);
		expect(f.auditFixes).toBe(0);
		// DXF reference: $INSUNITS 1 = inches, 4 = millimetres.
		expect(f.insunits).toBe(c.insunits);
		expect(f.layers.CUT).toBeDefined();
		expect(f.layers.ETCH).toBeDefined();
		expect(f.layers.CUT).not.toBe(f.layers.ETCH);
		expect(f.kinds.every((k) => ['LINE', 'ARC', 'CIRCLE'].includes(k))).toBe(true);
		expect(f.openEnds).toBe(0);
		// The tips reach the outside diameter; with rounded tip corners no tip needs to cross an axis,
		// so the bounding box may fall short of it by less than a fillet.
		expect(2 * f.reach).toBeCloseTo(c.od, 6);
		const fillet = Number(c.params.tipRadius ?? 0);
		for (const e of f.extent) expect(c.od - e).toBeLessThanOrEqual(2 * fillet + 1e-9);
		expect(f.tipArcs).toBe(c.teeth);
		// Flanks sit at 90° + k·p (leading) and 90° + k·p + duty·p (trailing) for a clockwise wheel.
		expect(f.flankAngles).toHaveLength(2 * c.teeth);
		for (const a of f.flankAngles) {
			const within = (((a - 90) % c.pitch) + c.pitch) % c.pitch;
			expect(
				[0, c.duty * c.pitch, c.pitch].some((v) => Math.abs(within - v) < 1e-3),
				`flank at ${a}°`
			).toBe(true);
		}
	});

	it('cuts the ANSI B17.1 hub keyseat to the published depth: 1 in bore, 1/4 key, T = 1.114 in', async () => {
		// Machinery's Handbook, Table 2 "Depth Control Values S and T" (B17.1), hubs, parallel, square:
		// 1.114 in from the keyseat floor across to the far side of a 1 in bore. Read from the DXF
		// by ezdxf: the keyseat floor corners are the CUT line ends nearest the bore beyond it.
		const res = await get('/api/v1/wheel.dxf', {
			teeth: '36',
			missing: '1',
			od: '4',
			depth: '3/16',
			bore: '1',
			keyway: 'b17.1',
			shaft: '1',
			thickness: '1/8',
			units: 'in'
		});
		expect(res.status).toBe(200);
		const file = join(dir, 'b17-1in.dxf');
		writeFileSync(file, Buffer.from(await res.arrayBuffer()));
		const script = [
			'import sys, math, ezdxf',
			'doc = ezdxf.readfile(sys.argv[1])',
			'pts = [p for e in doc.modelspace() if e.dxf.layer == "CUT" and e.dxftype() == "LINE" for p in (e.dxf.start, e.dxf.end)]',
			'near = [p for p in pts if math.hypot(p.x, p.y) < 0.75]',
			'far = max(near, key=lambda p: math.hypot(p.x, p.y))',
			'print(math.hypot(far.x, far.y))'
		].join('\n');
		const cornerRadius = Number(execFileSync('/usr/bin/python3', ['-c', script, file], { encoding: 'utf8' }));
		// The floor's corners sit half the key width (1/8 in) off the centre line.
		const floorFromCentre = Math.sqrt(cornerRadius ** 2 - 0.125 ** 2);
		expect(Math.abs(floorFromCentre + 0.5 - 1.114)).toBeLessThanOrEqual(0.0005);
	});

	it('names the file after pattern, diameter and units', async () => {
		const res = await get('/api/v1/wheel.dxf', cases[1]!.params);
		expect(res.headers.get('content-type')).toBe('application/dxf');
		expect(res.headers.get('content-disposition')).toBe('attachment; filename="wheel-60-2-6in.dxf"');
	});
});

describe('SVG and PDF', () => {
	it('SVG is drawn at true scale (width and height in the units)', async () => {
		const res = await get('/api/v1/wheel.svg', cases[0]!.params);
		expect(res.headers.get('content-type')).toBe('image/svg+xml');
		const svg = await res.text();
		// The view reaches one 0.2 mm stroke width past the 100 mm outline on each side (so the stroke,
		// centred on the cut line, is never clipped); width and height state that view in mm.
		expect(svg).toMatch(/<svg [^>]*width="100\.4000mm" height="100\.4000mm" viewBox="-50\.2000 -50\.2000 100\.4000 100\.4000"/);
		const inch = await (await get('/api/v1/wheel.svg', cases[1]!.params)).text();
		// 6 in plus two strokes of 0.2/25.4 in.
		expect(inch).toMatch(/width="6\.0157in" height="6\.0157in"/);
	});

	it.each([
		['a4', '595.276 x 841.89 pts (A4)'],
		['letter', '612 x 792 pts (letter)']
	])('PDF template on %s, read by poppler', async (paper, size) => {
		const res = await get('/api/v1/wheel.pdf', { ...cases[0]!.params, paper });
		expect(res.headers.get('content-type')).toBe('application/pdf');
		const file = join(dir, `template-${paper}.pdf`);
		writeFileSync(file, Buffer.from(await res.arrayBuffer()));
		// ISO 216 A4 = 210 x 297 mm = 595.276 x 841.89 pt; ANSI Letter = 612 x 792 pt (1 pt = 1/72 in).
		expect(execFileSync('pdfinfo', [file], { encoding: 'utf8' })).toContain(`Page size:       ${size}`);
		const text = execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' });
		expect(text).toContain('Print at 100% / actual size');
		expect(text).toContain('100 mm');
		expect(text).toContain('36-1');
	});
});

describe('lengths with their own unit', () => {
	// A metric shaft on an inch wheel: "20 mm" is 20 mm whatever the form's units. The DXF is in
	// inches ($INSUNITS 1); ezdxf reads the bore circle back and 1 in = 25.4 mm exactly (1959).
	const boreRead = `
import json, sys, ezdxf
doc = ezdxf.readfile(sys.argv[1])
circles = [e for e in doc.modelspace() if e.dxf.layer == "CUT" and e.dxftype() == "CIRCLE" and abs(e.dxf.center.x) < 1e-9 and abs(e.dxf.center.y) < 1e-9]
print(json.dumps({"insunits": doc.header["$INSUNITS"], "radii": [c.dxf.radius for c in circles]}))
`;
	const inchWheel = { teeth: '36', missing: '1', od: '4', depth: '3/16', units: 'in' };

	it('GET /api/v1/wheel with bore=20 mm on an inch wheel answers a wheel with a 20 mm bore', async () => {
		const res = await get('/api/v1/wheel', { ...inchWheel, bore: '20 mm' });
		expect(res.status).toBe(200);
		expect((await res.json()).units).toBe('in');
		const dxf = await get('/api/v1/wheel.dxf', { ...inchWheel, bore: '20 mm' });
		expect(dxf.status).toBe(200);
		const file = join(dir, 'bore-20mm-on-inch.dxf');
		writeFileSync(file, Buffer.from(await dxf.arrayBuffer()));
		const read = JSON.parse(execFileSync('/usr/bin/python3', ['-c', boreRead, file], { encoding: 'utf8' })) as {
			insunits: number;
			radii: number[];
		};
		expect(read.insunits).toBe(1);
		expect(read.radii).toHaveLength(1);
		expect(read.radii[0]! * 25.4).toBeCloseTo(10, 3);
		expect(Math.abs(read.radii[0]! * 25.4 - 10)).toBeLessThan(0.001);
	});

	it('takes 3/4" and 19.05mm alike, and says why it refuses', async () => {
		for (const bore of ['3/4"', '3/4 in', '19.05mm', '0.75']) {
			const res = await get('/api/v1/wheel.dxf', { ...inchWheel, bore });
			expect(res.status, bore).toBe(200);
		}
		const res = await get('/api/v1/wheel', { ...inchWheel, bore: 'abc' });
		expect(res.status).toBe(400);
		const body = (await res.json()) as { errors: Record<string, string>; refusals: { field: string; message: string }[] };
		// 1900 mm = 74.803 in, the registry's top of the bore's range.
		expect(body.refusals).toEqual([{ field: 'bore', message: 'not a number; 0 in to 74.803 in' }]);
		expect(body.errors.bore).toBe('bore: not a number; 0 in to 74.803 in');
	});
});
