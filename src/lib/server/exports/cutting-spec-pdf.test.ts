// The shop drawing read back by poppler (pdftotext, pdfinfo: independent readers of the PDF).
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkWheel } from '$lib/schemas/wheel';
import { cuttingSpecPdf } from './cutting-spec-pdf';
import { wheel36x1Keyed as keyed } from '$support/example-wheels';

const dir = mkdtempSync(join(tmpdir(), 'phasewright-drawing-'));

async function drawing(params: Record<string, string>, name: string, paper: 'a4' | 'letter' = 'a4') {
	const checked = checkWheel(params);
	if (!checked.ok) throw new Error(JSON.stringify(checked.refusals));
	const { spec, units, summary } = checked.value;
	const pdf = await cuttingSpecPdf({
		buildName: 'Bench build',
		designName: 'Crank wheel',
		revision: 3,
		quantity: 2,
		notes: '',
		finish: 'zinc plated',
		dxfName: 'wheel-36-1-100mm-r3.dxf',
		date: '2026-12-02',
		spec,
		summary,
		units,
		paper
	});
	const file = join(dir, `${name}.pdf`);
	writeFileSync(file, pdf);
	return {
		file,
		text: execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' }),
		info: execFileSync('pdfinfo', [file], { encoding: 'utf8' })
	};
}

describe('the shop drawing', () => {
	it('states every dimension of a keyed wheel with bolt and balance holes', { timeout: 60_000 }, async () => {
		const { text, info, file } = await drawing(keyed, 'keyed');
		console.log(file);
		// DIN 6885-1 row "over 17 up to 22 mm": key 6 x 6, t2 = 2.8 (published DIN 6885 extract) → d + t2 = 22.8.
		expect(text).toContain('Keyway 6.00 wide, d + t2 = 22.80');
		// ISO 286: 20 mm is in "over 18 up to 30", IT7 = 21 µm; H → lower deviation 0 (from memory).
		expect(text).toContain('Ø20.00 H7 (+0.021 / 0)');
		expect(text).toContain('Ø100.00');
		// Root = OD − 2 × tooth depth = 100 − 10.
		expect(text).toContain('Ø90.00 root');
		expect(text).toContain('4 × Ø6.50 on PCD 60.00');
		expect(text).toContain('2 × Ø5.00 on PCD 76.00');
		expect(text).toContain('ISO 2768-m');
		expect(text).toMatch(/Scale\s+1:1/);
		expect(text).toContain('zinc plated');
		expect(info).toMatch(/Page size:\s+595\.\d+ x 841\.\d+ pts \(A4\)/);
	});
});
