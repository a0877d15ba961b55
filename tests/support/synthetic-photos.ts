// Test photos of trigger wheels, drawn from the project's own SVG export (wheelSvg) so the truth
// (tooth count, gap, duty) is the same geometry a user would cut. The export's cut contour is
// restyled as a filled metal part and placed on a background with a known affine transform
// (scale, rotation, camera-tilt squash), then blurred, lit unevenly, given sensor noise and saved
// as a JPEG. Taps are where a user's finger would land: the centre and some tooth tips.
//
//   const photo = await syntheticWheelPhoto({ teeth: 60, missing: 2, width: 4000, height: 3000 });
//   const reading = await readPhoto(photo.image, photo.taps); // compare with photo.truth
import sharp from 'sharp';
import { wheelSvg } from '$lib/server/exports/svg';
import { exampleSpec } from './example-spec';
import { gapsOf } from '$lib/trade/pattern';
import { drawWheel, gapOpenings } from '$lib/trade/wheel';
import type { PhotoTaps } from '$lib/server/photos/reading';

export interface SyntheticWheelOptions {
	teeth: number;
	/** Missing positions in one gap before position 0 (an N-M wheel). */
	missing: number;
	/** Instead of `missing`: the empty positions of a custom pattern (several gaps). */
	missingPositions?: number[];
	/** Tooth width / pitch; 0.5 unless given. */
	duty?: number;
	/** Wheel geometry in mm (defaults: exampleSpec's 100 mm OD, 5 mm teeth, 20 mm bore). */
	odMm?: number;
	depthMm?: number;
	boreMm?: number;
	/** Image size in pixels; 1200 x 900 unless given. */
	width?: number;
	height?: number;
	/** Wheel's outer diameter in the image, px; 70 % of the shorter side unless given. */
	diameterPx?: number;
	/** Wheel centre in the image, px (y down); the image centre unless given. */
	centre?: { x: number; y: number };
	/** Turn of the wheel in the image, degrees counter-clockwise (y up). */
	rotationDeg?: number;
	/** Camera tilt: the wheel is squashed to this fraction (e.g. 0.92) along `squashAxisDeg`. */
	squash?: number;
	squashAxisDeg?: number;
	polarity?: 'light-on-dark' | 'dark-on-light';
	/** Sensor noise, standard deviation in grey levels (0..255). */
	noise?: number;
	/** Lens blur, Gaussian sigma in px. */
	blur?: number;
	/** Uneven light: brightness runs from 1 - light to 1 + light across the image. */
	light?: number;
	lightAngleDeg?: number;
	/** How many tooth tips the "user" taps (spread round the wheel); 3 unless given. */
	tips?: number;
	/** Finger error: each tap is moved up to this many px in a random direction. */
	jitterPx?: number;
	seed?: number;
	quality?: number;
}

export interface SyntheticWheelPhoto {
	image: Buffer;
	width: number;
	height: number;
	taps: PhotoTaps;
	truth: {
		teeth: number;
		missing: number;
		duty: number;
		/** The pattern's gaps (pattern.ts gapsOf): position 0 is the first tooth after the gap. */
		gaps: { first: number; count: number }[];
		/** Image angle of the widest gap's middle at the tip radius: degrees counter-clockwise from +x, y up (NaN with no gap). */
		gapAngleDeg: number;
		pitchDeg: number;
		/** The tip radius along the unsquashed axis, px. */
		radiusPx: number;
		centre: { x: number; y: number };
	};
}

/** Small seeded generator (mulberry32): the same options always give the same photo. */
function random(seed: number) {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

const rad = (d: number) => (d * Math.PI) / 180;
type Mat = [number, number, number, number]; // [m00, m01, m10, m11]
const mul = (a: Mat, b: Mat): Mat => [
	a[0] * b[0] + a[1] * b[2],
	a[0] * b[1] + a[1] * b[3],
	a[2] * b[0] + a[3] * b[2],
	a[2] * b[1] + a[3] * b[3]
];
const rot = (d: number): Mat => [Math.cos(rad(d)), -Math.sin(rad(d)), Math.sin(rad(d)), Math.cos(rad(d))];

export async function syntheticWheelPhoto(o: SyntheticWheelOptions): Promise<SyntheticWheelPhoto> {
	const width = o.width ?? 1200;
	const height = o.height ?? 900;
	const duty = o.duty ?? 0.5;
	const spec = exampleSpec({
		pattern: o.missingPositions
			? { kind: 'custom', teeth: o.teeth, missingPositions: o.missingPositions }
			: { kind: 'missing', teeth: o.teeth, missing: o.missing },
		duty,
		...(o.odMm ? { odMm: o.odMm } : {}),
		...(o.depthMm ? { depthMm: o.depthMm } : {}),
		...(o.boreMm !== undefined ? { boreMm: o.boreMm } : {})
	});
	const rnd = random(o.seed ?? 1);
	const centre = o.centre ?? { x: width / 2, y: height / 2 };
	const k = (o.diameterPx ?? 0.7 * Math.min(width, height)) / spec.odMm;
	const q = o.squash ?? 1;
	const axis = o.squashAxisDeg ?? 0;
	// Drawing (mm, y up) to image offsets (px, y up): turn the wheel, then squash along the tilt axis.
	const squashM = mul(mul(rot(axis), [1, 0, 0, q]), rot(-axis));
	const M = mul(squashM, rot(o.rotationDeg ?? 0)).map((v) => v * k) as Mat;
	const toImage = (x: number, y: number) => ({ x: centre.x + M[0] * x + M[1] * y, y: centre.y - (M[2] * x + M[3] * y) });
	const atAngle = (r: number, d: number) => toImage(r * Math.cos(rad(d)), r * Math.sin(rad(d)));

	// The export's SVG is y down: conjugate M by the y flip to get the SVG matrix.
	const svgMatrix = [M[0], -M[2], -M[1], M[3], centre.x, centre.y].map((v) => v.toFixed(6)).join(' ');
	const exported = wheelSvg(spec, 'mm');
	const cut = /<g id="cut"[^>]*>([\s\S]*?)<\/g>/.exec(exported)?.[1];
	if (!cut) throw new Error('synthetic: the SVG export has no cut group');
	const light = o.polarity !== 'dark-on-light';
	const [metal, background] = light ? ['#b4b6b8', '#2b2d33'] : ['#3a3c40', '#d8d2c4'];
	// The cut path already carries fill-rule evenodd, so the bore stays a hole; the etch is dropped.
	const part = cut.replace('<path ', `<path fill="${metal}" stroke="none" `);
	const svg = [
		`<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">`,
		`<rect width="${width}" height="${height}" fill="${background}"/>`,
		`<g transform="matrix(${svgMatrix})">${part}</g>`,
		`</svg>`
	].join('');

	let pipeline = sharp(Buffer.from(svg)).removeAlpha();
	if (o.blur && o.blur >= 0.3) pipeline = pipeline.blur(o.blur);
	const { data, info } = await pipeline.raw().toBuffer({ resolveWithObject: true });
	const ch = info.channels;
	const amp = o.light ?? 0;
	const sigma = o.noise ?? 0;
	if (amp || sigma) {
		const [lc, ls] = [Math.cos(rad(o.lightAngleDeg ?? 30)), -Math.sin(rad(o.lightAngleDeg ?? 30))];
		const half = Math.max(width, height) / 2;
		let spare: number | null = null;
		const gauss = () => {
			if (spare !== null) {
				const s = spare;
				spare = null;
				return s;
			}
			const u = Math.max(rnd(), 1e-12);
			const v = rnd();
			const m = Math.sqrt(-2 * Math.log(u));
			spare = m * Math.sin(2 * Math.PI * v);
			return m * Math.cos(2 * Math.PI * v);
		};
		for (let y = 0; y < height; y++) {
			for (let x = 0; x < width; x++) {
				const gain = 1 + (amp * ((x - width / 2) * lc + (y - height / 2) * ls)) / half;
				const n = sigma ? sigma * gauss() : 0;
				const i = (y * width + x) * ch;
				for (let c = 0; c < ch; c++) data[i + c] = Math.max(0, Math.min(255, Math.round(data[i + c]! * gain + n)));
			}
		}
	}
	const image = await sharp(data, { raw: { width, height, channels: ch } })
		.jpeg({ quality: o.quality ?? 90 })
		.toBuffer();

	const d = drawWheel(spec);
	const R = spec.odMm / 2;
	const mid = (a0: number, a1: number) => (a0 + a1) / 2;
	const n = Math.max(1, Math.min(o.tips ?? 3, d.spans.length));
	const jitter = o.jitterPx ?? 0;
	const tips = Array.from({ length: n }, (_, i) => {
		const span = d.spans[Math.floor((i * d.spans.length) / n + d.spans.length / (2 * n))]!;
		const p = atAngle(R, mid(span.a0, span.a1));
		const a = rnd() * 2 * Math.PI;
		const r = jitter * rnd();
		return { x: p.x + r * Math.cos(a), y: p.y + r * Math.sin(a) };
	});
	const ja = rnd() * 2 * Math.PI;
	const jr = jitter * rnd();
	// The widest gap (the first of equals), which is the one a reading calls the main gap.
	const opens = gapOpenings(spec);
	const widest = opens.reduce((w, g, i) => (g.count > opens[w]!.count ? i : w), 0);
	const gap = d.gaps[widest];
	const g = gap ? atAngle(R, mid(gap.a0, gap.a1)) : null;
	const gapAngleDeg = g ? ((((Math.atan2(-(g.y - centre.y), g.x - centre.x) * 180) / Math.PI) % 360) + 360) % 360 : NaN;
	return {
		image,
		width,
		height,
		taps: { centre: { x: centre.x + jr * Math.cos(ja), y: centre.y + jr * Math.sin(ja) }, tips },
		truth: {
			teeth: o.teeth,
			missing: o.missingPositions?.length ?? o.missing,
			gaps: gapsOf(spec.pattern),
			duty,
			gapAngleDeg,
			pitchDeg: 360 / o.teeth,
			radiusPx: R * k,
			centre
		}
	};
}
