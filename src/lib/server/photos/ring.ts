// Sampling the ring of teeth: a polar grid laid over the outline (unit frame: ρ = 1 at the tips),
// normalised per angle against the wheel's own face just inside the teeth and the background just
// outside, so uneven light and either polarity read the same: t = 0 background, t = 1 metal.
import type { Outline } from './fit';

export interface Grey {
	data: Uint8Array;
	width: number;
	height: number;
	channels: number;
}

export interface Polar {
	na: number;
	radii: Float64Array;
	/** na rows of radii.length samples; NaN off the image. */
	values: Float32Array;
}

export function samplePolar(img: Grey, o: Outline, na: number, rhoFrom: number, rhoTo: number, k: number): Polar {
	const radii = new Float64Array(k).map((_, j) => rhoFrom + ((rhoTo - rhoFrom) * j) / (k - 1));
	const values = new Float32Array(na * k);
	const { data, width: w, height: h, channels: ch } = img;
	const [a11, a12, a21, a22] = o.A;
	for (let i = 0; i < na; i++) {
		const phi = (2 * Math.PI * i) / na;
		const c = Math.cos(phi);
		const s = Math.sin(phi);
		const dx = a11 * c + a12 * s;
		const dy = -(a21 * c + a22 * s);
		for (let j = 0; j < k; j++) {
			const x = o.cx + radii[j]! * dx;
			const y = o.cy + radii[j]! * dy;
			let v = NaN;
			if (x >= 0 && y >= 0 && x <= w - 1 && y <= h - 1) {
				const x0 = Math.min(Math.floor(x), w - 2);
				const y0 = Math.min(Math.floor(y), h - 2);
				const fx = x - x0;
				const fy = y - y0;
				const p = (y0 * w + x0) * ch;
				const top = data[p]! + fx * (data[p + ch]! - data[p]!);
				const q = p + w * ch;
				const bottom = data[q]! + fx * (data[q + ch]! - data[q]!);
				v = top + fy * (bottom - top);
			}
			values[i * k + j] = v;
		}
	}
	return { na, radii, values };
}

// Typed-array sort is numeric and far faster than a comparator on the thousands of samples per bin.
export const median = (a: ArrayLike<number>) => {
	if (!a.length) return NaN;
	const s = Float64Array.from(a).sort();
	const m = s.length >> 1;
	return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
};

/** The q-quantile (0..1) of the first m values of a scratch array (sorted in place). */
function quantile(vals: Float64Array, m: number, q: number): number {
	const s = vals.subarray(0, m).sort();
	return s[Math.min(m - 1, Math.max(0, Math.round(q * (m - 1))))]!;
}

/** Fills unknown bins round the circle from the nearest known ones on each side. */
function fillCircular(v: number[]): number[] {
	const n = v.length;
	const known = [...v.keys()].filter((i) => !Number.isNaN(v[i]!));
	if (!known.length) return v;
	return v.map((x, i) => {
		if (!Number.isNaN(x)) return x;
		let a = i;
		let b = i;
		while (Number.isNaN(v[(a - 1 + n) % n]!)) a--;
		while (Number.isNaN(v[(b + 1) % n]!)) b++;
		const va = v[(a - 1 + n) % n]!;
		const vb = v[(b + 1) % n]!;
		return va + ((vb - va) * (i - a + 1)) / (b - a + 2);
	});
}

/**
 * A band's brightness at every angle, at one or more quantiles over angular bins (so holes, marks
 * and noise do not move it), smoothed round the ring and interpolated back. Light changes slowly
 * round a wheel; teeth do not, so the bins are wide. Bins off the photo borrow from neighbours.
 */
function bandLevels(p: Polar, rhoFrom: number, rhoTo: number, qs: number[], bins = 72): Float64Array[] {
	const k = p.radii.length;
	let j0 = 0;
	while (j0 < k && p.radii[j0]! < rhoFrom) j0++;
	let j1 = k - 1;
	while (j1 >= 0 && p.radii[j1]! > rhoTo) j1--;
	const per = p.na / bins;
	// A few hundred samples per bin settle a quantile; more only costs time.
	const step = Math.max(1, Math.floor((per * (j1 - j0 + 1)) / 400));
	const vals = new Float64Array(Math.ceil(per + 1) * Math.max(0, j1 - j0 + 1));
	const raw = qs.map(() => new Array<number>(bins).fill(NaN));
	for (let b = 0; b < bins; b++) {
		let m = 0;
		let count = 0;
		for (let i = Math.floor(b * per); i < Math.floor((b + 1) * per); i++)
			for (let j = j0; j <= j1; j++) {
				if (count++ % step) continue;
				const v = p.values[i * k + j]!;
				if (!Number.isNaN(v)) vals[m++] = v;
			}
		if (m >= 8) qs.forEach((q, n) => (raw[n]![b] = quantile(vals, m, q)));
	}
	return raw.map((r) => {
		const filled = fillCircular(r);
		const smooth = filled.map((_, b) => (filled[(b - 1 + bins) % bins]! + 2 * filled[b]! + filled[(b + 1) % bins]!) / 4);
		const out = new Float64Array(p.na);
		for (let i = 0; i < p.na; i++) {
			const f = i / per - 0.5;
			const b0 = Math.floor(f);
			const u = f - b0;
			const v0 = smooth[(b0 + bins) % bins]!;
			out[i] = v0 + u * (smooth[(b0 + 1) % bins]! - v0);
		}
		return out;
	});
}

export interface Ring {
	polar: Polar;
	/** Normalised samples, same layout as polar.values: 0 background, 1 metal, NaN unknown. */
	t: Float32Array;
	lightOnDark: boolean;
	/** Median |metal - background| in grey levels. */
	contrast: number;
}

/**
 * t = (value - background) / (metal - background) per angle. The background is the median of a
 * band outside the tips. The metal is a quantile of a band inside them taken towards the metal's
 * side (bright for a light wheel, by `q`), so a big bore or holes in a wide band do not pull it to
 * the background. With `lightOnDark` unknown, the side that stands out more from it wins.
 */
export function normalise(polar: Polar, metal: [number, number], background: [number, number], lightOnDark?: boolean, q = 0.75): Ring {
	const [bg] = bandLevels(polar, background[0], background[1], [0.5]) as [Float64Array];
	const [dark, light] = bandLevels(polar, metal[0], metal[1], [1 - q, q]) as [Float64Array, Float64Array];
	const spread = (fg: Float64Array) => median(fg.map((v, i) => v - bg[i]!));
	const dLight = spread(light);
	const dDark = spread(dark);
	const isLight = lightOnDark ?? Math.abs(dLight) >= Math.abs(dDark);
	const fg = isLight ? light : dark;
	const k = polar.radii.length;
	const t = new Float32Array(polar.values.length);
	for (let i = 0; i < polar.na; i++) {
		const d = fg[i]! - bg[i]!;
		// Too little local contrast (or the wrong way round) to tell metal from background here.
		const ok = isLight ? d >= 6 : d <= -6;
		for (let j = 0; j < k; j++) t[i * k + j] = ok ? (polar.values[i * k + j]! - bg[i]!) / d : NaN;
	}
	return { polar, t, lightOnDark: isLight, contrast: Math.abs(isLight ? dLight : dDark) };
}

/** Per angle, ρ of the wheel's outer edge: the outermost crossing of t = ½ coming in from outside. */
export function boundary(ring: Ring): Float64Array {
	const { na, radii } = ring.polar;
	const k = radii.length;
	const out = new Float64Array(na).fill(NaN);
	const ts = new Float64Array(k);
	for (let i = 0; i < na; i++) {
		const row = i * k;
		for (let j = 0; j < k; j++) {
			const a = ring.t[row + Math.max(0, j - 1)]!;
			const b = ring.t[row + j]!;
			const c = ring.t[row + Math.min(k - 1, j + 1)]!;
			ts[j] = (a + b + c) / 3;
		}
		let top = k - 1;
		while (top > 0 && Number.isNaN(ts[top]!)) top--;
		if (!(ts[top]! < 0.5)) continue;
		for (let j = top - 1; j >= 0; j--) {
			const v = ts[j]!;
			if (Number.isNaN(v)) break;
			if (v >= 0.5) {
				const u = (v - 0.5) / (v - ts[j + 1]!);
				out[i] = radii[j]! + u * (radii[j + 1]! - radii[j]!);
				break;
			}
		}
	}
	return out;
}

/** The mean of t across a band of radii at every angle (the ring's profile); angles with no sample counted. */
export function bandMean(ring: Ring, rhoFrom: number, rhoTo: number): { profile: Float64Array | null; unknown: number } {
	const { na, radii } = ring.polar;
	const k = radii.length;
	const band = [...radii.keys()].filter((j) => radii[j]! >= rhoFrom && radii[j]! <= rhoTo);
	if (!band.length) return { profile: null, unknown: na };
	const profile = new Float64Array(na);
	let unknown = 0;
	for (let i = 0; i < na; i++) {
		let sum = 0;
		let m = 0;
		for (const j of band) {
			const v = ring.t[i * k + j]!;
			if (!Number.isNaN(v)) [sum, m] = [sum + v, m + 1];
		}
		profile[i] = m ? sum / m : 0;
		if (!m) unknown++;
	}
	return { profile, unknown };
}
