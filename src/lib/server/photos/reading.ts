// Photo reading: from a photo of a real trigger wheel and the user's taps (centre, tooth tips) to
// its N-M pattern. The photo is cropped round the wheel and shrunk so the wheel is about 900 px
// across (plenty for 72 positions, and decode-bound at 12 MP), then read in three rings: two to
// find the wheel's true outline from its own edge (a finger's centre and a tilted camera both
// correct themselves there), one to read the teeth on the rectified ring.
import sharp from 'sharp';
import { circleOutline, fitCircle, fitEllipse, outlinePoint, radialError, semiAxes, type Outline, type Pt } from './fit';
import { refineOutline } from './refine';
import { bandMean, boundary, normalise, samplePolar, type Grey } from './ring';
import { readProfile } from './profile';

export interface PhotoTaps {
	/** Pixel coordinates in the image as stored (upright; x right, y down). */
	centre: Pt;
	/** At least one; more (3+: circle, 5+: ellipse) helps a far-off centre or a tilted camera. */
	tips: Pt[];
	/** Known outer diameter, to answer the scale. */
	odMm?: number;
}

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
			/** 0..1: spacings on whole pitches, even teeth, clean contrast. */
			confidence: number;
			/** Teeth actually seen (N - M). */
			toothCount: number;
			/** Tip radius in image px (the long semi-axis when the wheel looks elliptical). */
			radiusPx: number;
			mmPerPx?: number;
			polarity: 'light-on-dark' | 'dark-on-light';
			ms: number;
	  }
	| { ok: false; field: string; message: string };

type Failure = Extract<PhotoReadingResult, { ok: false }>;
const fail = (field: string, message: string): Failure => ({ ok: false, field, message });

// Wheel radius in the working image: ~20 samples per pitch at 72 positions, far from the limit.
const WORK_RADIUS = 450;
const ADVICE =
	'tap the exact centre and the very tip of a tooth, photograph the wheel square-on with the whole wheel in the frame, and use even light with the wheel against a plain background of a different shade';
const UNREADABLE = `image: no evenly spaced teeth found round the ring; ${ADVICE}`;

/** The tip outline from the taps alone: a circle about the centre, fitted through 3+ tips, or an ellipse through 5+. */
function tapOutline(taps: PhotoTaps): Outline {
	const dists = taps.tips.map((t) => Math.hypot(t.x - taps.centre.x, t.y - taps.centre.y));
	const mean = dists.reduce((a, b) => a + b, 0) / dists.length;
	const around = circleOutline(taps.centre, mean);
	// A fit is kept only when it agrees with the tapped centre (tips bunched on one side fit badly).
	const sane = (o: Outline | null) => {
		if (!o) return false;
		const [a, b] = semiAxes(o);
		return b / a > 0.8 && Math.hypot(o.cx - taps.centre.x, o.cy - taps.centre.y) < 0.2 * mean && a < 1.3 * mean && b > 0.75 * mean;
	};
	const ellipse = taps.tips.length >= 5 ? fitEllipse(taps.tips, taps.centre, mean) : null;
	if (ellipse && sane(ellipse) && taps.tips.every((t) => Math.abs(radialError(ellipse, t)) < 0.02)) return ellipse;
	const circle = fitCircle(taps.tips);
	return circle && sane(circle) ? circle : around;
}

function checkTaps(taps: PhotoTaps, width: number, height: number): Failure | null {
	const inside = (p: Pt) => Number.isFinite(p.x) && Number.isFinite(p.y) && p.x >= 0 && p.y >= 0 && p.x <= width && p.y <= height;
	if (!inside(taps.centre)) return fail('centre', `centre: tap the wheel's centre inside the photo (0..${width} x 0..${height} px)`);
	if (!taps.tips.length) return fail('tips', 'tips: tap at least one tooth tip');
	if (!taps.tips.every(inside)) return fail('tips', `tips: every tooth tip must be inside the photo (0..${width} x 0..${height} px)`);
	const dists = taps.tips.map((t) => Math.hypot(t.x - taps.centre.x, t.y - taps.centre.y));
	const small = Math.min(...dists);
	if (small < 20) return fail('tips', 'tips: tap the tips of the teeth, away from the centre (the wheel must be at least 40 px across)');
	if (Math.max(...dists) > 1.35 * small)
		return fail('tips', 'tips: the tips tapped are at different distances from the centre; tap the tips of teeth on the same wheel');
	return null;
}

export async function readPhoto(image: Buffer, taps: PhotoTaps): Promise<PhotoReadingResult> {
	// A photo is the user's input: whatever in it trips the reading is answered as a refusal, not a 500.
	try {
		return await read(image, taps, performance.now());
	} catch {
		return fail('image', UNREADABLE);
	}
}

async function read(image: Buffer, taps: PhotoTaps, started: number): Promise<PhotoReadingResult> {
	let width: number;
	let height: number;
	try {
		const meta = await sharp(image).metadata();
		if (!meta.width || !meta.height) return fail('image', 'image: not a picture we can read; upload a JPEG, PNG or WebP photo');
		[width, height] = [meta.width, meta.height];
	} catch {
		return fail('image', 'image: not a picture we can read; upload a JPEG, PNG or WebP photo');
	}
	const bad = checkTaps(taps, width, height);
	if (bad) return bad;

	const initial = tapOutline(taps);
	const [major] = semiAxes(initial);
	// The crop holds the ring, the background band outside it, and room for a centre off by a bit.
	const half = 1.45 * major;
	const left = Math.max(0, Math.floor(initial.cx - half));
	const top = Math.max(0, Math.floor(initial.cy - half));
	const cw = Math.min(width, Math.ceil(initial.cx + half)) - left;
	const ch = Math.min(height, Math.ceil(initial.cy + half)) - top;
	const scale = Math.min(1, WORK_RADIUS / major);
	const ow = Math.max(2, Math.round(cw * scale));
	const oh = Math.max(2, Math.round(ch * scale));
	let grey: Grey;
	try {
		const { data, info } = await sharp(image)
			.extract({ left, top, width: cw, height: ch })
			.resize(ow, oh, { fit: 'fill' })
			.greyscale()
			.raw()
			.toBuffer({ resolveWithObject: true });
		grey = { data, width: info.width, height: info.height, channels: info.channels };
	} catch {
		return fail('image', 'image: the photo could not be decoded; upload it again as a JPEG or PNG');
	}
	const [sx, sy] = [ow / cw, oh / ch];
	const toWork = (o: Outline): Outline => ({
		cx: (o.cx - left) * sx,
		cy: (o.cy - top) * sy,
		A: [o.A[0] * sx, o.A[1] * sx, o.A[2] * sy, o.A[3] * sy]
	});

	let outline = toWork(initial);
	// Radial steps in working px: coarse while finding the outline, about one pixel for the teeth.
	const radial = (o: Outline, from: number, to: number, px = 1) => Math.max(16, Math.ceil(((to - from) * semiAxes(o)[0]) / px));
	// Pass 1: wide bands, for the taps' guess may be far off; pass 2: bands hugging the teeth found.
	let ring = normalise(
		samplePolar(grey, outline, 2048, 0.55, 1.34, radial(outline, 0.55, 1.34, 2)),
		[0.6, 1],
		[1.16, 1.34],
		undefined,
		0.85
	);
	const light = ring.lightOnDark;
	if (ring.contrast < 8) return fail('image', `image: the wheel hardly stands out from the background where the taps put it; ${ADVICE}`);
	let rootRatio = 0.85;
	const first = refineOutline(outline, boundary(ring));
	if (first) [outline, rootRatio] = [first.outline, first.rootRatio];
	// Once the root is known, the metal level comes from a narrow band just inside it: solid metal
	// even on a thin ring wheel, so its median is unbiased.
	const inner = (r: number): [number, number] => [Math.max(0.3, r - 0.07), Math.max(0.35, r - 0.02)];
	if (first) {
		const [from] = inner(rootRatio);
		ring = normalise(
			samplePolar(grey, outline, 2048, from, 1.28, radial(outline, from, 1.28, 1.5)),
			inner(rootRatio),
			[1.1, 1.28],
			light,
			0.5
		);
		const second = refineOutline(outline, boundary(ring));
		if (second) [outline, rootRatio] = [second.outline, second.rootRatio];
	}
	const depth = 1 - rootRatio;
	if (!(depth > 0.015 && depth < 0.6)) return fail('image', UNREADABLE);

	// Pass 3: read the teeth as the mean metal fraction across the middle half of their depth.
	const na = 4096;
	const [from] = inner(rootRatio);
	ring = normalise(samplePolar(grey, outline, na, from, 1.22, radial(outline, from, 1.22)), inner(rootRatio), [1.08, 1.22], light, 0.5);
	const { profile: s, unknown } = bandMean(ring, rootRatio + 0.25 * depth, 1 - 0.25 * depth);
	if (!s) return fail('image', UNREADABLE);
	if (unknown > na * 0.02)
		return fail(
			'image',
			'image: part of the ring of teeth is outside the photo or lost in shadow or glare; photograph the whole wheel, with some background all round, in even light'
		);
	const read = readProfile(s);
	if ('failure' in read) {
		if (read.failure === 'nogap')
			return fail('image', 'image: the teeth are evenly spaced all round with no gap; this reading is for missing-tooth wheels');
		return fail('image', UNREADABLE);
	}
	if (read.confidence < 0.2 || read.missing * 2 > read.teeth) return fail('image', UNREADABLE);

	// Back to the stored image's pixels for the angle and radius answered.
	const g = outlinePoint(outline, 1, read.gapPhi);
	const c = { x: outline.cx / sx + left, y: outline.cy / sy + top };
	const gx = g.x / sx + left - c.x;
	const gy = g.y / sy + top - c.y;
	const gapAngleDeg = ((((Math.atan2(-gy, gx) * 180) / Math.PI) % 360) + 360) % 360;
	const radiusPx = semiAxes(outline)[0] / ((sx + sy) / 2);
	const r3 = (v: number) => Math.round(v * 1000) / 1000;
	return {
		ok: true,
		teeth: read.teeth,
		missing: read.missing,
		gaps: read.gaps,
		gapAngleDeg: r3(gapAngleDeg),
		pitchDeg: r3(360 / read.teeth),
		duty: r3(read.duty),
		confidence: r3(read.confidence),
		toothCount: read.toothCount,
		radiusPx: r3(radiusPx),
		...(taps.odMm ? { mmPerPx: taps.odMm / (2 * radiusPx) } : {}),
		polarity: ring.lightOnDark ? 'light-on-dark' : 'dark-on-light',
		ms: Math.round(performance.now() - started)
	};
}
