import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const dir = mkdtempSync(join(tmpdir(), 'phasewright-librecad-'));

/** Width and height, in pixels, of everything darker than white in a binary PGM (P5) image. */
function inkExtent(pgm: Buffer): { width: number; height: number } {
	const header = /^P5\s+(\d+)\s+(\d+)\s+(\d+)\s/.exec(pgm.subarray(0, 64).toString('latin1'))!;
	const [w, h] = [Number(header[1]), Number(header[2])];
	const pixels = pgm.subarray(header[0].length);
	let [minX, minY, maxX, maxY] = [w, h, -1, -1];
	for (let y = 0; y < h; y++)
		for (let x = 0; x < w; x++)
			if (pixels[y * w + x]! < 200) {
				minX = Math.min(minX, x);
				maxX = Math.max(maxX, x);
				minY = Math.min(minY, y);
				maxY = Math.max(maxY, y);
			}
	return { width: maxX - minX + 1, height: maxY - minY + 1 };
}

describe('LibreCAD opens the DXF and prints it at true size', () => {
	it.each([
		['mm', { teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', mark: 'none', units: 'mm' }, 100],
		['in', { teeth: '60', missing: '2', od: '4', depth: '3/16', bore: '3/4', mark: 'none', units: 'in' }, 101.6]
	])('%s', async (units, params, odMm) => {
		const res = await fetch(`${process.env.APP_URL}/api/v1/wheel.dxf?${new URLSearchParams(params)}`);
		const dxf = join(dir, `wheel-${units}.dxf`);
		writeFileSync(dxf, Buffer.from(await res.arrayBuffer()));
		// Debian's LibreCAD, headless: print the drawing 1:1, centred on its default page (A4 in the
		// drawing's units: for an inch drawing that is 210 x 297 in, so only the middle is rendered).
		execFileSync('librecad', ['dxf2pdf', '-s', '1', '-c', dxf], {
			cwd: dir,
			env: { ...process.env, QT_QPA_PLATFORM: 'offscreen', XDG_RUNTIME_DIR: dir },
			stdio: 'pipe'
		});
		const pdf = join(dir, `wheel-${units}.pdf`);
		const size = /Page size:\s+([\d.]+) x ([\d.]+) pts/.exec(execFileSync('pdfinfo', [pdf], { encoding: 'utf8' }))!;
		// Rendered at 254 dpi, 10 px are 1 mm (1 pt = 1/72 in): a square of OD + 20 mm round the page centre.
		const px = (pt: number) => Math.round((pt / 72) * 254);
		const box = Math.round((odMm + 20) * 10);
		execFileSync('pdftoppm', [
			'-r',
			'254',
			'-gray',
			'-singlefile',
			'-x',
			String(px(Number(size[1]) / 2) - box / 2),
			'-y',
			String(px(Number(size[2]) / 2) - box / 2),
			'-W',
			String(box),
			'-H',
			String(box),
			pdf,
			join(dir, `wheel-${units}`)
		]);
		const extent = inkExtent(readFileSync(join(dir, `wheel-${units}.pgm`)));
		expect(extent.width / 10).toBeCloseTo(odMm, 0);
		expect(extent.height / 10).toBeCloseTo(odMm, 0);
	});
});

describe('LibreCAD draws the etched label the size the font file gives', () => {
	it('a 36-1 labelled "Müller Ø 60-2": the label is as wide as fontTools sets it at a 4 mm cap height', async () => {
		const label = 'Müller Ø 60-2';
		const params = { teeth: '36', missing: '1', od: '100', depth: '5', bore: '20', mark: 'none', label, units: 'mm' };
		const res = await fetch(`${process.env.APP_URL}/api/v1/wheel.dxf?${new URLSearchParams(params)}`);
		expect(res.status).toBe(200);
		const dxf = join(dir, 'label.dxf');
		writeFileSync(dxf, Buffer.from(await res.arrayBuffer()));
		execFileSync('librecad', ['dxf2pdf', '-s', '1', '-c', dxf], {
			cwd: dir,
			env: { ...process.env, QT_QPA_PLATFORM: 'offscreen', XDG_RUNTIME_DIR: dir },
			stdio: 'pipe'
		});
		const pdf = join(dir, 'label.pdf');
		const size = /Page size:\s+([\d.]+) x ([\d.]+) pts/.exec(execFileSync('pdfinfo', [pdf], { encoding: 'utf8' }))!;
		const px = (pt: number) => Math.round((pt / 72) * 254);
		// The label sits below the centre, across the web between the 10 mm bore and the 45 mm roots:
		// a window 40 mm wide, 14 to 38 mm below the centre, holds it and nothing else (10 px per mm).
		const [cx, cy] = [px(Number(size[1]) / 2), px(Number(size[2]) / 2)];
		execFileSync('pdftoppm', [
			'-r',
			'254',
			'-gray',
			'-singlefile',
			'-x',
			String(cx - 200),
			'-y',
			String(cy + 140),
			'-W',
			'400',
			'-H',
			'240',
			pdf,
			join(dir, 'label')
		]);
		const extent = inkExtent(readFileSync(join(dir, 'label.pgm')));
		const font = join(import.meta.dirname, '..', '..', 'static', 'fonts', 'Inter-Regular.otf');
		const ink = JSON.parse(
			execFileSync('/usr/bin/python3', [join(import.meta.dirname, '..', 'support', 'label_metrics.py'), font, label, '4'], {
				encoding: 'utf8'
			})
		);
		// Within LibreCAD's line width and a pixel either side (0.3 mm); a TEXT entity in its own font came out about 40% wider.
		expect(Math.abs(extent.width / 10 - ink.width)).toBeLessThan(0.3);
		expect(Math.abs(extent.height / 10 - ink.height)).toBeLessThan(0.3);
	});
});
