// Photo reading: from a photo of a real trigger wheel and the user's taps (centre, tooth tips) to
// its N-M pattern. The photo is shrunk on decode so the wheel is about 900 px across (plenty for 72
// positions) and cropped round it, in colour. The tip ellipse comes from the wheel's own edges
// near the taps (edges.ts), or from five or more tapped tips, and where no reading is high it is
// sharpened from the ring of teeth it lays over (outline.ts); the wheel's plane is rectified from
// it with perspective (plane.ts: two possible tilts, the one that reads the more regular teeth
// wins); the teeth are read round the rectified ring (ring.ts, profile.ts), stretches hidden by a
// finger or a bracket left out and named.
import sharp from 'sharp';
import { confidenceWord, HIGH_CONFIDENCE, type ConfidenceWord } from '../../photo-confidence';
import { conicEllipse, ellipseError, fitConic, type Conic, type Ellipse } from './conic';
import type { Pt } from './fit';
import { fitTipEllipse, rayEdges } from './edges';
import { affinePose, circlePoses, mapPoint, type Camera, type Homography } from './plane';
import { flankProfile } from './flank';
import { outlineFromRing } from './outline';
import { readProfile, type ProfileReading } from './profile';
import { bandMean, normalise, projectColour, radialMean, samplePolar, type Grey } from './ring';

export interface PhotoTaps {
	/** Pixel coordinates in the image as stored (upright; x right, y down). */
	centre: Pt;
	/** At least one; five or more give the tip ellipse directly. */
	tips: Pt[];
	/** Known outer diameter, to answer the scale. */
	odMm?: number;
}

export { confidenceWord, HIGH_CONFIDENCE, MEDIUM_CONFIDENCE, type ConfidenceWord } from '../../photo-confidence';

export type PhotoReadingResult =
	| {
			ok: true;
			/** N: tooth positions round the wheel, the missing ones counted. */
			teeth: number;
			/** M: missing positions, all gaps together. */
			missing: number;
			/**
			 * Gaps in the Pattern convention (position 0 = first tooth after the main gap, positions
			 * counted in the sense of rotation), taking the wheel to turn clockwise as photographed
			 * (the project's default `rotation: 'cw'`). For one gap: [{ first: N - M, count: M }].
			 */
			gaps: { first: number; count: number }[];
			/** Image angle of the main gap's middle: degrees counter-clockwise from +x with y up, 0..360. */
			gapAngleDeg: number;
			pitchDeg: number;
			/** Tooth width / pitch at mid-depth. */
			duty: number;
			/** 0..1, after rectification: spacings on whole pitches, even teeth, clean contrast, ring read. */
			confidence: number;
			confidenceWord: ConfidenceWord;
			/** Teeth on the wheel (N - M). */
			toothCount: number;
			/** Tip radius in image px (the long semi-axis when the wheel looks elliptical). */
			radiusPx: number;
			mmPerPx?: number;
			polarity: 'light-on-dark' | 'dark-on-light';
			/** The tip ellipse in stored-image px (y down); angleDeg of the a-axis, ccw from +x with y up. */
			ellipse: Ellipse;
			/** Each tooth seen, its tip's middle in stored-image px; n from 1 at the first tooth after the gap (wheel turning cw). */
			teethAt: { n: number; x: number; y: number }[];
			/** Stretches of the ring not read (a finger, a bracket, glare), image angles ccw from +x with y up. */
			unseen: { fromDeg: number; toDeg: number }[];
			ms: number;
	  }
	| { ok: false; field: string; message: string; advice: string[]; ellipse?: Ellipse };

type Failure = Extract<PhotoReadingResult, { ok: false }>;
const fail = (field: string, message: string, advice: string[] = [], ellipse?: Ellipse): Failure => ({
	ok: false,
	field,
	message,
	advice,
	...(ellipse ? { ellipse } : {})
});

/** Under this confidence no reading is answered: the image is refused as unreadable. */
const ANSWER_FLOOR = 0.3;
/** A reading from shadows alone is scaled by this, so it never reads high (see readShadows). */
const SHADOW_CAP = 0.8;
// Wheel radius in the working image: ~20 samples per pitch at 72 positions, far from the limit.
const WORK_RADIUS = 450;
const ADVICE =
	'tap the exact centre and the very tip of a tooth, photograph the wheel square-on with the whole wheel in the frame, and use even light with the wheel against a plain background of a different shade';
const UNREADABLE = `image: no evenly spaced teeth found round the ring; ${ADVICE}`;
const NOT_A_PICTURE = 'image: not a picture we can read; upload a JPEG, PNG or WebP photo';

const TIPS_ADVICE = 'tap five or more tooth tips spread round the wheel: they give its outline directly';
const SQUARE_ADVICE = 'shoot square-on, the phone held level over the middle of the wheel';
const LIGHT_ADVICE = 'put more light on the rim, or a background of a different colour or shade behind the teeth';
const CLEAR_ADVICE = 'clear the rim: no finger, bracket or cable over the teeth';
const FRAME_ADVICE = 'get the whole wheel in the frame, with some background all round it';
const TAP_ADVICE = 'tap the very tip of a tooth (its outer edge), not its root, and the middle of the wheel';

function checkTaps(taps: PhotoTaps, width: number, height: number): Failure | null {
	const inside = (p: Pt) => Number.isFinite(p.x) && Number.isFinite(p.y) && p.x >= 0 && p.y >= 0 && p.x <= width && p.y <= height;
	if (!inside(taps.centre)) return fail('centre', `centre: tap the wheel's centre inside the photo (0..${width} x 0..${height} px)`);
	if (!taps.tips.length) return fail('tips', 'tips: tap at least one tooth tip');
	if (!taps.tips.every(inside)) return fail('tips', `tips: every tooth tip must be inside the photo (0..${width} x 0..${height} px)`);
	const dists = taps.tips.map((t) => Math.hypot(t.x - taps.centre.x, t.y - taps.centre.y));
	const small = Math.min(...dists);
	if (small < 20) return fail('tips', 'tips: tap the tips of the teeth, away from the centre (the wheel must be at least 40 px across)');
	// A wheel tilted 60° with the centre tapped a little off still stays under 2.5; beyond it the
	// taps cannot be tips of one wheel round that centre.
	if (Math.max(...dists) > 2.5 * small)
		return fail('tips', 'tips: the tips tapped are at very different distances from the centre; tap the tips of teeth on the same wheel', [
			TAP_ADVICE
		]);
	return null;
}

/** Sees the reading's stages (the ellipses tried, each pose's ring), for calibration and debugging. */
export type Trace = (stage: string, data: Record<string, unknown>) => void;

export async function readPhoto(image: Buffer, taps: PhotoTaps, trace?: Trace): Promise<PhotoReadingResult> {
	// A photo is the user's input: whatever in it trips the reading is answered as a refusal, not a 500.
	try {
		return await read(image, taps, performance.now(), trace);
	} catch {
		return fail('image', UNREADABLE, [TAP_ADVICE, SQUARE_ADVICE, LIGHT_ADVICE]);
	}
}

interface Work {
	img: Grey;
	/** Stored px to working px and back. */
	toWork: (p: Pt) => Pt;
	toStored: (p: Pt) => Pt;
	scale: number;
	cam: Camera;
}

async function decode(image: Buffer, taps: PhotoTaps, width: number, height: number): Promise<Work | Failure> {
	const far = Math.max(...taps.tips.map((t) => Math.hypot(t.x - taps.centre.x, t.y - taps.centre.y)));
	const scale = Math.min(1, WORK_RADIUS / far);
	// Resize first: a JPEG then shrinks while it decodes, which is most of the time on a 12 MP photo.
	const sw = Math.max(2, Math.round(width * scale));
	const sh = Math.max(2, Math.round(height * scale));
	const [kx, ky] = [sw / width, sh / height];
	// The crop holds the ring, the background outside it, and room for a tilt and a centre off by a bit.
	const half = 1.9 * far * scale;
	const left = Math.max(0, Math.floor(taps.centre.x * kx - half));
	const top = Math.max(0, Math.floor(taps.centre.y * ky - half));
	const cw = Math.min(sw, Math.ceil(taps.centre.x * kx + half)) - left;
	const ch = Math.min(sh, Math.ceil(taps.centre.y * ky + half)) - top;
	if (cw < 8 || ch < 8) return fail('image', UNREADABLE, [FRAME_ADVICE]);
	try {
		let pipe = sharp(image).removeAlpha().toColourspace('srgb');
		if (scale < 1) pipe = pipe.resize(sw, sh, { fit: 'fill' });
		const { data, info } = await pipe.extract({ left, top, width: cw, height: ch }).raw().toBuffer({ resolveWithObject: true });
		const img: Grey = { data, width: info.width, height: info.height, channels: info.channels };
		return {
			img,
			scale,
			toWork: (p) => ({ x: p.x * kx - left, y: p.y * ky - top }),
			toStored: (p) => ({ x: (p.x + left) / kx, y: (p.y + top) / ky }),
			cam: { f: 0.8 * Math.max(width, height) * scale, px: (width / 2) * kx - left, py: (height / 2) * ky - top }
		};
	} catch {
		return fail('image', 'image: the photo could not be decoded; upload it again as a JPEG or PNG');
	}
}

type RingFailure = { failure: 'contrast' | 'depth' | 'outside' | ProfileFailureKind };
type ProfileFailureKind = 'few' | 'nogap' | 'gap-unseen' | 'unseen';
interface RingReading {
	profile: ProfileReading;
	lightOnDark: boolean;
	pose: Homography;
}

/** The root radius (unit frame) from a coarse ring: where the mean metal round the ring drops from the face to the teeth. */
function findRoot(img: Grey, pose: Homography, radial: (from: number, to: number, px: number) => number): number | RingFailure {
	const wide = samplePolar(img, pose, 512, 0.5, 1.25, radial(0.5, 1.25, 2.5));
	const p1 = projectColour(wide, [0.55, 0.98], [1.08, 1.25], 64);
	if (p1.contrast < 8) return { failure: 'contrast' };
	const ring1 = normalise(p1.polar, [0.55, 0.98], [1.08, 1.25], true, 0.85);
	const m = radialMean(ring1);
	const radii = ring1.polar.radii;
	const jt = radii.findIndex((r) => r >= 0.975);
	let plateau = -Infinity;
	for (let j = 0; j < jt; j++) if (m[j]! > plateau) plateau = m[j]!;
	const tipLevel = m[jt]!;
	if (!(plateau - tipLevel > 0.15)) return { failure: 'depth' };
	for (let j = jt - 1; j >= 0; j--) if (m[j]! >= tipLevel + 0.6 * (plateau - tipLevel)) return radii[j]!;
	return { failure: 'depth' };
}

/**
 * Angles where something lies over the rim (a finger, a bracket): most of the teeth's band is
 * neither metal nor background, and the solid metal just inside the root no longer reads as metal
 * or the background just outside the tips no longer as background. A mat's grid line or a plank
 * seam crosses the bands too, but thinly: the teeth's band stays readable there. Their profile
 * becomes unknown, a little wider than found, so the teeth beside them are not cut.
 */
function hideCovered(profile: Float64Array, teeth: Float64Array, metal: Float64Array, bg: Float64Array) {
	const n = profile.length;
	const covered = new Uint8Array(n);
	for (let i = 0; i < n; i++) if (Number.isNaN(teeth[i]!) && (!(metal[i]! >= 0.8) || !(bg[i]! <= 0.15))) covered[i] = 1;
	// A finger or a bracket is wider than a few degrees at the rim; a mat's line or a plank seam
	// crossing a space and the background beyond it is under one: it stays unknown, but is not
	// widened, so the profile's clean-up shares it between the tooth and the space beside it.
	const thin = Math.ceil(n / 240);
	const pad = Math.ceil(n / 720);
	// Covered all round, no run has a start: nothing of the ring is known.
	if (covered.every((c) => c)) profile.fill(NaN);
	for (let i = 0; i < n; i++) {
		if (!covered[i] || covered[(i - 1 + n) % n]) continue;
		let len = 0;
		while (len < n && covered[(i + len) % n]) len++;
		const wide = len >= thin ? pad : 0;
		for (let d = -wide; d < len + wide; d++) profile[(i + d + n) % n] = NaN;
	}
}

/** The teeth read round the ring of one pose, na angles, across the middle half of the teeth's depth. */
function readRing(img: Grey, pose: Homography, radiusPx: number, na: number, trace?: Trace): RingReading | RingFailure {
	const radial = (from: number, to: number, px: number) => Math.max(16, Math.ceil(((to - from) * radiusPx) / px));
	const root = findRoot(img, pose, radial);
	if (typeof root !== 'number') return root;
	const depth = 1 - root;
	if (!(depth > 0.015 && depth < 0.6)) return { failure: 'depth' };
	// The metal's colour from solid metal just inside the root, the background's just outside the tips.
	const metal: [number, number] = [Math.max(0.3, root - 0.045), Math.max(0.33, root - 0.015)];
	const bg: [number, number] = [1.06, 1.2];
	const px = na >= 2048 ? 1.5 : 2.5;
	const fine = samplePolar(img, pose, na, metal[0], 1.2, radial(metal[0], 1.2, px));
	const p2 = projectColour(fine, metal, bg);
	if (p2.contrast < 8) return { failure: 'contrast' };
	const ring = normalise(p2.polar, metal, bg, true, 0.5);
	// The teeth from every sample (flanks included), the cover from the solid bands, where a colour
	// neither metal nor background means something lies over the rim.
	const band: [number, number] = [root + 0.25 * depth, 1 - 0.25 * depth];
	const { profile } = bandMean({ ...ring, t: normalise(p2.whole, metal, bg, true, 0.5).t }, ...band);
	if (!profile) return { failure: 'depth' };
	const solid = (b: [number, number]) => bandMean(ring, ...b).profile!;
	const raw = profile.slice();
	hideCovered(profile, solid(band), solid(metal), solid(bg));
	trace?.('profile', { na, root, raw, profile, seen: p2.seen });
	const read = readProfile(profile);
	if ('failure' in read) return read;
	return { profile: read, lightOnDark: p2.lightOnDark, pose };
}

/**
 * Where no reading by colour is answered: the teeth read from their shadows (flank.ts) round each
 * pose tried, the most regular kept. Never high: with the metal and the background the same shade,
 * nothing but shadows shows the teeth, and a shadow can fall where no tooth is.
 */
function readShadows(img: Grey, poses: { pose: Homography; el: Ellipse }[], trace?: Trace): RingReading | null {
	let best: RingReading | null = null;
	for (const { pose, el } of poses) {
		const profile = flankProfile(img, pose, el.a, 2048, trace);
		if (!profile) continue;
		const read = readProfile(profile);
		trace?.('shadows', { profile, read });
		if ('failure' in read) continue;
		read.confidence *= SHADOW_CAP;
		if (!best || read.confidence > best.profile.confidence) best = { profile: read, lightOnDark: true, pose };
	}
	return best;
}

/** Image angle (degrees ccw from +x, y up, 0..360) of a point seen from a centre. */
const imageAngle = (c: Pt, p: Pt) => ((((Math.atan2(-(p.y - c.y), p.x - c.x) * 180) / Math.PI) % 360) + 360) % 360;
const r3 = (v: number) => Math.round(v * 1000) / 1000;
const r1 = (v: number) => Math.round(v * 10) / 10;

async function read(image: Buffer, taps: PhotoTaps, started: number, trace?: Trace): Promise<PhotoReadingResult> {
	let width: number;
	let height: number;
	try {
		const meta = await sharp(image).metadata();
		if (!meta.width || !meta.height) return fail('image', NOT_A_PICTURE);
		[width, height] = [meta.width, meta.height];
	} catch {
		return fail('image', NOT_A_PICTURE);
	}
	const bad = checkTaps(taps, width, height);
	if (bad) return bad;
	const work = await decode(image, taps, width, height);
	if ('ok' in work) return work;
	const { img, toWork, toStored, scale, cam } = work;

	const centre = toWork(taps.centre);
	const tips = taps.tips.map(toWork);
	const dists = tips.map((t) => Math.hypot(t.x - centre.x, t.y - centre.y));
	const mean = dists.reduce((a, b) => a + b, 0) / dists.length;
	const far = Math.max(...dists);
	const advice: string[] = [];
	if (taps.tips.length < 5) advice.push(TIPS_ADVICE);

	// The tip ellipse: from the edges near the taps, or through five or more tapped tips.
	// Edges on a softened copy: sensor noise and JPEG blocks make peaks of their own.
	const { data: soft } = await sharp(img.data, { raw: { width: img.width, height: img.height, channels: img.channels as 1 | 3 } })
		.blur(1.5)
		.raw()
		.toBuffer({ resolveWithObject: true });
	const edges = rayEdges({ ...img, data: soft }, centre, 0.4 * Math.min(...dists), 1.7 * far);
	// A tap is a fingertip: allow it about 20 stored px off the rim (or 7 %, whichever is more).
	const tipTolerance = Math.max(0.07, (25 * scale) / mean);
	const tapConic = tips.length >= 5 ? fitConic(tips) : null;
	const tapEllipse = tapConic && conicEllipse(tapConic);
	const tapOk =
		tapEllipse && tapEllipse.b / tapEllipse.a > 0.4 && Math.hypot(tapEllipse.cx - centre.x, tapEllipse.cy - centre.y) < 0.4 * tapEllipse.a;
	const seeds: Ellipse[] = [{ cx: centre.x, cy: centre.y, a: mean, b: mean, angleDeg: 0 }];
	if (tapOk && tapEllipse) seeds.unshift(tapEllipse);
	const edgeFit = fitTipEllipse(edges, { centre, tips, radius: mean, tipTolerance, centreTolerance: 0.1 * far + 25 * scale, seeds });
	let conic: Conic | null = null;
	let ellipse: Ellipse | null = null;
	// An outline moved to where the ring it lays over shows the tips, pass after pass from `el`.
	const sharpen = (el: Ellipse, passes: number): [Conic, Ellipse] | null => {
		let sharpened: [Conic, Ellipse] | null = null;
		for (let pass = 0, from = el; pass < passes; pass++) {
			const next = outlineFromRing(img, affinePose(from.cx, from.cy, from.a, from.b, from.angleDeg), from.a);
			if (!next) break;
			[sharpened, from] = [[next.conic, next.ellipse], next.ellipse];
		}
		return sharpened;
	};
	if (edgeFit && edgeFit.support >= 0.12) [conic, ellipse] = [edgeFit.conic, edgeFit.ellipse];
	else if (tapOk) [conic, ellipse] = [tapConic, tapEllipse];
	else {
		// No outline from the edges or the taps (a single tapped tip on a tilted wheel, a mat's lines
		// crowding the edges): the ring laid round the edges' weak best, or round the circle through
		// the taps, may still show where the tips are; an outline found there must pass by every tap.
		for (const start of [edgeFit?.ellipse, { cx: centre.x, cy: centre.y, a: mean, b: mean, angleDeg: 0 }]) {
			const found = start && sharpen(start, 3);
			if (found && tips.every((t) => Math.abs(ellipseError(found[1], t)) <= tipTolerance)) {
				[conic, ellipse] = found;
				break;
			}
		}
	}
	const storedEllipse = (el: Ellipse): Ellipse => {
		const c = toStored({ x: el.cx, y: el.cy });
		return { cx: r1(c.x), cy: r1(c.y), a: r1(el.a / scale), b: r1(el.b / scale), angleDeg: r1(el.angleDeg) };
	};
	trace?.('ellipse', { img, scale, toWork, edges, edgeFit, tapEllipse, tapOk, ellipse });
	const tried = ellipse ?? edgeFit?.ellipse ?? (tapOk ? tapEllipse : null);
	if (!conic || !ellipse) {
		return fail(
			'image',
			`image: the wheel's rim could not be found round the taps; ${ADVICE}`,
			[...advice, TAP_ADVICE, LIGHT_ADVICE],
			tried ? storedEllipse(tried) : undefined
		);
	}
	if (ellipse.b / ellipse.a < 0.8) advice.push(SQUARE_ADVICE);

	// Read both tilts each ellipse allows, and the affine stretch (a long lens, or a crop of a far
	// shot, sees the wheel without perspective), coarsely; the most regular is read again finely.
	// Five or more tapped tips give an ellipse of their own: where the edges found round the rim
	// belong to a bevel or a shadow, the taps' ellipse reads the teeth better, and it is read too.
	const outlines: [Conic, Ellipse][] = [[conic, ellipse]];
	if (tapOk && tapConic && tapEllipse && ellipse !== tapEllipse) outlines.push([tapConic, tapEllipse]);
	// Outlines the edges support nearly as well as the best: the ring's regularity tells them apart.
	// Read only when the first outlines read nothing high (most photos: a third of the time).
	const alternatives: [Conic, Ellipse][] = [];
	if (ellipse === edgeFit?.ellipse)
		for (const alt of edgeFit.alternatives ?? []) if (alt.support >= 0.12) alternatives.push([alt.conic, alt.ellipse]);
	// The outline sharpened from the ring it lays over (twice: the first pass straightens most of
	// it), read first among them: taps 15 px off or a single tapped tip leave the fit a few per cent
	// off, enough to lose the teeth, and the ring itself shows where the tips are.
	const posesOf = ([q, el]: [Conic, Ellipse]) => {
		const affine = affinePose(el.cx, el.cy, el.a, el.b, el.angleDeg);
		// Both tilts even on a nearly round outline: a tilt flattens the ellipse only by its cosine
		// (7° leaves it 0.99 round) but spaces the teeth unevenly round it by its tangent (a 60-2
		// tilted 7° drifted 0.7 of a pitch over half the ring under the plain stretch, none under the tilt).
		return [...circlePoses(q, cam), affine].map((pose) => ({ pose, el }));
	};
	const poses: { pose: Homography; el: Ellipse }[] = outlines.flatMap(posesOf);
	const coarse = poses.map(({ pose, el }) => ({ el, ring: readRing(img, pose, el.a, 1024, trace) }));
	if (!coarse.some((c) => 'profile' in c.ring && c.ring.profile.confidence >= HIGH_CONFIDENCE)) {
		const sharpened = sharpen(ellipse, 2);
		if (sharpened) alternatives.unshift(sharpened);
		for (const p of alternatives.flatMap(posesOf)) {
			poses.push(p);
			coarse.push({ el: p.el, ring: readRing(img, p.pose, p.el.a, 1024, trace) });
		}
	}
	const pick = coarse.reduce<{ el: Ellipse; ring: RingReading } | null>(
		(x, y) => ('profile' in y.ring && (!x || y.ring.profile.confidence > x.ring.profile.confidence) ? { el: y.el, ring: y.ring } : x),
		null
	);
	const fine = pick && readRing(img, pick.ring.pose, pick.el.a, 2048, trace);
	// The fine reading can lose a tooth beside a cover, or split one at a glint, that the coarse one
	// read whole: the more regular of the two stands. Where they disagree on N or M, a tooth lost in
	// glare or shadow may be making a gap in one of them: the other's confidence counts against it.
	const coarseBest = pick?.ring;
	const fineOk = fine && 'profile' in fine ? fine : null;
	const bestByColour =
		fineOk && coarseBest && fineOk.profile.confidence < coarseBest.profile.confidence ? coarseBest : (fineOk ?? coarseBest);
	const other = bestByColour === fineOk ? coarseBest : fineOk;
	if (
		bestByColour &&
		other &&
		(other.profile.teeth !== bestByColour.profile.teeth || other.profile.missing !== bestByColour.profile.missing)
	)
		bestByColour.profile.confidence *= 1 - other.profile.confidence;
	trace?.('ring', { poses: poses.map((p) => p.pose), coarse: coarse.map((c) => c.ring), fine });
	const readings = fine ? [fine, ...coarse.map((c) => c.ring)] : coarse.map((c) => c.ring);
	const refusedAt = storedEllipse(pick?.el ?? ellipse);
	// A reading too irregular to answer says why the others failed, when one did (several outlines
	// are read, and one of them can find some odd pattern on a wheel with no gap at all). Too
	// irregular: under 0.3. On the calibration images (c01..c16, three tap sets), before the outline
	// was sharpened from the ring, every reading under 0.5 was wrong (0.16, 0.37) and the lowest
	// right one 0.51; 0.3 keeps room for right ones.
	const answerable = (r: RingReading | null): r is RingReading =>
		r !== null && r.profile.confidence >= ANSWER_FLOOR && r.profile.missing * 2 <= r.profile.teeth;
	let best: RingReading | null = bestByColour ?? null;
	if (!answerable(best)) best = readShadows(img, poses, trace) ?? best;
	if (!answerable(best)) {
		const kinds = new Set(readings.map((r) => ('failure' in r ? r.failure : '')));
		if (kinds.has('contrast'))
			return fail(
				'image',
				`image: the wheel hardly stands out from the background where the taps put it; ${ADVICE}`,
				[LIGHT_ADVICE, ...advice],
				refusedAt
			);
		if (kinds.has('nogap'))
			return fail(
				'image',
				'image: the teeth are evenly spaced all round with no gap; this reading is for missing-tooth wheels',
				[],
				refusedAt
			);
		if (kinds.has('gap-unseen') || kinds.has('unseen'))
			return fail(
				'image',
				'image: part of the ring of teeth is hidden, outside the photo or lost in shadow or glare, and the gap was not seen; photograph the whole wheel, the rim clear, in even light',
				[CLEAR_ADVICE, FRAME_ADVICE, ...advice],
				refusedAt
			);
		return fail('image', UNREADABLE, best ? [...advice, LIGHT_ADVICE] : [...advice, TAP_ADVICE, LIGHT_ADVICE], refusedAt);
	}
	const read = best.profile;
	const readEl = poses.find((p) => p.pose === best.pose)?.el ?? pick?.el ?? ellipse;
	const shown = storedEllipse(readEl);

	// Back to the stored image's pixels for everything answered.
	const at = (rho: number, phi: number) => toStored(mapPoint(best.pose, rho * Math.cos(phi), rho * Math.sin(phi)));
	const c = toStored(mapPoint(best.pose, 0, 0));
	const missingBefore = (position: number) => read.gaps.reduce((a, g) => a + Math.max(0, Math.min(g.count, position - g.first)), 0);
	const teethAt = read.seen
		.map((t) => {
			const p = at(1, t.phi);
			return { n: t.position - missingBefore(t.position) + 1, x: r1(p.x), y: r1(p.y) };
		})
		.sort((a, b) => a.n - b.n);
	const unseen = read.unseen.map((u) => ({ fromDeg: r1(imageAngle(c, at(1, u.from))), toDeg: r1(imageAngle(c, at(1, u.to))) }));
	const radiusPx = readEl.a / scale;
	return {
		ok: true,
		teeth: read.teeth,
		missing: read.missing,
		gaps: read.gaps,
		gapAngleDeg: r3(imageAngle(c, at(1, read.gapPhi))),
		pitchDeg: r3(360 / read.teeth),
		duty: r3(read.duty),
		confidence: r3(read.confidence),
		confidenceWord: confidenceWord(r3(read.confidence)),
		toothCount: read.toothCount,
		radiusPx: r3(radiusPx),
		...(taps.odMm ? { mmPerPx: taps.odMm / (2 * radiusPx) } : {}),
		polarity: best.lightOnDark ? 'light-on-dark' : 'dark-on-light',
		ellipse: shown,
		teethAt,
		unseen,
		ms: Math.round(performance.now() - started)
	};
}
