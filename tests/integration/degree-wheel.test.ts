// The printed degree wheel (GET /api/v1/degree-wheel.pdf) read back from the real PDF with poppler's
// `pdftotext -bbox`, against the turning-engine model (tests/support/turning-engine.ts: rigid
// rotation of the hub past a fixed pointer). The disc's centre is found from the print alone (a
// least-squares circle through the printed numbers); each number's angle round it is where the
// model brings that crank angle under the pointer, with the side word printed under it. The
// calibration bars are measured between their printed end labels: 1 pt = 1/72 in (ISO 32000-1).
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { faceUnderPointer, type Rotation } from '../support/turning-engine';

const app = process.env.APP_URL!;
const dir = mkdtempSync(join(tmpdir(), 'phasewright-degree-wheel-'));
const MM_PER_PT = 25.4 / 72;

interface Word {
	text: string;
	x: number;
	y: number;
	y0: number;
}

async function download(params: Record<string, string>, name: string): Promise<Word[]> {
	const res = await fetch(`${app}/api/v1/degree-wheel.pdf?${new URLSearchParams(params)}`);
	expect(res.status, await res.clone().text()).toBe(200);
	expect(res.headers.get('content-type')).toBe('application/pdf');
	const file = join(dir, name);
	writeFileSync(file, Buffer.from(await res.arrayBuffer()));
	const html = execFileSync('pdftotext', ['-bbox', file, '-'], { encoding: 'utf8' });
	return [...html.matchAll(/<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)<\/word>/g)].map((m) => ({
		text: m[5]!,
		x: (Number(m[1]) + Number(m[3])) / 2,
		y: (Number(m[2]) + Number(m[4])) / 2,
		y0: Number(m[2])
	}));
}

/** Kåsa's least-squares circle through points: x² + y² + Dx + Ey + F = 0, solved by Cramer's rule. */
function circleThrough(points: { x: number; y: number }[]): { cx: number; cy: number; r: number } {
	let [sx, sy, sxx, syy, sxy, sz, sxz, syz] = [0, 0, 0, 0, 0, 0, 0, 0];
	for (const { x, y } of points) {
		const z = x * x + y * y;
		[sx, sy, sxx, syy, sxy, sz, sxz, syz] = [sx + x, sy + y, sxx + x * x, syy + y * y, sxy + x * y, sz + z, sxz + x * z, syz + y * z];
	}
	const n = points.length;
	const A = [
		[sxx, sxy, sx],
		[sxy, syy, sy],
		[sx, sy, n]
	];
	const b = [-sxz, -syz, -sz];
	const det = (m: number[][]) =>
		m[0]![0]! * (m[1]![1]! * m[2]![2]! - m[1]![2]! * m[2]![1]!) -
		m[0]![1]! * (m[1]![0]! * m[2]![2]! - m[1]![2]! * m[2]![0]!) +
		m[0]![2]! * (m[1]![0]! * m[2]![1]! - m[1]![1]! * m[2]![0]!);
	const d = det(A);
	const [D, E, F] = [0, 1, 2].map((k) => det(A.map((row, i) => row.map((v, j) => (j === k ? b[i]! : v)))) / d);
	const cx = -D! / 2;
	const cy = -E! / 2;
	return { cx, cy, r: Math.sqrt(cx * cx + cy * cy - F!) };
}

/** The printed numbers with a side word (BTDC / ATDC / TDC) the nearest word toward the centre, each with its angle clockwise from up. */
function readDisc(words: Word[]) {
	const sides = words.filter((w) => ['BTDC', 'ATDC', 'TDC'].includes(w.text));
	const numbers = words.filter((w) => /^\d+$/.test(w.text));
	// Numbers on the disc are the ones with a side word within 6 mm; the bars' labels have none.
	const near = (w: Word) =>
		sides.map((s) => ({ s, d: Math.hypot(s.x - w.x, s.y - w.y) })).sort((a, b) => a.d - b.d)[0] ?? { s: null, d: Infinity };
	const onDisc = numbers.filter((w) => near(w).d < 6 / MM_PER_PT);
	const centre = circleThrough(onDisc);
	return {
		centre,
		labels: onDisc.map((w) => {
			const s = near(w).s!;
			// Clockwise from up on the page (y grows downward in pdftotext's boxes).
			const clockwise = (Math.atan2(w.x - centre.cx, centre.cy - w.y) * 180) / Math.PI;
			const inward = Math.hypot(s.x - centre.cx, s.y - centre.cy) < Math.hypot(w.x - centre.cx, w.y - centre.cy);
			return { value: Number(w.text), side: s.text, clockwise, inward };
		})
	};
}

const angleBetween = (a: number, b: number) => Math.abs(((((a - b) % 360) + 540) % 360) - 180);

const cases: { name: string; params: Record<string, string>; rotation: Rotation; discMm: number }[] = [
	{ name: 'cw, 150 mm, A4', params: { diameter: '150', rotation: 'cw', paper: 'a4' }, rotation: 'cw', discMm: 150 },
	{ name: 'ccw, 150 mm, A4', params: { diameter: '150', rotation: 'ccw', paper: 'a4' }, rotation: 'ccw', discMm: 150 },
	{
		name: 'cw, 6 in, 1 in shaft, Letter, inches',
		params: { diameter: '6', shaft: '1', units: 'in', rotation: 'cw', paper: 'letter' },
		rotation: 'cw',
		discMm: 152.4
	},
	{ name: 'ccw, 100 mm, ±90°, A4', params: { diameter: '100', window: '90', rotation: 'ccw' }, rotation: 'ccw', discMm: 100 }
];

describe('degree wheel PDF against the turning engine (pdftotext -bbox)', () => {
	it.each(cases)('$name: the number reaching the pointer θ before TDC reads θ BTDC, after TDC θ ATDC', async (c) => {
		const disc = readDisc(await download(c.params, `${c.name.replace(/\W+/g, '-')}.pdf`));
		// The numbers sit inside the disc's edge (the disc is the hub's diameter).
		expect(disc.centre.r * MM_PER_PT).toBeLessThan(c.discMm / 2);
		expect(disc.centre.r * MM_PER_PT).toBeGreaterThan(c.discMm / 2 - 20);
		const windowDeg = Number(c.params.window ?? 180);
		let checked = 0;
		// The pointer anywhere round the hub: the scale reads the same, since the disc is glued with 0 under it at TDC.
		for (const pointerAtDeg of [90, 200]) {
			for (let theta = -Math.min(170, windowDeg); theta <= Math.min(170, windowDeg); theta += 10) {
				const want = faceUnderPointer({ rotation: c.rotation, pointerAtDeg }, theta);
				const there = disc.labels.filter((l) => angleBetween(l.clockwise, want) < 1);
				expect(there.length, `a number at ${want.toFixed(1)}° for ${theta}°`).toBe(1);
				expect({ theta, value: there[0]!.value, side: there[0]!.side, inward: there[0]!.inward }).toEqual({
					theta,
					value: Math.abs(theta),
					side: theta < 0 ? 'BTDC' : theta > 0 ? 'ATDC' : 'TDC',
					inward: true
				});
				checked++;
			}
		}
		expect(checked).toBeGreaterThanOrEqual(36);
		// No BTDC label on the model's ATDC side, nor the other way round.
		const btdcClockwise = faceUnderPointer({ rotation: c.rotation }, -10) > 0;
		for (const l of disc.labels.filter((x) => x.side !== 'TDC' && x.value !== 180))
			expect(l.clockwise > 0 === btdcClockwise ? 'BTDC' : 'ATDC', `${l.value} at ${l.clockwise.toFixed(1)}°`).toBe(l.side);
	});

	it.each(['cw', 'ccw'] as const)(
		'%s: says in words which way it turns and on which side BTDC lies, as the model has it',
		async (rotation) => {
			const res = await fetch(`${app}/api/v1/degree-wheel.pdf?${new URLSearchParams({ diameter: '120', rotation })}`);
			const file = join(dir, `words-${rotation}.pdf`);
			writeFileSync(file, Buffer.from(await res.arrayBuffer()));
			const text = execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
			const side = faceUnderPointer({ rotation }, -10) > 0 ? 'clockwise' : 'counter-clockwise';
			expect(text).toContain(`BTDC numbers sit ${side} of 0`);
			expect(text).toContain(`turns ${rotation === 'cw' ? 'clockwise' : 'counter-clockwise'}`);
			expect(text).toContain('Print at 100% / actual size');
			expect(text).toContain('Verify timing with a timing light before load');
		}
	);

	it('prints at 1:1: the 100 mm and 4 in bars measure 100 mm and 101.6 mm between their end labels', async () => {
		const words = await download({ diameter: '150' }, 'bars.pdf');
		const row = (labels: string[]) => {
			const rows = words.filter((w) => w.text === labels[0]).map((first) => words.filter((w) => Math.abs(w.y0 - first.y0) < 0.5));
			const found = rows.find((r) => labels.every((l) => r.some((w) => w.text === l)));
			expect(found, `a row of ${labels.join(' ')}`).toBeDefined();
			return found!;
		};
		const mmRow = row(['0', '10', '20', '30', '40', '50', '60', '70', '80', '90', '100']);
		const mmBar = (mmRow.find((w) => w.text === '100')!.x - mmRow.find((w) => w.text === '0')!.x) * MM_PER_PT;
		expect(Math.abs(mmBar - 100)).toBeLessThan(0.1);
		const inRow = row(['0', '1', '2', '3', '4']);
		const inBar = (inRow.find((w) => w.text === '4')!.x - inRow.find((w) => w.text === '0')!.x) * MM_PER_PT;
		expect(Math.abs(inBar - 101.6)).toBeLessThan(0.1);
	});

	it('refuses what cannot be printed, naming the field', async () => {
		const refusals = async (params: Record<string, string>) => {
			const res = await fetch(`${app}/api/v1/degree-wheel.pdf?${new URLSearchParams(params)}`);
			expect(res.status).toBe(400);
			return ((await res.json()) as { refusals: { field: string }[] }).refusals.map((r) => r.field);
		};
		expect(await refusals({ diameter: '400' })).toEqual(['diameter']); // wider than A4
		expect(await refusals({ diameter: '150', shaft: '140' })).toEqual(['shaft']); // through the marks
		expect(await refusals({})).toEqual(['diameter']);
		expect(await refusals({ diameter: '150', shaft: 'wide' })).toContain('shaft');
	});
});
