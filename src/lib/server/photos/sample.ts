// One bilinear colour sample, shared by the edge rays and the polar grid over the ring of teeth.
import type { Grey } from './ring';

/** Every channel of img at (x, y), bilinear, into out[at .. at + channels); NaN there when (x, y) is off the image. */
export function sampleInto(img: Grey, x: number, y: number, out: Float32Array, at: number): void {
	const { data, width: w, height: h, channels: ch } = img;
	if (!(x >= 0 && y >= 0 && x <= w - 1 && y <= h - 1)) {
		for (let n = 0; n < ch; n++) out[at + n] = NaN;
		return;
	}
	const x0 = Math.min(Math.floor(x), w - 2);
	const y0 = Math.min(Math.floor(y), h - 2);
	const fx = x - x0;
	const fy = y - y0;
	for (let n = 0; n < ch; n++) {
		const p = (y0 * w + x0) * ch + n;
		const top = data[p]! + fx * (data[p + ch]! - data[p]!);
		const q = p + w * ch;
		const bottom = data[q]! + fx * (data[q + ch]! - data[q]!);
		out[at + n] = top + fy * (bottom - top);
	}
}
