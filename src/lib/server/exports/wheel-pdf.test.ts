// The wheel template read back by poppler (`pdftotext -bbox`, an independent PDF reader): no two
// words' boxes intersect, on A4 and Letter, over property-generated wheels, long labels and tables
// long enough to flow onto further pages; and the Layers row says where the index mark really is.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseWheel, type WheelParams } from '$lib/schemas/wheel';
import { summarize } from '$lib/trade/summary';
import { wheelParams } from '../../../../tests/support/wheel-params';
import { wheelPdf } from './wheel-pdf';
import { wheelSvg } from './svg';

const dir = mkdtempSync(join(tmpdir(), 'phasewright-wheel-pdf-'));
let files = 0;

interface Word {
	text: string;
	x0: number;
	y0: number;
	x1: number;
	y1: number;
}
interface Page {
	width: number;
	height: number;
	words: Word[];
}

const unescape = (s: string) =>
	s
		.replace(/&lt;/g, '<')
		.replace(/&gt;/g, '>')
		.replace(/&quot;/g, '"')
		.replace(/&apos;/g, "'")
		.replace(/&amp;/g, '&');

/** Each page's word boxes (pt, y down), as poppler's pdftotext -bbox reports them. */
function pdfWords(pdf: Buffer): Page[] {
	const file = join(dir, `t${files++}.pdf`);
	writeFileSync(file, pdf);
	const html = execFileSync('pdftotext', ['-bbox', file, '-'], { encoding: 'utf8', maxBuffer: 64 << 20 });
	return html
		.split('<page ')
		.slice(1)
		.map((chunk) => {
			const [, w, h] = /width="([\d.]+)" height="([\d.]+)"/.exec(chunk)!;
			const words = [...chunk.matchAll(/<word xMin="([-\d.]+)" yMin="([-\d.]+)" xMax="([-\d.]+)" yMax="([-\d.]+)">(.*?)<\/word>/g)].map(
				(m) => ({
					x0: Number(m[1]),
					y0: Number(m[2]),
					x1: Number(m[3]),
					y1: Number(m[4]),
					text: unescape(m[5]!)
				})
			);
			return { width: Number(w), height: Number(h), words };
		});
}

/** Pairs of words whose boxes share more than a hair (0.01 pt) of area, per page; and words off the page. */
function overlaps(pages: Page[]): string[] {
	const found: string[] = [];
	pages.forEach((p, n) => {
		for (const w of p.words)
			if (w.x0 < -0.01 || w.y0 < -0.01 || w.x1 > p.width + 0.01 || w.y1 > p.height + 0.01)
				found.push(`page ${n + 1}: "${w.text}" off the page`);
		const ws = [...p.words].sort((a, b) => a.y0 - b.y0);
		for (let i = 0; i < ws.length; i++)
			for (let j = i + 1; j < ws.length && ws[j]!.y0 < ws[i]!.y1; j++) {
				const [a, b] = [ws[i]!, ws[j]!];
				const dx = Math.min(a.x1, b.x1) - Math.max(a.x0, b.x0);
				const dy = Math.min(a.y1, b.y1) - Math.max(a.y0, b.y0);
				if (dx > 0.01 && dy > 0.01)
					found.push(`page ${n + 1}: "${a.text}" [${a.x0},${a.y0},${a.x1},${a.y1}] and "${b.text}" [${b.x0},${b.y0},${b.x1},${b.y1}]`);
			}
	});
	return found;
}

async function template(params: WheelParams) {
	const parsed = parseWheel(params);
	if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
	const { spec, units, running, paper } = parsed.value;
	const s = summarize(spec, units, running);
	if (!s.ok) throw new Error(JSON.stringify(s.refusals));
	return { pdf: await wheelPdf(spec, s.summary, units, paper), spec, units, summary: s.summary };
}

const accepted = (p: WheelParams) => {
	const parsed = parseWheel(p);
	return parsed.ok && summarize(parsed.value.spec, parsed.value.units, parsed.value.running).ok;
};

// A label as long as the field allows (40 characters), wide letters and non-ASCII ones among them.
const longLabel = fc.constantFrom(
	'WWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWW',
	'Kawasaki Z1 crank 36-1 rev B, 2026-12-02',
	'MMMM mmmm WWWW wwww ÄÖÜ ß 0123456789 ....',
	'Übersetzung Kurbelwelle 60-2 / Zündung!!'
);

describe('the wheel PDF template, read by poppler', () => {
	it('never prints one word over another, on A4 and Letter (property test over generated wheels)', async () => {
		await fc.assert(
			fc.asyncProperty(
				wheelParams,
				fc.constantFrom('a4', 'letter'),
				fc.option(longLabel, { nil: undefined }),
				fc.constantFrom('1000', '8000', '20000'),
				async (p, paper, label, rpm) => {
					const params = { ...p, paper, rpm, ...(label === undefined ? {} : { label }) };
					fc.pre(accepted(params));
					const { pdf } = await template(params);
					const pages = pdfWords(pdf);
					expect(overlaps(pages)).toEqual([]);
					// Every page carries the calibration bar's caption (common practice for 1:1 prints).
					for (const page of pages) expect(page.words.map((w) => w.text)).toContain('100');
				}
			),
			{ numRuns: 40 }
		);
	}, 120_000);

	it.each(['a4', 'letter'])(
		'keeps a wrapped keyway row, two-line warnings and a long table apart, and flows it on (%s)',
		async (paper) => {
			// 60-2 on a narrow ring: a B17.1 keyway (its row wraps), a long label, thin web and shallow
			// teeth (warnings over two lines), 90 gaps listed (a Pattern row of many lines: page 2).
			const gaps = Array.from({ length: 90 }, (_, i) => 2 * i + 1).join(',');
			const { pdf } = await template({
				units: 'mm',
				pattern: 'custom',
				teeth: '240',
				gaps,
				od: '180',
				depth: '0.8',
				bore: '60',
				keyway: 'b17.1',
				shaft: '60',
				label: 'Kawasaki Z1 crank 36-1 rev B, 2026-12-02',
				rpm: '20000',
				paper
			});
			const pages = pdfWords(pdf);
			expect(pages.length).toBeGreaterThan(1);
			expect(overlaps(pages)).toEqual([]);
			const words = pages.flatMap((p) => p.words.map((w) => w.text));
			expect(words).toContain('continued');
			expect(words).toContain('Warnings');
			expect(words).toContain('Layers');
			for (const page of pages) expect(page.words.map((w) => w.text)).toContain('sharp');
		},
		30_000
	);
});

/** The words of the Layers row's value: right of its key, from its line down to the next key. */
function layersWords(pages: Page[]): string {
	for (const p of pages) {
		const key = p.words.find((w) => w.text === 'Layers');
		if (!key) continue;
		const next = p.words.filter((w) => Math.abs(w.x0 - key.x0) < 0.5 && w.y0 > key.y0 + 0.5).sort((a, b) => a.y0 - b.y0)[0];
		const end = next ? next.y0 : Infinity;
		return p.words
			.filter((w) => w.x0 > key.x1 + 5 && w.y0 > key.y0 - 0.5 && w.y0 < end - 0.5)
			.sort((a, b) => a.y0 - b.y0 || a.x0 - b.x0)
			.map((w) => w.text)
			.join(' ');
	}
	throw new Error('no Layers row');
}

/**
 * Degrees of rotation, from the moment the first tooth's leading edge passes a fixed pointer at 12
 * o'clock, until the etched mark passes it: a model of the wheel turning, read off the SVG's drawn
 * index mark (the etch path's outer end). Turning clockwise as drawn, a point at angle θ (y up)
 * reaches 12 o'clock after θ - 90 degrees; counter-clockwise, after 90 - θ. Geometry.
 */
function markLagDeg(params: WheelParams, rotation: 'cw' | 'ccw'): number {
	const parsed = parseWheel(params);
	if (!parsed.ok) throw new Error('refused');
	const svg = wheelSvg(parsed.value.spec, 'mm');
	const etch = /<g id="etch"[^>]*><path d="M([-\d.]+) ([-\d.]+)L/.exec(svg)!;
	const theta = (Math.atan2(-Number(etch[2]), Number(etch[1])) * 180) / Math.PI;
	const lag = rotation === 'cw' ? theta - 90 : 90 - theta;
	return ((lag % 360) + 360) % 360;
}

describe('the Layers row says where the index mark is (from the mark option)', () => {
	const base = { units: 'mm', teeth: '36', missing: '1', od: '120', depth: '5', bore: '20' };
	it.each([
		['0', 'cw', 'etch: blue index mark at the leading edge of the first tooth after the gap'],
		['0', 'ccw', 'etch: blue index mark at the leading edge of the first tooth after the gap'],
		[
			'90',
			'cw',
			'etch: blue index mark 90° after the leading edge of the first tooth after the gap (it passes a fixed point 90° of rotation later)'
		],
		[
			'90',
			'ccw',
			'etch: blue index mark 90° after the leading edge of the first tooth after the gap (it passes a fixed point 90° of rotation later)'
		],
		[
			'-30',
			'cw',
			'etch: blue index mark 30° before the leading edge of the first tooth after the gap (it passes a fixed point 30° of rotation earlier)'
		],
		[
			'330',
			'ccw',
			'etch: blue index mark 30° before the leading edge of the first tooth after the gap (it passes a fixed point 30° of rotation earlier)'
		],
		['none', 'cw', 'cut: red outline; nothing etched']
	] as const)('mark=%s, %s', async (mark, rotation, words) => {
		const params = { ...base, mark, rotation };
		const text = layersWords(pdfWords((await template(params)).pdf));
		expect(text).toContain(words);
		if (mark === 'none') {
			expect(text).not.toContain('index mark');
			expect(text).not.toContain('etch:');
			return;
		}
		// The drawing agrees: the model of the turning wheel puts the mark that many degrees after
		// (or, past half a turn, before) the first tooth at a fixed pointer.
		const lag = markLagDeg(params, rotation);
		const expected = ((Number(mark) % 360) + 360) % 360;
		expect(Math.abs(lag - expected) % 360).toBeLessThan(0.05);
	});

	it('names the label on the etch layer, and position 0 on a wheel with no gap', async () => {
		expect(layersWords(pdfWords((await template({ ...base, mark: 'none', label: 'crank' })).pdf))).toContain('etch: blue label');
		const cam = layersWords(
			pdfWords(
				(
					await template({
						units: 'mm',
						pattern: 'extra',
						teeth: '4',
						extraAfter: '0',
						duty: '0.2',
						od: '120',
						depth: '5',
						bore: '20',
						mark: '0'
					})
				).pdf
			)
		);
		expect(cam).toContain('index mark at the leading edge of tooth position 0');
		expect(cam).not.toContain('gap');
	});
});
