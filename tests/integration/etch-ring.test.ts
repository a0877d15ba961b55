// The degree ring etched on the wheel (parameter `etchRing`), read back from the DXF the API serves
// with ezdxf (tests/support/etch_ring.py) and checked against the turning-engine model
// (tests/support/turning-engine.ts): the index mark stands under the pointer at TDC, the crank
// turns the wheel past it, and the point that comes under the pointer θ before TDC must carry a
// major tick and the side word BTDC. The side words are told apart by their letters' closed
// contours, as the font draws them: B has two counters, A and D one, T and C none, so BTDC is 7
// outlines, ATDC 6 and TDC 4 (common typography).
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { faceUnderPointer, type Rotation } from '../support/turning-engine';

const app = process.env.APP_URL!;
const dir = mkdtempSync(join(tmpdir(), 'phasewright-etch-ring-'));
const script = join(import.meta.dirname, '..', 'support', 'etch_ring.py');

interface Ring {
	layers: string[];
	indexMark: number | null;
	ticks: { angle: number; spread: number; rOuter: number; rInner: number }[];
	outlines: { angle: number; r: number }[];
}

async function ringOf(params: Record<string, string>, name: string): Promise<Ring> {
	const res = await fetch(`${app}/api/v1/wheel.dxf?${new URLSearchParams(params)}`);
	expect(res.status, await res.clone().text()).toBe(200);
	const file = join(dir, `${name}.dxf`);
	writeFileSync(file, await res.text());
	return JSON.parse(execFileSync('/usr/bin/python3', [script, file, 'ETCH-DEGREES'], { encoding: 'utf8' })) as Ring;
}

const between = (a: number, b: number) => Math.abs(((((a - b) % 360) + 540) % 360) - 180);

const base = { units: 'mm', teeth: '36', missing: '1', od: '150', depth: '6', bore: '25', thickness: '4', etchRing: '110' };
const cases: { name: string; params: Record<string, string>; rotation: Rotation }[] = [
	{ name: 'cw, index mark at 0', params: { ...base, rotation: 'cw' }, rotation: 'cw' },
	{ name: 'ccw, index mark at 0', params: { ...base, rotation: 'ccw' }, rotation: 'ccw' },
	{ name: 'cw, index mark at 40°', params: { ...base, rotation: 'cw', mark: '40' }, rotation: 'cw' },
	{
		name: 'ccw, index mark at -75°, inches',
		params: { ...base, units: 'in', od: '6', depth: '1/4', bore: '1', thickness: '1/8', etchRing: '4 1/4', rotation: 'ccw', mark: '-75' },
		rotation: 'ccw'
	}
];

describe('etched degree ring in the wheel DXF (ezdxf) against the turning engine', () => {
	it.each(cases)('$name: on its own layer, a tick each degree, θ BTDC where the engine brings θ before TDC', async (c) => {
		const ring = await ringOf(c.params, c.name.replace(/\W+/g, '-'));
		expect(ring.layers).toContain('ETCH-DEGREES');
		expect(ring.indexMark).not.toBeNull();
		// 360 ticks, each radial (both ends on one ray), their outer ends on the ring's diameter.
		expect(ring.ticks.length).toBe(360);
		const outerR = Math.max(...ring.ticks.map((t) => t.rOuter));
		// The DXF's coordinates are rounded to its written decimals: on an inch ring that alone is about 2e-6.
		for (const t of ring.ticks) {
			expect(t.spread).toBeLessThan(1e-5);
			expect(Math.abs(t.rOuter - outerR)).toBeLessThan(1e-5);
		}
		const tickLength = (t: Ring['ticks'][number]) => t.rOuter - t.rInner;
		const lengths = [...new Set(ring.ticks.map((t) => tickLength(t).toFixed(3)))].map(Number).sort((a, b) => a - b);
		// Minor, mid (5°), major (10°) and the one TDC tick, longest.
		expect(lengths.length).toBe(4);
		const major = lengths[2]!;
		const tdc = ring.ticks.filter((t) => Math.abs(tickLength(t) - lengths[3]!) < 1e-3);
		expect(tdc.length).toBe(1);
		// TDC's tick on the index mark: at TDC the mark is under the pointer (the model's start).
		expect(between(tdc[0]!.angle, ring.indexMark!)).toBeLessThan(1e-5);

		const pointerAtDeg = ring.indexMark!;
		const engine = { rotation: c.rotation, pointerAtDeg };
		for (let theta = -170; theta <= 170; theta += 10) {
			// The wheel point under the pointer, θ from TDC: clockwise on the drawn face (anticlockwise degrees go the other way).
			const want = pointerAtDeg - faceUnderPointer(engine, theta);
			const tick = ring.ticks.filter((t) => between(t.angle, want) < 0.01);
			expect(tick.length, `a tick at ${want.toFixed(2)}° for ${theta}°`).toBe(1);
			expect(Math.abs(tickLength(tick[0]!) - (theta === 0 ? lengths[3]! : major))).toBeLessThan(1e-3);
			// The words on that ray: the number (outer) and the side word (inner), split at the largest radial gap.
			const words = ring.outlines.filter((o) => between(o.angle, want) < 4).sort((a, b) => b.r - a.r);
			let split = 1;
			for (let i = 1; i < words.length; i++) if (words[i - 1]!.r - words[i]!.r > words[split - 1]!.r - words[split]!.r) split = i;
			const side = words.length - split;
			expect({ theta, outlines: side }).toEqual({ theta, outlines: theta < 0 ? 7 : theta > 0 ? 6 : 4 });
		}
	});

	it('refuses a ring that does not fit, on the ring’s own field', async () => {
		const res = await fetch(`${app}/api/v1/wheel.dxf?${new URLSearchParams({ ...base, etchRing: '149' })}`);
		expect(res.status).toBe(400);
		const body = (await res.json()) as { refusals: { field: string; message: string }[] };
		expect(body.refusals.map((r) => r.field)).toEqual(['etchRing']);
	});

	it('leaves the DXF as it was without the parameter: no ring layer', async () => {
		const { etchRing: _, ...plain } = base;
		const res = await fetch(`${app}/api/v1/wheel.dxf?${new URLSearchParams(plain)}`);
		expect(await res.text()).not.toContain('ETCH-DEGREES');
	});
});
