// The tip outline sharpened from the ring itself: an outline a few per cent off (taps 15 px off, a
// single tapped tip, a mat's line that drew the edge fit aside) lays the ring of teeth wavy over the
// polar grid and the teeth are lost. Read across the ring, every angle shows where the wheel ends:
// at a tooth its tip, in a space its root. The outer of the two (the tips, split from the roots by
// Otsu's threshold) mapped back to the photo give the tip ellipse by least squares.
import { conicEllipse, fitConic, type Conic, type Ellipse } from './conic';
import { otsu } from './edges';
import { solve, type Pt } from './fit';
import { mapPoint, type Homography } from './plane';
import { normalise, projectColour, samplePolar, type Grey, type Ring } from './ring';

/** The ring's radii sampled: metal well inside any root, background well outside the tips of an outline 10 % small. */
const FROM = 0.7;
const TO = 1.3;
const METAL: [number, number] = [0.7, 0.78];
const BACKGROUND: [number, number] = [1.16, 1.3];

const harmonics = (phi: number) => [1, Math.cos(phi), Math.sin(phi), Math.cos(2 * phi), Math.sin(2 * phi)];

/**
 * Per angle, ρ where the wheel ends going out from its solid metal: the first fall of t below ½
 * (three samples averaged). Going out, not in: a mat's bright line or a bolt beyond the tips does
 * not move it. NaN where the metal is not seen first.
 */
function firstDrop(ring: Ring): Float64Array {
	const { na, radii } = ring.polar;
	const k = radii.length;
	const out = new Float64Array(na).fill(NaN);
	const j0 = radii.findIndex((r) => r >= METAL[1]);
	for (let i = 0; i < na; i++) {
		const t = (j: number) => (ring.t[i * k + j - 1]! + ring.t[i * k + j]! + ring.t[i * k + j + 1]!) / 3;
		if (!(t(j0) >= 0.5)) continue;
		for (let j = j0 + 1; j < k - 1; j++) {
			const v = t(j);
			if (Number.isNaN(v)) break;
			if (v < 0.5) {
				const u = (t(j - 1) - 0.5) / (t(j - 1) - v);
				out[i] = radii[j - 1]! + u * (radii[j]! - radii[j - 1]!);
				break;
			}
		}
	}
	return out;
}

/** The tip ellipse in image px from the ring laid by `pose`; null where the ring does not show tips and roots round most of it. */
export function outlineFromRing(img: Grey, pose: Homography, radiusPx: number): { conic: Conic; ellipse: Ellipse } | null {
	const na = 720;
	const k = Math.max(32, Math.ceil(((TO - FROM) * radiusPx) / 1.5));
	const polar = samplePolar(img, pose, na, FROM, TO, k);
	const projected = projectColour(polar, METAL, BACKGROUND);
	if (projected.contrast < 8) return null;
	const ends = firstDrop(normalise(projected.polar, METAL, BACKGROUND, true, 0.5));
	const at: { rho: number; phi: number }[] = [];
	for (let i = 0; i < na; i++) if (ends[i]! > METAL[1] && ends[i]! < BACKGROUND[0]) at.push({ rho: ends[i]!, phi: (2 * Math.PI * i) / na });
	// Tips and roots both seen round most of the ring, or this outline is too far off to sharpen.
	if (at.length < na / 2) return null;
	// An outline off-centre or the wrong size moves the ring's ends smoothly round it (a first and
	// second harmonic); tips and roots are told apart against that trend, not against one level.
	const trendOf = (ps: { rho: number; phi: number }[]) => {
		const M = Array.from({ length: 5 }, () => new Array<number>(5).fill(0));
		const v = new Array<number>(5).fill(0);
		for (const p of ps) {
			const f = harmonics(p.phi);
			for (let a = 0; a < 5; a++) {
				v[a]! += f[a]! * p.rho;
				for (let b = 0; b < 5; b++) M[a]![b]! += f[a]! * f[b]!;
			}
		}
		const c = solve(M, v);
		return c && ((phi: number) => harmonics(phi).reduce((sum, f, a) => sum + f * c[a]!, 0));
	};
	const all = trendOf(at);
	if (!all) return null;
	const split = otsu(at.map((p) => p.rho - all(p.phi)));
	const depth = split.high - split.low;
	// Tips clearly outside the roots, on enough of the ring to hold an ellipse all round.
	if (!(depth > 0.02)) return null;
	const tips = at.filter((p) => p.rho - all(p.phi) >= split.threshold);
	const tipTrend = trendOf(tips);
	if (!tipTrend) return null;
	// Off the tips' own trend by more than a third of the teeth's depth: a glint or a nick, not a tip.
	const near = tips.filter((p) => Math.abs(p.rho - tipTrend(p.phi)) < depth / 3);
	const sectors = new Set(near.map((p) => Math.floor((p.phi / (2 * Math.PI)) * 6)));
	if (near.length < 24 || sectors.size < 5) return null;
	const points: Pt[] = near.map((p) => mapPoint(pose, p.rho * Math.cos(p.phi), p.rho * Math.sin(p.phi)));
	const conic = fitConic(points);
	const ellipse = conic && conicEllipse(conic);
	if (!conic || !ellipse || !(ellipse.b / ellipse.a > 0.4)) return null;
	return { conic, ellipse };
}
