import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const app = process.env.APP_URL!;
const dir = mkdtempSync(join(tmpdir(), 'phasewright-tape-'));
const get = (path: string, params: Record<string, string>) => fetch(`${app}${path}?${new URLSearchParams(params)}`);

/**
 * Numeric words with their centres, per page, from poppler's `pdftotext -bbox`, leaving out the
 * bottom 40 mm of each page, where the calibration bars carry numbers of their own.
 */
function labels(pdf: string) {
	const html = execFileSync('pdftotext', ['-bbox', pdf, '-'], { encoding: 'utf8' });
	const pages = html.split('<page ').slice(1);
	return pages.map((page) =>
		[...page.matchAll(/<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">(\d+)<\/word>/g)]
			.filter((m) => Number(m[4]) < Number(/height="([\d.]+)"/.exec(page)![1]) - (40 * 72) / 25.4)
			.map((m) => ({
				x: (Number(m[1]) + Number(m[3])) / 2,
				y: Number(m[2]),
				value: Number(m[5])
			}))
	);
}

describe('degree tape PDF, read back with poppler', () => {
	it.each([
		['3 in hub in mm, A4', { diameter: '76.2', units: 'mm', paper: 'a4' }, 76.2, 'A4'],
		['3 in hub in inches, Letter', { diameter: '3', units: 'in', paper: 'letter' }, 76.2, 'letter'],
		['600 mm measured round a flywheel, A4 (tiled)', { circumference: '600', units: 'mm', paper: 'a4' }, 600 / Math.PI, 'A4'],
		['50 mm hub, ±60°, Letter', { diameter: '50', window: '60', units: 'mm', paper: 'letter' }, 50, 'letter']
	])('%s: labels are π·(D + t)/360 per degree apart, within 0.2%', async (_, params, diameterMm, paperName) => {
		const summary = await (await get('/api/v1/tape', params)).json();
		const res = await get('/api/v1/tape.pdf', params);
		expect(res.status).toBe(200);
		const pdf = join(dir, `${Object.values(params).join('-')}.pdf`);
		writeFileSync(pdf, Buffer.from(await res.arrayBuffer()));

		const info = execFileSync('pdfinfo', [pdf], { encoding: 'utf8' });
		// ISO 216 A4 595.276 x 841.89 pt; ANSI Letter 612 x 792 pt.
		expect(info).toContain(paperName === 'A4' ? '595.276 x 841.89 pts (A4)' : '612 x 792 pts (letter)');
		expect(info).toMatch(new RegExp(`Pages:\\s+${summary.pages}\\n`));
		expect(execFileSync('pdftotext', [pdf, '-'], { encoding: 'utf8' })).toContain('Print at 100% / actual size');

		// One degree is π·(D + t)/360 mm (arc length, paper 0.1 mm on its mid-thickness); 1 pt = 1/72 in.
		const expectedPt = ((Math.PI * (diameterMm + 0.1)) / 360) * 10 * (72 / 25.4);
		let pairs = 0;
		for (const words of labels(pdf)) {
			const rows = new Map<number, typeof words>();
			for (const w of words) rows.set(Math.round(w.y), [...(rows.get(Math.round(w.y)) ?? []), w]);
			for (const row of rows.values()) {
				row.sort((a, b) => a.x - b.x);
				for (let i = 1; i < row.length; i++) {
					if (Math.abs(row[i]!.value - row[i - 1]!.value) !== 10) continue; // a label cut at a strip end
					expect(Math.abs(row[i]!.x - row[i - 1]!.x - expectedPt) / expectedPt).toBeLessThan(0.002);
					pairs++;
				}
			}
		}
		expect(pairs).toBeGreaterThan(4);
	});

	it('refuses a tape without a hub size, and with both sizes, naming the fields', async () => {
		const none = await get('/api/v1/tape', { units: 'mm' });
		expect(none.status).toBe(400);
		expect((await none.json()).errors).toEqual({ diameter: 'diameter: required (or give circumference instead)' });
		const both = await get('/api/v1/tape.pdf', { diameter: '76', circumference: '240' });
		expect((await both.json()).errors.circumference).toMatch(/either diameter or circumference/);
		const bad = await get('/api/v1/tape', { diameter: '3 1/2', units: 'in', tick: '1', label: '7.5' });
		expect((await bad.json()).errors).toEqual({ label: 'label: a multiple of the tick spacing (1°)' });
	});
});

describe('GET /api/v1/tdc', () => {
	// Seed document (fact of the trade): two marks 29° apart put TDC 14.5° from each.
	it('two readings on a signed scale', async () => {
		expect(await (await get('/api/v1/tdc', { a: '-10', b: '19' })).json()).toMatchObject({
			scale: 'signed',
			arc: 'shorter',
			tdcDeg: 4.5,
			spreadDeg: 29,
			halfSpreadDeg: 14.5
		});
	});

	it('two readings on a 0–360 wheel, across zero', async () => {
		expect(await (await get('/api/v1/tdc', { a: '350', b: '20' })).json()).toMatchObject({ scale: 'full', tdcDeg: 5, spreadDeg: 30 });
	});

	it('a distance along the rim (arc length: 360·s/(π·D) degrees)', async () => {
		const body = await (await get('/api/v1/tdc', { distance: '37.96', diameter: '150', units: 'mm' })).json();
		expect(body.spreadDeg).toBeCloseTo((360 * 37.96) / (Math.PI * 150), 6);
		expect(body.fromEitherMark).toBeCloseTo(18.98, 6);
	});

	it('refuses what cannot be a piston-stop pair', async () => {
		const same = await get('/api/v1/tdc', { a: '12', b: '12' });
		expect(same.status).toBe(400);
		expect((await same.json()).errors.b).toMatch(/must differ from the first mark/);
		const missing = await get('/api/v1/tdc', { a: '12' });
		expect((await missing.json()).errors.b).toMatch(/^b: a reading from −180 to 180 \(negative = BTDC\)/);
		const long = await get('/api/v1/tdc', { distance: '500', diameter: '150' });
		expect((await long.json()).errors.distance).toMatch(/less than the rim's circumference/);
	});
});

describe('timing-light card', () => {
	it('lists each speed with the mark position on this hub', async () => {
		const res = await get('/api/v1/timing-card.pdf', { diameter: '150', curve: '1200:10, 3000:20, 6000:32' });
		expect(res.status).toBe(200);
		const pdf = join(dir, 'card.pdf');
		writeFileSync(pdf, Buffer.from(await res.arrayBuffer()));
		const text = execFileSync('pdftotext', ['-layout', pdf, '-'], { encoding: 'utf8' });
		// 32° on a 150 mm hub with 0.1 mm paper: 32·π·150.1/360 = 41.9 mm.
		expect(text).toMatch(/6000 rpm\s+32° BTDC\s+41\.9 mm/);
		expect(text).toMatch(/1200 rpm\s+10° BTDC\s+13\.1 mm/);
		expect(text).toContain('Keep hands, hair, sleeves');
	});

	it('refuses a malformed curve', async () => {
		const res = await get('/api/v1/timing-card.pdf', { diameter: '150', curve: 'fast:lots' });
		expect(res.status).toBe(400);
		expect((await res.json()).errors.curve).toMatch(/rpm:advance pairs/);
	});
});
