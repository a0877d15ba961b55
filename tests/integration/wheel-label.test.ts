// The etched label as the font's own letter outlines, the same size in every file, and the
// clearances holes keep from it, the tooth roots and each other, through the public API.
// Expected sizes come from the font file itself, read with fontTools (tests/support/label_metrics.py),
// not from the product's generated outlines; the DXF is read back with ezdxf (dxf_facts.py).
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const app = process.env.APP_URL!;
const dir = mkdtempSync(join(tmpdir(), 'phasewright-label-'));
const support = join(import.meta.dirname, '..', 'support');
const fontFile = join(import.meta.dirname, '..', '..', 'static', 'fonts', 'Inter-Regular.otf');
const get = (path: string, params: Record<string, string>) => fetch(`${app}${path}?${new URLSearchParams(params)}`);

/** Ink width and height, mm, of a line set in the shipped font at a cap height, by fontTools. */
function fontInk(text: string, capMm: number): { width: number; height: number; missing: string[] } {
	return JSON.parse(
		execFileSync('/usr/bin/python3', [join(support, 'label_metrics.py'), fontFile, text, String(capMm)], { encoding: 'utf8' })
	);
}

async function dxfFacts(params: Record<string, string>, od: number) {
	const res = await get('/api/v1/wheel.dxf', params);
	expect(res.status).toBe(200);
	const file = join(dir, `label-${params.units}.dxf`);
	writeFileSync(file, Buffer.from(await res.arrayBuffer()));
	return JSON.parse(execFileSync('/usr/bin/python3', [join(support, 'dxf_facts.py'), file, String(od)], { encoding: 'utf8' })) as {
		auditErrors: number;
		kinds: string[];
		kindsByLayer: Record<string, number>;
		etchBox: [number, number, number, number] | null;
	};
}

// A 100 mm (or 4 in) wheel with a 20 mm (3/4 in) bore has a web of over 35 mm: the label is etched
// at the largest cap height the product uses, 4 mm. No index mark, so ETCH holds the label alone.
const label = 'Müller Ø 60-2';
const wheels = [
	{
		units: 'mm',
		params: { teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', mark: 'none', label, units: 'mm' },
		od: 100,
		k: 1
	},
	{
		units: 'in',
		params: { teeth: '60', missing: '2', od: '4', depth: '3/16', bore: '3/4', mark: 'none', label, units: 'in' },
		od: 4,
		k: 25.4
	}
];

describe('the etched label', () => {
	const ink = fontInk(label, 4);

	it('has every character in the font, read by fontTools', () => {
		expect(ink.missing).toEqual([]);
		expect(ink.width).toBeGreaterThan(20);
	});

	it.each(wheels)('DXF ($units): outlines on ETCH, no TEXT, the size the font file gives', async ({ params, od, k }) => {
		const f = await dxfFacts(params, od);
		expect(f.auditErrors).toBe(0);
		expect(f.kinds).not.toContain('TEXT');
		expect(f.kinds).not.toContain('MTEXT');
		expect(f.kindsByLayer['LINE@ETCH']).toBeGreaterThan(100);
		const [x0, y0, x1, y1] = f.etchBox!.map((v) => v * k) as [number, number, number, number];
		// Curves are flattened to within 4 font units (0.006 mm at a 4 mm cap height).
		expect(Math.abs(x1 - x0 - ink.width)).toBeLessThan(0.02);
		expect(Math.abs(y1 - y0 - ink.height)).toBeLessThan(0.02);
		// Centred across the wheel, in the web between the bore and the tooth roots.
		expect(Math.abs((x0 + x1) / 2)).toBeLessThan(1e-6);
		expect(Math.hypot(x1, y0)).toBeLessThan(od * k * 0.5 - 3);
	});

	it.each(wheels)('SVG ($units): the same outlines, no text element', async ({ params, k }) => {
		const res = await get('/api/v1/wheel.svg', params);
		expect(res.status).toBe(200);
		const svg = await res.text();
		expect(svg).not.toMatch(/<text/);
		const d = /<path id="label" d="([^"]+)"/.exec(svg)![1]!;
		const nums = d.match(/-?\d+(\.\d+)?/g)!.map(Number);
		const xs = nums.filter((_, i) => i % 2 === 0).map((v) => v * k);
		const ys = nums.filter((_, i) => i % 2 === 1).map((v) => v * k);
		// Path data carries four decimals of the unit: within 0.01 mm even in inches.
		expect(Math.abs(Math.max(...xs) - Math.min(...xs) - ink.width)).toBeLessThan(0.02);
		expect(Math.abs(Math.max(...ys) - Math.min(...ys) - ink.height)).toBeLessThan(0.02);
	});

	it('PDF template: the label is drawn where the DXF puts it (filled outlines, no text to pick a font for)', async () => {
		// A4 template: the wheel's centre 105 mm from the left edge and 80 mm from the top (12 mm margin
		// + 18 mm heading + the 50 mm radius). The label sits 27.5 mm below it, across the web: poppler
		// renders a 40 x 11 mm window there, empty on the unlabelled wheel.
		const inkIn = async (params: Record<string, string>, name: string) => {
			const file = join(dir, `${name}.pdf`);
			writeFileSync(file, Buffer.from(await (await get('/api/v1/wheel.pdf', params)).arrayBuffer()));
			const px = (mm: number) => String(Math.round((mm / 25.4) * 144));
			execFileSync('pdftoppm', [
				'-r',
				'144',
				'-gray',
				'-singlefile',
				'-x',
				px(85),
				'-y',
				px(102),
				'-W',
				px(40),
				'-H',
				px(11),
				file,
				join(dir, name)
			]);
			const pgm = readFileSync(join(dir, `${name}.pgm`));
			const header = /^P5\s+(\d+)\s+(\d+)\s+(\d+)\s/.exec(pgm.subarray(0, 64).toString('latin1'))!;
			return pgm.subarray(header[0].length).filter((v) => v < 128).length;
		};
		expect(await inkIn({ ...wheels[0]!.params, label: '' }, 'bare')).toBe(0);
		expect(await inkIn(wheels[0]!.params, 'labelled')).toBeGreaterThan(300);
	});

	it('refuses a character the font lacks, by name, with 400 on the field label', async () => {
		const res = await get('/api/v1/wheel.dxf', { teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', label: 'crank 日本' });
		expect(res.status).toBe(400);
		const { errors } = await res.json();
		// U+65E5 and U+672C, CJK ideographs: not in Inter (fontTools agrees).
		expect(fontInk('日本', 4).missing).toEqual(['日', '本']);
		expect(errors.label).toMatch(/“日” \(U\+65E5\), “本” \(U\+672C\)/);
	});

	it('refuses a label with no room on the wheel', async () => {
		const res = await get('/api/v1/wheel', {
			teeth: '12',
			missing: '1',
			od: '30',
			depth: '3',
			bore: '10',
			label: 'a label far too long for this'
		});
		expect(res.status).toBe(400);
		expect((await res.json()).errors.label).toMatch(/^label: no room to etch it/);
	});
});

describe('clearances between holes, the label, the keyway and the tooth roots (1 mm)', () => {
	const wheel = { teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', units: 'mm' };
	const refused = async (params: Record<string, string>) => {
		const res = await get('/api/v1/wheel', params);
		expect(res.status).toBe(400);
		return (await res.json()).errors as Record<string, string>;
	};

	it('a balance hole through the label names both', async () => {
		// Mark at 0: the label sits opposite, at wheel angle 180°, across the middle of the web
		// (radius (45 + 10) / 2 = 27.5 mm). A 4 mm hole there cuts through it.
		const errors = await refused({ ...wheel, label: 'crank', balanceCount: '1', balancePcd: '55', balanceHole: '4', balanceAngle: '180' });
		expect(errors.balancePcd).toMatch(/closer than 1\.00 mm to the etched label/);
		expect(errors.label).toMatch(/balance holes come closer than 1\.00 mm to it/);
		// Turned a quarter round, the same hole is clear.
		expect(
			(await get('/api/v1/wheel', { ...wheel, label: 'crank', balanceCount: '1', balancePcd: '55', balanceHole: '4', balanceAngle: '90' }))
				.status
		).toBe(200);
	});

	it('a bolt hole within 1 mm of the tooth roots, and of the keyway', async () => {
		// Root radius 45 mm: a 6 mm hole on an 84 mm circle reaches 45 mm, no web left.
		expect((await refused({ ...wheel, bolts: '3', pcd: '84', boltHole: '6' })).pcd).toMatch(
			/keep 1\.00 mm from the bore, keyway and tooth roots/
		);
		// A 6 x 2.8 mm keyway in the 20 mm bore reaches √(12.8² + 3²) = 13.15 mm from the centre, so
		// 4 mm holes need a circle of at least 2·(13.15 + 1 + 2) = 32.29 mm: 32 mm is refused (without
		// the keyway 26 mm would do), 32.4 mm is clear.
		const keyed = { ...wheel, keyway: 'custom', keyWidth: '6', keyDepth: '2.8', bolts: '3', boltHole: '4' };
		expect((await get('/api/v1/wheel', { ...wheel, bolts: '3', boltHole: '4', pcd: '32' })).status).toBe(200);
		expect((await refused({ ...keyed, pcd: '32' })).pcd).toMatch(/keep 1\.00 mm/);
		expect((await get('/api/v1/wheel', { ...keyed, pcd: '32.4' })).status).toBe(200);
	});

	it('two balance holes closer than 1 mm, and a balance hole beside a bolt hole', async () => {
		// 4 mm holes 9° apart on a 60 mm circle: centres 2·30·sin 4.5° = 4.71 mm apart, less than 4 + 1.
		expect((await refused({ ...wheel, balanceCount: '2', balancePcd: '60', balanceHole: '4', balanceSpacing: '9' })).balanceCount).toMatch(
			/closer than 1\.00 mm to each other/
		);
		// 10° apart: 5.23 mm, clear.
		expect(
			(await get('/api/v1/wheel', { ...wheel, balanceCount: '2', balancePcd: '60', balanceHole: '4', balanceSpacing: '10' })).status
		).toBe(200);
		// A bolt hole and a balance hole 8° apart on the same circle: 4.19 mm, refused; 10° apart, clear.
		const pair = {
			...wheel,
			bolts: '1',
			pcd: '60',
			boltHole: '4',
			boltAngle: '100',
			balanceCount: '1',
			balancePcd: '60',
			balanceHole: '4'
		};
		expect((await refused({ ...pair, balanceAngle: '108' })).balancePcd).toMatch(/closer than 1\.00 mm to the bolt holes/);
		expect((await get('/api/v1/wheel', { ...pair, balanceAngle: '110' })).status).toBe(200);
	});

	it('the suggested holes, added as the designer adds them, are accepted and leave no unbalance warning', async () => {
		const params = { ...wheel, label: 'crank 36-1', rpm: '15000', grade: '1' };
		const body = await (await get('/api/v1/wheel', params)).json();
		const s = body.balanceSuggestion;
		expect(s).not.toBeNull();
		const holed = {
			...params,
			balanceCount: String(s.count),
			balancePcd: String(Number(s.pcdMm.toFixed(2))),
			balanceHole: String(Number(s.holeMm.toFixed(2))),
			balanceAngle: String(Number(s.clockDeg.toFixed(2))),
			balanceSpacing: s.spacingDeg === undefined ? '' : String(Number(s.spacingDeg.toFixed(2)))
		};
		const res = await get('/api/v1/wheel', holed);
		expect(res.status).toBe(200);
		const after = await res.json();
		expect(after.warnings.map((w: { code: string }) => w.code)).not.toContain('unbalanced');
		// ISO 21940-11: U_per = 9549·G·m/n.
		expect(after.unbalance.gmm).toBeLessThanOrEqual((9549 * 1 * (after.massG / 1000)) / 15000);
	});
});
