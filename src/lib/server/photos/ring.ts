// Sampling the ring of teeth: a polar grid laid over the wheel's plane (unit frame: ρ = 1 at the
// tips, mapped to the photo by a homography), in colour, then projected per angle onto the line
// from the background's colour to the metal's, so a steel wheel on an aluminium cover or a gold
// wheel on a grey one reads as well as black on white; then normalised per angle against the
// wheel's own face just inside the teeth and the background just outside, so uneven light reads
// the same: t = 0 background, t = 1 metal.
import type { Homography } from './plane';
import { sampleInto } from './sample';

/** A decoded image: 1 (grey) or 3 (RGB) channels, interleaved. */
export interface Grey {
	data: Uint8Array;
	width: number;
	height: number;
	channels: number;
}

export interface Polar {
	na: number;
	radii: Float64Array;
	/** na rows of radii.length samples of `channels` values each; NaN off the image. */
	values: Float32Array;
	channels: number;
}

/** Samples the image on na angles x k radii of the unit frame, bilinear, every channel. */
export function samplePolar(img: Grey, h: Homography, na: number, rhoFrom: number, rhoTo: number, k: number): Polar {
	const radii = new Float64Array(k).map((_, j) => rhoFrom + ((rhoTo - rhoFrom) * j) / (k - 1));
	const ch = img.channels;
	const values = new Float32Array(na * k * ch);
	for (let i = 0; i < na; i++) {
		const phi = (2 * Math.PI * i) / na;
		const c = Math.cos(phi);
		const s = Math.sin(phi);
		for (let j = 0; j < k; j++) {
			const u = radii[j]! * c;
			const v = radii[j]! * s;
			const den = h[6] * u + h[7] * v + h[8];
			sampleInto(img, (h[0] * u + h[1] * v + h[2]) / den, (h[3] * u + h[4] * v + h[5]) / den, values, (i * k + j) * ch);
		}
	}
	return { na, radii, values, channels: ch };
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

/** Raw quantiles of a band over angular bins (NaN where a bin has too few samples). */
function binLevels(p: Polar, rhoFrom: number, rhoTo: number, qs: number[], bins: number): number[][] {
	const k = p.radii.length;
	const ch = p.channels;
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
				const v = p.values[(i * k + j) * ch]!;
				if (!Number.isNaN(v)) vals[m++] = v;
			}
		if (m >= 8) qs.forEach((q, n) => (raw[n]![b] = quantile(vals, m, q)));
	}
	return raw;
}

/** Bin levels filled across unknown bins, smoothed round the ring and interpolated to every angle. */
function spread(r: number[], na: number): Float64Array {
	const bins = r.length;
	const per = na / bins;
	const filled = fillCircular(r);
	const smooth = filled.map((_, b) => (filled[(b - 1 + bins) % bins]! + 2 * filled[b]! + filled[(b + 1) % bins]!) / 4);
	const out = new Float64Array(na);
	for (let i = 0; i < na; i++) {
		const f = i / per - 0.5;
		const b0 = Math.floor(f);
		const u = f - b0;
		const v0 = smooth[(b0 + bins) % bins]!;
		out[i] = v0 + u * (smooth[(b0 + 1) % bins]! - v0);
	}
	return out;
}

/**
 * A band's brightness at every angle, at one or more quantiles over angular bins (so holes, marks
 * and noise do not move it), smoothed round the ring and interpolated back. Light changes slowly
 * round a wheel; teeth do not, so the bins are wide. Bins off the photo borrow from neighbours.
 */
function bandLevels(p: Polar, rhoFrom: number, rhoTo: number, qs: number[], bins = 72): Float64Array[] {
	return binLevels(p, rhoFrom, rhoTo, qs, bins).map((r) => spread(r, p.na));
}

/**
 * The metal's colour per bin: the mean of the band's samples farthest from the background's colour
 * (the top 40 %), so a bore, holes or a thin ring in the band do not pull it towards the background.
 */
function metalColours(p: Polar, band: [number, number], bins: number, bg: (n: number, b: number) => number): number[][] {
	const k = p.radii.length;
	const ch = p.channels;
	const js = [...p.radii.keys()].filter((j) => p.radii[j]! >= band[0] && p.radii[j]! <= band[1]);
	const per = p.na / bins;
	const out = Array.from({ length: ch }, () => new Array<number>(bins).fill(NaN));
	const dist: number[] = [];
	const at: number[] = [];
	for (let b = 0; b < bins; b++) {
		dist.length = 0;
		at.length = 0;
		for (let i = Math.floor(b * per); i < Math.floor((b + 1) * per); i += 2)
			for (const j of js) {
				const q = (i * k + j) * ch;
				if (Number.isNaN(p.values[q]!)) continue;
				let d2 = 0;
				for (let n = 0; n < ch; n++) d2 += (p.values[q + n]! - bg(n, b)) ** 2;
				dist.push(d2);
				at.push(q);
			}
		if (dist.length < 8) continue;
		const cut = Float64Array.from(dist).sort()[Math.floor(dist.length * 0.6)]!;
		const sum = new Array<number>(ch).fill(0);
		let m = 0;
		for (let x = 0; x < dist.length; x++) {
			if (dist[x]! < cut) continue;
			for (let n = 0; n < ch; n++) sum[n]! += p.values[at[x]! + n]!;
			m++;
		}
		for (let n = 0; n < ch; n++) out[n]![b] = sum[n]! / m;
	}
	return out;
}

/** One channel of a polar grid. */
function channelOf(p: Polar, n: number): Polar {
	const values = new Float32Array(p.values.length / p.channels);
	for (let i = 0; i < values.length; i++) values[i] = p.values[i * p.channels + n]!;
	return { na: p.na, radii: p.radii, values, channels: 1 };
}

export interface Projected {
	/** One value per sample: its colour's distance from the background's along the line to the metal's, in levels. */
	polar: Polar;
	lightOnDark: boolean;
	/** Colour distance between metal and background, median round the ring, in levels. */
	contrast: number;
	/** Per angular bin: false where the rim is hidden (a finger, a bracket) or lost in shadow or glare. */
	seen: boolean[];
	/**
	 * The same samples with those off the line kept: a tooth's bevelled flank, lit or in shadow, is
	 * off it too, and reads as metal or background by where it lies along the line.
	 */
	whole: Polar;
}

/** How far off the background's hue a shadow may be, as a fraction of its brightness. */
const SHADOW_HUE = 0.08;

/** A sample that is the background's colour at 20-93 % of its brightness (JPEG noise allowed). */
function isShadow(values: Float32Array, at: number, ch: number, bg: Float64Array[], i: number, b2: number, bLen: number): boolean {
	let cb = 0;
	for (let n = 0; n < ch; n++) cb += values[at + n]! * bg[n]![i]!;
	const kc = cb / b2;
	if (!(kc >= 0.2 && kc <= 0.93)) return false;
	let r = 0;
	for (let n = 0; n < ch; n++) r += (values[at + n]! - kc * bg[n]![i]!) ** 2;
	return Math.sqrt(r) <= SHADOW_HUE * kc * bLen + 4;
}

/**
 * The colour samples reduced to one number each: how far along the line from the background's
 * colour to the metal's (per angle) a sample lies. A bin whose bands do not show the metal and the
 * background apart, the way the rest of the ring does, is unseen; a sample far off that line
 * (neither metal nor background) is unknown.
 */
export function projectColour(p: Polar, metal: [number, number], background: [number, number], bins = 72): Projected {
	const ch = p.channels;
	const channels = Array.from({ length: ch }, (_, n) => channelOf(p, n));
	const bgRaw = channels.map((c) => binLevels(c, background[0], background[1], [0.5], bins)[0]!);
	const bgAll = bgRaw.map((r) => median(r.filter((v) => !Number.isNaN(v))));
	// A bin whose background lies in the wheel's own shadow takes its neighbours' lit background.
	if (ch === 3) {
		const lit = bgAll.map((v) => Float64Array.of(v));
		const l2 = bgAll.reduce((a, v) => a + v * v, 0);
		const one = new Float32Array(ch);
		for (let b = 0; b < bins; b++) {
			for (let n = 0; n < ch; n++) one[n] = bgRaw[n]![b]!;
			if (isShadow(one, 0, ch, lit, 0, l2, Math.sqrt(l2))) for (let n = 0; n < ch; n++) bgRaw[n]![b] = NaN;
		}
	}
	const fgRaw = metalColours(p, metal, bins, (n, b) => (Number.isNaN(bgRaw[n]![b]!) ? bgAll[n]! : bgRaw[n]![b]!));
	const fgAll = fgRaw.map((r) => median(r.filter((v) => !Number.isNaN(v))));
	const dAll = fgAll.map((v, n) => v - bgAll[n]!);
	const contrast = Math.hypot(...dAll);
	const seen = new Array<boolean>(bins).fill(false);
	const bgOf = (n: number, b: number) => (Number.isNaN(bgRaw[n]![b]!) ? bgAll[n]! : bgRaw[n]![b]!);
	const sizeOk = new Array<boolean>(bins).fill(false);
	for (let b = 0; b < bins; b++) {
		const dl = fgRaw.map((r, n) => r[b]! - bgOf(n, b));
		if (dl.some((v) => Number.isNaN(v))) continue;
		const size = Math.hypot(...dl);
		const along = dl.reduce((s, v, n) => s + v * dAll[n]!, 0) / (contrast || 1);
		sizeOk[b] = size >= 6 && size >= 0.35 * contrast;
		seen[b] = sizeOk[b]! && along >= 0.7 * size;
	}
	// Light changes the metal's colour slowly round the ring (a flash's reflection turns dark steel
	// light grey over a quarter of it); a finger or a bracket changes it at once. A bin whose metal
	// and background are each close to a seen neighbour's is seen too, so the ring is followed
	// through a slow change and stops at a sudden one.
	const near = (b: number, c: number) => {
		let df = 0;
		let db = 0;
		for (let n = 0; n < ch; n++) [df, db] = [df + (fgRaw[n]![b]! - fgRaw[n]![c]!) ** 2, db + (bgOf(n, b) - bgOf(n, c)) ** 2];
		const tol = Math.max(20, 0.4 * contrast) ** 2;
		return df <= tol && db <= tol;
	};
	for (let grew = true; grew;) {
		grew = false;
		for (let b = 0; b < bins; b++) {
			if (seen[b] || !sizeOk[b]) continue;
			const [l, r] = [(b - 1 + bins) % bins, (b + 1) % bins];
			if ((seen[l] && near(b, l)) || (seen[r] && near(b, r))) [seen[b], grew] = [true, true];
		}
	}
	const keep = (r: number[]) => r.map((v, b) => (seen[b] ? v : NaN));
	const fg = fgRaw.map((r) => spread(keep(r), p.na));
	const bg = bgRaw.map((r) => spread(keep(r), p.na));
	const k = p.radii.length;
	const per = p.na / bins;
	const values = new Float32Array(p.na * k);
	const off = new Float32Array(p.na * k);
	const sizes = new Float64Array(p.na);
	const d = new Float64Array(ch);
	for (let i = 0; i < p.na; i++) {
		const binSeen = seen[Math.min(bins - 1, Math.floor(i / per))]!;
		let size = 0;
		for (let n = 0; n < ch; n++) [d[n], size] = [fg[n]![i]! - bg[n]![i]!, size + (fg[n]![i]! - bg[n]![i]!) ** 2];
		size = Math.sqrt(size);
		sizes[i] = size;
		// A shadow on the background is the background's colour, darker: it reads as background,
		// unless the metal itself is such a darker background (grey steel on a light grey cover).
		let b2 = 0;
		let mb = 0;
		for (let n = 0; n < ch; n++) [b2, mb] = [b2 + bg[n]![i]! ** 2, mb + fg[n]![i]! * bg[n]![i]!];
		const bLen = Math.sqrt(b2);
		const km = mb / (b2 || 1);
		let rm = 0;
		for (let n = 0; n < ch; n++) rm += (fg[n]![i]! - km * bg[n]![i]!) ** 2;
		const shadows = bLen > 0 && !(km < 1 && Math.sqrt(rm) < SHADOW_HUE * km * bLen + 6);
		for (let j = 0; j < k; j++) {
			const at = (i * k + j) * ch;
			if (!binSeen || !(size > 0)) {
				values[i * k + j] = NaN;
				continue;
			}
			if (shadows && isShadow(p.values, at, ch, bg, i, b2, bLen)) {
				values[i * k + j] = 0;
				off[i * k + j] = 0;
				continue;
			}
			let s = 0;
			let r2 = 0;
			for (let n = 0; n < ch; n++) {
				const v = p.values[at + n]! - bg[n]![i]!;
				s += (v * d[n]!) / size;
				r2 += v * v;
			}
			values[i * k + j] = s;
			off[i * k + j] = Math.sqrt(Math.max(0, r2 - s * s));
		}
	}
	// A sample well off the line from background to metal is neither (a finger, a bracket, a cable):
	// well off is a quarter of the way from one to the other, or four times the noise's usual
	// distance off it, whichever is more.
	const noise = median(off.filter((_, x) => x % 7 === 0 && !Number.isNaN(values[x]!)));
	const whole = values.slice();
	for (let i = 0; i < p.na; i++) {
		const cut = Math.max(0.25 * sizes[i]!, 4 * noise);
		for (let j = 0; j < k; j++) if (off[i * k + j]! > cut) values[i * k + j] = NaN;
	}
	const luma = (c: number[]) => c.reduce((a, b) => a + b, 0) / c.length;
	return {
		polar: { na: p.na, radii: p.radii, values, channels: 1 },
		lightOnDark: luma(fgAll) >= luma(bgAll),
		contrast,
		seen,
		whole: { na: p.na, radii: p.radii, values: whole, channels: 1 }
	};
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

/** The mean of t across a band of radii at every angle (the ring's profile): NaN where under half the band was read. */
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
		profile[i] = m * 2 >= band.length ? sum / m : NaN;
		if (Number.isNaN(profile[i])) unknown++;
	}
	return { profile, unknown };
}

/** The mean of t round the ring at each radius (NaN samples left out): 1 inside the root, about the duty across the teeth, 0 outside. */
export function radialMean(ring: Ring): Float64Array {
	const { na, radii } = ring.polar;
	const k = radii.length;
	const out = new Float64Array(k);
	for (let j = 0; j < k; j++) {
		let sum = 0;
		let m = 0;
		for (let i = 0; i < na; i++) {
			const v = ring.t[i * k + j]!;
			if (!Number.isNaN(v)) [sum, m] = [sum + Math.max(0, Math.min(1, v)), m + 1];
		}
		out[j] = m ? sum / m : NaN;
	}
	return out;
}
