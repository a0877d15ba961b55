// The tip outline sharpened from the ring, on a wheel drawn here pixel by pixel: a 36-1 of light
// metal on a green mat seen as an ellipse (its centre, axes and turn chosen by hand), with a bright
// mat line just outside its tips. The outline it starts from is the drawing's own moved and grown
// by hand; the expected outline is the drawing's.
import { describe, expect, it } from 'vitest';
import type { Ellipse } from './conic';
import { outlineFromRing } from './outline';
import { affinePose } from './plane';
import type { Grey } from './ring';

const truth: Ellipse = { cx: 400, cy: 410, a: 300, b: 270, angleDeg: 20 };

function drawWheel(): Grey {
	const [width, height] = [800, 820];
	const data = new Uint8Array(width * height * 3);
	const t = (truth.angleDeg * Math.PI) / 180;
	const [teeth, missing, duty, root] = [36, 1, 0.5, 0.9];
	for (let y = 0; y < height; y++)
		for (let x = 0; x < width; x++) {
			// Image px (y down) to the wheel's unit frame (y up, ρ = 1 at the tips).
			const dx = x - truth.cx;
			const dy = truth.cy - y;
			const u = (dx * Math.cos(t) + dy * Math.sin(t)) / truth.a;
			const v = (-dx * Math.sin(t) + dy * Math.cos(t)) / truth.b;
			const rho = Math.hypot(u, v);
			const turn = ((Math.atan2(v, u) / (2 * Math.PI)) % 1) + 1;
			const pos = (turn % 1) * teeth;
			const tooth = Math.floor(pos) < teeth - missing && pos - Math.floor(pos) < duty;
			const metal = rho <= root || (rho <= 1 && tooth);
			// A mat's bright grid line crossing the background just outside the tips.
			const line = !metal && Math.abs(rho - 1.06) < 0.006;
			const c = metal ? [200, 200, 205] : line ? [220, 235, 220] : [60, 140, 90];
			data.set(c, (y * width + x) * 3);
		}
	return { data, width, height, channels: 3 };
}

describe('outlineFromRing', () => {
	it('brings an outline 12 px off and 4 % large back onto the tips, the mat line outside them left out', () => {
		const img = drawWheel();
		const off: Ellipse = { cx: truth.cx + 10, cy: truth.cy - 7, a: truth.a * 1.04, b: truth.b * 1.04, angleDeg: 25 };
		const r = outlineFromRing(img, affinePose(off.cx, off.cy, off.a, off.b, off.angleDeg), off.a);
		expect(r).not.toBeNull();
		const el = r!.ellipse;
		// Within a pixel and a half of the drawn centre and one per cent of its axes (the drawing is
		// not anti-aliased: its edges are up to a pixel off the ideal ellipse).
		expect(Math.hypot(el.cx - truth.cx, el.cy - truth.cy)).toBeLessThan(1.5);
		expect(Math.abs(el.a / truth.a - 1)).toBeLessThan(0.01);
		expect(Math.abs(el.b / truth.b - 1)).toBeLessThan(0.01);
	});

	it('gives nothing on a plain disc: no tips stand out from the roots', () => {
		const [width, height] = [600, 600];
		const data = new Uint8Array(width * height * 3);
		for (let y = 0; y < height; y++)
			for (let x = 0; x < width; x++) data.set(Math.hypot(x - 300, y - 300) <= 200 ? [200, 200, 205] : [60, 140, 90], (y * width + x) * 3);
		expect(outlineFromRing({ data, width, height, channels: 3 }, affinePose(300, 300, 200, 200, 0), 200)).toBeNull();
	});
});
