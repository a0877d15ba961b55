// Every BTDC/ATDC label and distance the tape PDF and the timing-light card print, read back from
// the real files with poppler's pdftotext, against the turning-engine model
// (tests/support/turning-engine.ts: rigid rotation of the hub past a fixed pointer, arc length
// s = r·θ). Where each printed label sits along the tape is worked out from the print alone: the
// TDC label anchors its strip, the "join N" marks carry the scale from strip to strip, and 1 pt is
// 1/72 in (ISO 32000-1).
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { sideOf, underPointer, type Rotation } from '../support/turning-engine';

const app = process.env.APP_URL!;
const dir = mkdtempSync(join(tmpdir(), 'phasewright-turning-'));
const get = (path: string, params: Record<string, string>) => fetch(`${app}${path}?${new URLSearchParams(params)}`);
const MM_PER_PT = 25.4 / 72;

async function download(path: string, params: Record<string, string>, name: string): Promise<string> {
	const res = await get(path, params);
	expect(
		res.status,
		await res
			.clone()
			.text()
			.catch(() => '')
	).toBe(200);
	const file = join(dir, name);
	writeFileSync(file, Buffer.from(await res.arrayBuffer()));
	return file;
}

interface Word {
	text: string;
	x0: number;
	y0: number;
	x1: number;
	y1: number;
}

/** Words per page, in poppler's reading order, from `pdftotext -bbox` (points, y down). */
function wordsOf(pdf: string): Word[][] {
	const html = execFileSync('pdftotext', ['-bbox', pdf, '-'], { encoding: 'utf8' });
	const unescape = (s: string) =>
		s
			.replace(/&amp;/g, '&')
			.replace(/&lt;/g, '<')
			.replace(/&gt;/g, '>')
			.replace(/&quot;/g, '"')
			.replace(/&#39;/g, "'");
	return html
		.split('<page ')
		.slice(1)
		.map((page) =>
			[...page.matchAll(/<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)<\/word>/g)].map((m) => ({
				text: unescape(m[5]!),
				x0: Number(m[1]),
				y0: Number(m[2]),
				x1: Number(m[3]),
				y1: Number(m[4])
			}))
		);
}

const centre = (w: { x0: number; x1: number }) => (w.x0 + w.x1) / 2;

interface PrintedLabel {
	/** Along the tape from the printed TDC line, mm, toward the print's right. */
	tapeMm: number;
	value: number;
	side: string;
}

/**
 * Reads a tape PDF back: each strip found by its "strip N of M" line, the numbers with a side word
 * (BTDC / ATDC / TDC) centred under them as its labels, placed along the tape through the TDC
 * label and the join marks.
 */
function readTape(pdf: string) {
	const pages = wordsOf(pdf);
	const strips = new Map<
		number,
		{
			page: number;
			y: number;
			labels: { x: number; value: number; side: string }[];
			joins: Map<number, number>;
			named: { text: string; x0: number }[];
		}
	>();
	const joins: { page: number; join: number; x: number; y: number }[] = [];
	const named: { page: number; text: string; x0: number; y: number }[] = [];
	pages.forEach((words, p) => {
		words.forEach((w, i) => {
			const next = words.slice(i + 1, i + 4);
			if (w.text === 'strip' && next[1]?.text === 'of' && /^\d+$/.test(next[0]?.text ?? '')) {
				strips.set(Number(next[0]!.text), { page: p, y: w.y0, labels: [], joins: new Map(), named: [] });
			}
			if (w.text === 'join' && /^\d+$/.test(next[0]?.text ?? ''))
				joins.push({ page: p, join: Number(next[0]!.text), x: (w.x0 + next[0]!.x1) / 2, y: w.y0 });
			if (['idle', 'base', 'cyl'].includes(w.text)) {
				// A mark's whole name: the words that follow it on its line, close after each other.
				let text = w.text;
				for (let k = i + 1, last = w; k < words.length; k++) {
					const n = words[k]!;
					if (Math.abs(n.y0 - last.y0) > 0.5 || n.x0 - last.x1 > 4 || n.x0 < last.x1 - 0.5) break;
					text += ` ${n.text}`;
					last = n;
				}
				named.push({ page: p, text, x0: w.x0, y: w.y0 });
			}
		});
	});
	/** The strip a word belongs to: the first "strip N of M" line at or below it on its page, within a strip's height and a bit. */
	const stripOf = (page: number, y: number) => {
		let best: number | null = null;
		for (const [n, s] of strips) {
			if (s.page !== page || s.y < y - 1 / MM_PER_PT || s.y - y > 30 / MM_PER_PT) continue;
			if (best === null || s.y < strips.get(best)!.y) best = n;
		}
		return best;
	};
	pages.forEach((words, p) => {
		for (const w of words) {
			if (!/^\d+(\.\d+)?$/.test(w.text)) continue;
			const under = words.find(
				(s) =>
					['BTDC', 'ATDC', 'TDC'].includes(s.text) &&
					Math.abs(centre(s) - centre(w)) < 1.5 &&
					s.y0 > w.y1 - 0.5 &&
					s.y0 - w.y1 < 6 / MM_PER_PT
			);
			const n = under ? stripOf(p, w.y0) : null;
			if (under && n !== null) strips.get(n)!.labels.push({ x: centre(w), value: Number(w.text), side: under.text });
		}
	});
	for (const j of joins) {
		const n = stripOf(j.page, j.y);
		if (n !== null) strips.get(n)!.joins.set(j.join, j.x);
	}
	for (const m of named) {
		const n = stripOf(m.page, m.y);
		if (n !== null) strips.get(n)!.named.push({ text: m.text, x0: m.x0 });
	}

	// Anchor the strip with the TDC label, then walk the joins both ways.
	const anchor = new Map<number, { x: number; tapeMm: number }>();
	for (const [n, s] of strips) {
		const tdc = s.labels.find((l) => l.side === 'TDC');
		if (tdc) anchor.set(n, { x: tdc.x, tapeMm: 0 });
	}
	expect(anchor.size, 'one printed TDC label').toBeGreaterThanOrEqual(1);
	for (let changed = true; changed;) {
		changed = false;
		for (const [n, s] of strips) {
			const a = anchor.get(n);
			if (!a) continue;
			for (const [join, x] of s.joins) {
				const other = join === n ? n + 1 : n - 1; // join N links strip N to strip N + 1
				const ox = strips.get(other)?.joins.get(join);
				if (ox === undefined || anchor.has(other)) continue;
				anchor.set(other, { x: ox, tapeMm: a.tapeMm + (x - a.x) * MM_PER_PT });
				changed = true;
			}
		}
	}
	expect(anchor.size, 'every strip placed along the tape through its join marks').toBe(strips.size);
	const at = (n: number, x: number) => anchor.get(n)!.tapeMm + (x - anchor.get(n)!.x) * MM_PER_PT;
	const labels: PrintedLabel[] = [...strips].flatMap(([n, s]) =>
		s.labels.map((l) => ({ tapeMm: at(n, l.x), value: l.value, side: l.side }))
	);
	const marks = [...strips].flatMap(([n, s]) => s.named.map((m) => ({ text: m.text, tapeMm: at(n, m.x0), strip: n })));
	/** The stretch of tape each strip prints, as far as its whole labels show it. */
	const extents = [...strips].map(([n, s]) => {
		const along = s.labels.map((l) => at(n, l.x));
		return { strip: n, fromMm: Math.min(...along), toMm: Math.max(...along) };
	});
	return { strips: strips.size, pages: pages.length, labels, marks, extents };
}

interface TapeCase {
	name: string;
	params: Record<string, string>;
	hubDiameterMm: number;
	rotation: Rotation;
	windowDeg: number;
	labelDeg: number;
	pointerAtDeg: number;
	minStrips: number;
}

const cases: TapeCase[] = [
	{
		name: 'cw, 76.2 mm hub, ±60°, mm, A4',
		params: { diameter: '76.2', window: '60', rotation: 'cw', units: 'mm', paper: 'a4' },
		hubDiameterMm: 76.2,
		rotation: 'cw',
		windowDeg: 60,
		labelDeg: 10,
		pointerAtDeg: 90,
		minStrips: 1
	},
	{
		name: 'ccw, 76.2 mm hub, full circle, mm, A4',
		params: { diameter: '76.2', rotation: 'ccw', units: 'mm', paper: 'a4' },
		hubDiameterMm: 76.2,
		rotation: 'ccw',
		windowDeg: 180,
		labelDeg: 10,
		pointerAtDeg: 30,
		minStrips: 2
	},
	{
		name: 'cw, 3 in hub, full circle, in, Letter',
		params: { diameter: '3', rotation: 'cw', units: 'in', paper: 'letter' },
		hubDiameterMm: 76.2,
		rotation: 'cw',
		windowDeg: 180,
		labelDeg: 10,
		pointerAtDeg: 200,
		minStrips: 2
	},
	{
		name: 'ccw, 2 1/2 in hub, ±90°, in, Letter',
		params: { diameter: '2 1/2', window: '90', rotation: 'ccw', units: 'in', paper: 'letter' },
		hubDiameterMm: 63.5,
		rotation: 'ccw',
		windowDeg: 90,
		labelDeg: 10,
		pointerAtDeg: 90,
		minStrips: 1
	},
	{
		name: 'cw, 40 mm hub, ±90°, labels every 20°, A4',
		params: { diameter: '40', window: '90', tick: '2', mid: '10', label: '20', rotation: 'cw', units: 'mm', paper: 'a4' },
		hubDiameterMm: 40,
		rotation: 'cw',
		windowDeg: 90,
		labelDeg: 20,
		pointerAtDeg: 330,
		minStrips: 1
	},
	{
		name: 'cw, 1200 mm round a flywheel, full circle, A4, tiled over pages, with marks',
		params: { circumference: '1200', rotation: 'cw', units: 'mm', paper: 'a4', timing: 'idle:15', tdc2: 'cyl 2:270' },
		hubDiameterMm: 1200 / Math.PI,
		rotation: 'cw',
		windowDeg: 180,
		labelDeg: 10,
		pointerAtDeg: 90,
		minStrips: 7
	},
	{
		name: 'ccw, 20 in flywheel, full circle, in, Letter, tiled over pages',
		params: { diameter: '20', rotation: 'ccw', units: 'in', paper: 'letter' },
		hubDiameterMm: 508,
		rotation: 'ccw',
		windowDeg: 180,
		labelDeg: 10,
		pointerAtDeg: 270,
		minStrips: 9
	}
];

describe('degree tape PDF against the turning engine (pdftotext -bbox)', () => {
	it.each(cases)('$name: the label under the pointer reads θ BTDC before TDC and θ ATDC after', async (c) => {
		const pdf = await download('/api/v1/tape.pdf', c.params, `${c.name.replace(/[^\w]+/g, '-')}.pdf`);
		const tape = readTape(pdf);
		expect(tape.strips).toBeGreaterThanOrEqual(c.minStrips);
		const engine = { hubDiameterMm: c.hubDiameterMm, paperThicknessMm: 0.1, rotation: c.rotation, pointerAtDeg: c.pointerAtDeg };
		let checked = 0;
		for (let theta = -Math.floor((c.windowDeg - 1e-9) / c.labelDeg) * c.labelDeg; theta < c.windowDeg; theta += c.labelDeg) {
			const rounded = Math.round(theta * 1e6) / 1e6;
			const under = underPointer(engine, rounded);
			const near = tape.labels.filter((l) => Math.abs(l.tapeMm - under) < 0.3);
			expect(near.length, `a label at ${under.toFixed(2)} mm for ${rounded}°`).toBeGreaterThanOrEqual(1);
			for (const l of near) {
				expect({ crank: rounded, value: l.value, side: l.side }).toEqual({
					crank: rounded,
					value: Math.abs(rounded),
					side: rounded < 0 ? 'BTDC' : rounded > 0 ? 'ATDC' : 'TDC'
				});
			}
			checked++;
		}
		expect(checked).toBeGreaterThanOrEqual(8);
		// And no BTDC label anywhere on the ATDC side of the model, nor the other way round.
		const btdcTowardRight = underPointer(engine, -1) > 0;
		for (const l of tape.labels.filter((x) => x.side !== 'TDC')) expect(l.tapeMm > 0 === btdcTowardRight ? 'BTDC' : 'ATDC').toBe(l.side);

		if (c.params.timing) {
			// The named marks are printed 0.8 mm right of their line (the print's own layout): idle at 15° BTDC,
			// cylinder 2's TDC 270° after cylinder 1's, which is where the turning engine has it 90° before.
			const idle = tape.marks.filter((m) => m.text === 'idle');
			expect(idle.length).toBeGreaterThanOrEqual(1);
			for (const m of idle) expect(Math.abs(m.tapeMm - 0.8 - underPointer(engine, -15))).toBeLessThan(0.3);
			const cyl2 = tape.marks.filter((m) => m.text === 'cyl 2 TDC');
			expect(cyl2.length).toBeGreaterThanOrEqual(1);
			for (const m of cyl2) expect(Math.abs(m.tapeMm - 0.8 - underPointer(engine, 270))).toBeLessThan(0.3);
		}
	});

	it.each(['cw', 'ccw'] as const)(
		'%s: a 270° twin’s marks, each cylinder’s TDC and spec timing, in every strip that holds them',
		async (rotation) => {
			// A 150 mm hub, full circle, A4: tiled into strips that overlap. Cylinder 2 reaches TDC 270°
			// after cylinder 1 (a 270° twin, common practice), and fires 10° before that, at 260°.
			const params = { diameter: '150', rotation, paper: 'a4', tdc2: 'cyl 2:270', timing: 'base:10' };
			const tape = readTape(await download('/api/v1/tape.pdf', params, `twin-${rotation}.pdf`));
			const engine = { hubDiameterMm: 150, paperThicknessMm: 0.1, rotation };
			const expected = [
				{ text: 'base', crank: -10 },
				{ text: 'cyl 2 TDC', crank: 270 },
				{ text: 'cyl 2: base 10° BTDC', crank: 260 }
			];
			let overlapSeen = false;
			for (const { text, crank } of expected) {
				const want = underPointer(engine, crank);
				// Every strip whose printed scale runs over the mark's place shows it there (0.8 mm right of its line).
				const holding = tape.extents.filter((e) => e.fromMm - 0.5 <= want && want <= e.toMm + 0.5).map((e) => e.strip);
				expect(holding.length, `${text}: a strip holds ${want.toFixed(2)} mm`).toBeGreaterThanOrEqual(1);
				const found = tape.marks.filter((m) => m.text === text);
				for (const strip of holding) {
					const there = found.filter((m) => m.strip === strip);
					expect(there.length, `${text} on strip ${strip}`).toBe(1);
					expect(Math.abs(there[0]!.tapeMm - 0.8 - want)).toBeLessThan(0.3);
				}
				for (const m of found) expect(Math.abs(m.tapeMm - 0.8 - want), `${text} on strip ${m.strip}`).toBeLessThan(0.3);
				if (holding.length > 1) overlapSeen = true;
			}
			// Turning clockwise, cylinder 2's TDC lies 270 × π·150.1/360 ≈ 354 mm along the tape, in the
			// overlap of strips 2 and 3 (each A4 strip 186 mm, 12 mm overlap): printed on both.
			if (rotation === 'cw') expect(overlapSeen).toBe(true);
		}
	);

	it('says which marks a narrow window leaves off instead of dropping them', async () => {
		const params = { diameter: '150', rotation: 'cw', window: '60', tdc2: 'cyl 2:270', timing: 'base:10' };
		const pdf = await download('/api/v1/tape.pdf', params, 'twin-window-60.pdf');
		const text = execFileSync('pdftotext', [pdf, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
		// 270° after cylinder 1's TDC is 90° before it on a hub turning once per crank turn: past a ±60° window.
		expect(text).toContain(
			"cyl 2 TDC at 270° after cylinder 1's TDC, 90° BTDC on this scale: outside this tape's 60° BTDC to 60° ATDC window"
		);
		expect(text).toContain("cyl 2: base 10° BTDC at 260° after cylinder 1's TDC, 100° BTDC on this scale: outside this tape's");
		// Cylinder 1's own timing at 10° BTDC is on the tape, and said nowhere as outside.
		expect(readTape(pdf).marks.filter((m) => m.text === 'base').length).toBeGreaterThanOrEqual(1);
		expect(text).not.toMatch(/base at 10° BTDC: outside/);
	});

	it.each(['cw', 'ccw'] as const)('/api/v1/tape says in words on which side BTDC lies (%s), as the model has it', async (rotation) => {
		const body = await (await get('/api/v1/tape', { diameter: '100', rotation })).json();
		const side = sideOf(underPointer({ hubDiameterMm: 100, paperThicknessMm: 0.1, rotation }, -10));
		expect(body.rotation).toBe(rotation);
		expect(body.btdcSide).toBe(side);
		expect(body.sides).toContain(`BTDC numbers sit to the ${side} of 0`);
		expect(body.sides).toContain(side === 'right' ? 'left to right' : 'right to left');
		expect(body.fitting).toMatch(/top edge .* toward the engine .* bottom edge toward the wheel face/);
	});

	it('the printed words say the same side as the printed labels', async () => {
		for (const rotation of ['cw', 'ccw'] as const) {
			const pdf = await download('/api/v1/tape.pdf', { diameter: '76.2', window: '45', rotation }, `words-${rotation}.pdf`);
			const text = execFileSync('pdftotext', [pdf, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
			const side = sideOf(underPointer({ hubDiameterMm: 76.2, paperThicknessMm: 0.1, rotation }, -10));
			expect(text).toContain(`BTDC numbers sit to the ${side} of 0`);
			expect(text).toContain('top edge (the header side of the print) toward the engine');
			expect(text).toContain('WHEEL FACE');
		}
	});
});

describe('timing-light card against the turning engine (pdftotext -layout)', () => {
	it.each(['cw', 'ccw'] as const)('%s: carries the name given and the direction the marks pass the pointer', async (rotation) => {
		const pdf = await download(
			'/api/v1/timing-card.pdf',
			{ diameter: '150', rotation, curve: '1200:10, 3000:20', name: 'Whole sheet 270 twin' },
			`card-named-${rotation}.pdf`
		);
		const text = execFileSync('pdftotext', [pdf, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
		expect(text).toContain('Timing-light card: Whole sheet 270 twin');
		// The model: as the crank turns on (θ growing) the point under the pointer moves along the tape;
		// the tape itself moves the other way past the pointer.
		const engine = { hubDiameterMm: 150, paperThicknessMm: 0.1, rotation };
		const tapeMoves = underPointer(engine, 10) - underPointer(engine, 0) < 0 ? 'left to right' : 'right to left';
		expect(text).toContain(`Direction of travel: the tape moves ${tapeMoves} past the pointer`);
		const btdc = sideOf(underPointer(engine, -10));
		expect(text).toContain(`BTDC marks (${btdc} of TDC) reach it first`);
	});

	it.each([
		['cw', 'mm', '150', 150.0],
		['ccw', 'mm', '150', 150.0],
		['cw', 'in', '5 1/2', 139.7],
		['ccw', 'in', '3', 76.2]
	] as const)(
		'%s, %s, hub %s: each mark’s distance and side of TDC is where the engine brings it under the pointer',
		async (rotation, units, diameter, diameterMm) => {
			const curve = [
				[800, -5],
				[900, 0],
				[1200, 10],
				[3000, 20],
				[6000, 32.5]
			] as const;
			const pdf = await download(
				'/api/v1/timing-card.pdf',
				{ diameter, units, rotation, curve: curve.map(([r, a]) => `${r}:${a}`).join(', ') },
				`card-${rotation}-${units}.pdf`
			);
			const text = execFileSync('pdftotext', ['-layout', pdf, '-'], { encoding: 'utf8' });
			const engine = { hubDiameterMm: diameterMm, paperThicknessMm: 0.1, rotation };
			for (const [rpm, advance] of curve) {
				const row = new RegExp(
					`${rpm} rpm\\s+(TDC|([\\d.]+)° (BTDC|ATDC))\\s+(on the TDC line|([\\d.]+) (mm|in) (left|right) of TDC)`
				).exec(text);
				expect(row, `row for ${rpm} rpm`).not.toBeNull();
				const want = underPointer(engine, -advance); // the light freezes the crank `advance` degrees before TDC
				if (advance === 0) {
					expect(row![1]).toBe('TDC');
					expect(row![4]).toBe('on the TDC line');
					continue;
				}
				expect(Number(row![2])).toBe(Math.abs(advance));
				expect(row![3]).toBe(advance > 0 ? 'BTDC' : 'ATDC');
				expect(row![6]).toBe(units);
				expect(row![7]).toBe(sideOf(want));
				// Printed to 0.1 mm or 0.001 in.
				const printedMm = Number(row![5]) * (units === 'in' ? 25.4 : 1);
				expect(Math.abs(printedMm - Math.abs(want))).toBeLessThan(units === 'in' ? 0.0006 * 25.4 + 0.01 : 0.06);
			}
		}
	);
});
