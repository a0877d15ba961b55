// The teeth read from their shadows alone, for a wheel of the background's own shade (bright steel on
// a grey cover in hard light): there the metal and the cover cannot be told apart by colour, and all
// that marks the spaces is dark, a thin shadow line along one flank of every tooth where the light
// falls across the wheel's thickness, or the wheel's whole cast shadow filling the spaces on one side.
// Either way one dark mark per pitch, so the marks' spacing gives the pitch and one long dark run
// (the cast shadow filling a gap) or a stretch with no mark for two pitches or more, the gap.
import type { Homography } from './plane';
import { strongestHarmonic } from './profile';
import type { Trace } from './reading';
import { samplePolar, type Grey } from './ring';

/** How far inside the tips the marks are read (unit frame): within the teeth of any wheel with teeth 4 % of its radius deep or more. */
const BAND: [number, number] = [0.955, 0.99];

/**
 * Per angle, 1 where the band is as bright as the brightest of its neighbourhood (lit metal, or a
 * space's lit cover), 0 where it is a mark's depth under it. NaN-free; null off the photo or with no marks.
 */
function darkness(img: Grey, pose: Homography, na: number, radiusPx: number, trace?: Trace): { cycles: number; t: Float64Array } | null {
	const k = Math.max(4, Math.ceil(((BAND[1] - BAND[0]) * radiusPx) / 1.5));
	const p = samplePolar(img, pose, na, BAND[0], BAND[1], k);
	const ch = p.channels;
	const v = new Float64Array(na);
	for (let i = 0; i < na; i++) {
		let sum = 0;
		let m = 0;
		for (let j = 0; j < k; j++)
			for (let c = 0; c < ch; c++) {
				const x = p.values[(i * k + j) * ch + c]!;
				if (!Number.isNaN(x)) [sum, m] = [sum + x, m + 1];
			}
		v[i] = m > (k * ch) / 2 ? sum / m : NaN;
	}
	if (v.some((x) => Number.isNaN(x))) return null;
	// The lit level changes slowly round the ring (light falls off across the wheel): the brightest
	// within a pitch and a half each side (8° at least) is the lit level there, so the middle of a
	// gap of two missing teeth in shadow still sees the lit tooth beyond it. The pitch from the
	// band's strongest repeat round the ring.
	const cycles = strongestHarmonic(v, 3, Math.min(120, na / 8));
	const w = Math.ceil(Math.max((8 / 360) * na, (1.6 * na) / cycles));
	const lit = new Float64Array(na);
	for (let i = 0; i < na; i++) {
		let hi = -Infinity;
		for (let d = -w; d <= w; d++) hi = Math.max(hi, v[(i + d + na) % na]!);
		lit[i] = hi;
	}
	const d = v.map((x, i) => lit[i]! - x);
	const sorted = [...d].sort((a, b) => a - b);
	const noise = sorted[Math.floor(0.5 * (na - 1))]!;
	const deep = sorted[Math.floor(0.97 * (na - 1))]!;
	// A mark is darker than the lit level by three times the usual dip (the cover's texture, JPEG
	// noise) and by 12 grey levels at least: a flank's line is faint beside a cast shadow, so the
	// marks are not read against the deepest one.
	const mark = Math.max(3 * noise, 12);
	trace?.('darkness', { noise, deep, mark, v, lit });
	if (!(deep > mark)) return null;
	return { cycles, t: d.map((x) => Math.max(0, Math.min(1, 1 - (x - mark / 2) / mark))) };
}

/**
 * The ring's profile (1 metal, 0 space) read from the shadows: each dark mark narrower than a third
 * of the pitch (a flank's shadow line) widened into its space, so it reads as a space the way a
 * space in shadow does, and the runs of metal between the marks as the teeth. Null where the band
 * shows no marks.
 */
export function flankProfile(img: Grey, pose: Homography, radiusPx: number, na = 2048, trace?: Trace): Float64Array | null {
	const read = darkness(img, pose, na, radiusPx, trace);
	if (!read) return null;
	const { t } = read;
	const dark = [...t].map((x) => x < 0.5);
	if (dark.every(Boolean) || !dark.some(Boolean)) return null;
	const out = Float64Array.from(t);
	const at = (d: number) => ((d % na) + na) % na;
	// Start after a change so no run wraps.
	const s0 = Math.max(
		0,
		dark.findIndex((x, i) => x && !dark[at(i - 1)])
	);
	const marks: { start: number; len: number; mid: number }[] = [];
	for (let o = 0; o < na;) {
		const i = s0 + o;
		if (!dark[at(i)]) {
			o++;
			continue;
		}
		let len = 0;
		while (len < na && dark[at(i + len)]) len++;
		marks.push({ start: i, len, mid: i + len / 2 });
		o += len;
	}
	// The pitch: the marks' usual spacing, a whole number of them round the ring (one mark a pitch
	// but at the gap, and a fleck or a second line in a space is rarer than the lines).
	const spacings = marks.map((k, x) => (x + 1 < marks.length ? marks[x + 1]!.mid - k.mid : marks[0]!.mid + na - k.mid));
	spacings.sort((a, b) => a - b);
	if (marks.length < 3) return null;
	const cycles = Math.round(na / spacings[spacings.length >> 1]!);
	const pitch = na / cycles;
	const wide = Math.round(pitch / 3);
	// Where the wheel's shadow falls out of the wheel it fills the spaces (marks a third of a pitch
	// wide or more, under a pitch: a gap's mark is longer), and those show where the spaces' middles
	// lie round the ring, one a pitch. Elsewhere only the flank facing the shadow casts a line, at one
	// side of its space; which side is which way the line lies from its space's middle, and the space
	// runs on from the line that way. Each line is widened into its space by a third of a pitch.
	let [sx, sy] = [0, 0];
	const phase = (x: number) => (2 * Math.PI * cycles * x) / na;
	for (const k of marks)
		if (k.len >= wide && k.len < pitch) [sx, sy] = [sx + k.len * Math.cos(phase(k.mid)), sy + k.len * Math.sin(phase(k.mid))];
	const filled = Math.hypot(sx, sy) > 0;
	const grid = Math.atan2(sy, sx);
	for (const k of marks) {
		if (k.len >= wide) continue;
		const after = Math.sin(phase(k.mid) - grid) > 0;
		const [from, to] = !filled
			? [k.mid - wide / 2, k.mid + wide / 2]
			: after
				? [k.start + k.len - wide, k.start + k.len]
				: [k.start, k.start + wide];
		for (let d = Math.floor(from); d < to; d++) out[at(d)] = 0;
	}
	return out;
}
