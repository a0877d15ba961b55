// Photo reading against photos drawn from the project's own SVG export (wheelSvg of exampleSpec with
// the pattern given: 100 mm OD, 5 mm teeth, 20 mm bore unless the case says otherwise), so each
// expected N, M, gap angle and duty is the geometry a user would cut, not a number we typed twice.
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { gapsOf } from '$lib/trade/pattern';
import { confidenceWord, HIGH_CONFIDENCE, readPhoto } from './reading';
import { syntheticWheelPhoto, type SyntheticWheelOptions } from '$support/synthetic-photos';

type Case = SyntheticWheelOptions & { name: string; centreOffPx?: number };

const cases: Case[] = [
	{ name: '12-1, 1000 px, 1 tip', teeth: 12, missing: 1, width: 1000, height: 750, tips: 1 },
	{
		name: '24-1, 800 px, turned 137°, dark on light, jittered taps',
		teeth: 24,
		missing: 1,
		width: 800,
		height: 600,
		rotationDeg: 137,
		polarity: 'dark-on-light',
		jitterPx: 3
	},
	{ name: '36-1, noise and blur', teeth: 36, missing: 1, noise: 15, blur: 1.5 },
	{
		name: '36-2, 1600 px, uneven light, dark on light, 5 tips',
		teeth: 36,
		missing: 2,
		width: 1600,
		height: 1200,
		light: 0.6,
		rotationDeg: 250,
		polarity: 'dark-on-light',
		tips: 5,
		jitterPx: 4
	},
	{
		name: '60-2, 2000 px, ellipse 0.92, 1 tip',
		teeth: 60,
		missing: 2,
		width: 2000,
		height: 1500,
		squash: 0.92,
		squashAxisDeg: 35,
		rotationDeg: 12,
		tips: 1
	},
	{
		name: '60-2, 4000 x 3000 (12 MP), noise, blur, light',
		teeth: 60,
		missing: 2,
		width: 4000,
		height: 3000,
		noise: 8,
		blur: 2,
		light: 0.3,
		rotationDeg: 200,
		jitterPx: 5,
		odMm: 120
	},
	{
		name: '48-3, ellipse 0.92, 5 tips, noise',
		teeth: 48,
		missing: 3,
		width: 1400,
		height: 1050,
		squash: 0.92,
		squashAxisDeg: 120,
		tips: 5,
		jitterPx: 3,
		noise: 10
	},
	{ name: '72-1, duty 0.3, 800 px', teeth: 72, missing: 1, duty: 0.3, width: 800, height: 600 },
	{ name: '36-1, duty 0.7, turned 300°, 1 jittered tip', teeth: 36, missing: 1, duty: 0.7, rotationDeg: 300, tips: 1, jitterPx: 6 },
	{ name: '12-3, duty 0.3, 12 mm teeth', teeth: 12, missing: 3, duty: 0.3, depthMm: 12, rotationDeg: 45 },
	{ name: '60-2 thin ring (84 mm bore), dark on light', teeth: 60, missing: 2, boreMm: 84, polarity: 'dark-on-light', rotationDeg: 70 },
	{ name: '36-1, centre tapped 25 px off, 1 tip', teeth: 36, missing: 1, tips: 1, centreOffPx: 25, rotationDeg: 160 },
	{
		name: '36 with gaps at 5 and 34-35 (custom), turned 40°, 1 tip',
		teeth: 36,
		missing: 3,
		missingPositions: [5, 34, 35],
		rotationDeg: 40,
		tips: 1
	},
	{
		name: '24-2, 800 px, all at once: noise, blur, light, ellipse, dark on light, 1 jittered tip',
		teeth: 24,
		missing: 2,
		width: 800,
		height: 600,
		noise: 25,
		blur: 2,
		squash: 0.92,
		squashAxisDeg: 140,
		light: 0.5,
		polarity: 'dark-on-light',
		tips: 1,
		jitterPx: 5
	}
];

/** Signed difference of two angles in degrees, -180..180. */
const angleDiff = (a: number, b: number) => ((((a - b) % 360) + 540) % 360) - 180;

describe('readPhoto reads the pattern of a wheel drawn by the SVG export', () => {
	it.each(cases)(
		'$name',
		async (c) => {
			const photo = await syntheticWheelPhoto(c);
			const taps = { ...photo.taps, ...(c.odMm ? { odMm: c.odMm } : {}) };
			if (c.centreOffPx) taps.centre = { x: taps.centre.x + c.centreOffPx * 0.8, y: taps.centre.y - c.centreOffPx * 0.6 };
			const r = await readPhoto(photo.image, taps);
			if (!r.ok) throw new Error(`refused: ${r.message}`);
			// N and M: the spec given to the SVG export.
			expect(r.teeth).toBe(c.teeth);
			expect(r.missing).toBe(c.missing);
			expect(r.toothCount).toBe(c.teeth - c.missing);
			// Pitch p = 360 / N with the missing positions counted (common practice; design.md).
			expect(r.pitchDeg).toBeCloseTo(360 / c.teeth, 2);
			// Gap positions in the project's Pattern convention (pattern.ts gapsOf of the same pattern).
			expect(r.gaps).toEqual(photo.truth.gaps);
			if (!c.missingPositions) expect(r.gaps).toEqual(gapsOf({ kind: 'missing', teeth: c.teeth, missing: c.missing }));
			// Gap angle: the export's (widest) gap opening, drawWheel's gaps, carried through the photo's transform.
			expect(Math.abs(angleDiff(r.gapAngleDeg, photo.truth.gapAngleDeg))).toBeLessThan(180 / c.teeth);
			// Duty: the spec's tooth width / pitch.
			expect(Math.abs(r.duty - photo.truth.duty)).toBeLessThan(0.1);
			expect(r.polarity).toBe(c.polarity ?? 'light-on-dark');
			// Tip radius: the export's OD times the drawing scale.
			expect(Math.abs(r.radiusPx / photo.truth.radiusPx - 1)).toBeLessThan(0.02);
			if (c.odMm) expect(r.mmPerPx! * photo.truth.radiusPx * 2).toBeCloseTo(c.odMm, 0);
			expect(r.confidence).toBeGreaterThan(0.5);
			expect(r.confidence).toBeLessThanOrEqual(1);
		},
		30_000
	);
});

describe('readPhoto refuses what it cannot read, naming the field', () => {
	const grey = () =>
		sharp({ create: { width: 1000, height: 800, channels: 3, background: '#808080' } })
			.jpeg()
			.toBuffer();
	const taps = { centre: { x: 500, y: 400 }, tips: [{ x: 800, y: 400 }] };

	it('a centre outside the photo names centre', async () => {
		const r = await readPhoto(await grey(), { ...taps, centre: { x: 1500, y: 400 } });
		expect(r).toMatchObject({ ok: false, field: 'centre' });
	});

	it('a tip outside the photo, or on the centre, names tips', async () => {
		const image = await grey();
		expect(await readPhoto(image, { ...taps, tips: [{ x: -3, y: 400 }] })).toMatchObject({ ok: false, field: 'tips' });
		expect(await readPhoto(image, { ...taps, tips: [{ x: 504, y: 402 }] })).toMatchObject({ ok: false, field: 'tips' });
		expect(await readPhoto(image, { ...taps, tips: [] })).toMatchObject({ ok: false, field: 'tips' });
	});

	it('a blank photo names image and says what to do', async () => {
		const r = await readPhoto(await grey(), taps);
		expect(r).toMatchObject({ ok: false, field: 'image' });
		if (!r.ok) expect(r.message).toMatch(/tap|photograph|light/);
	});

	it('a disc without teeth, and a wheel with no gap, name image', async () => {
		const disc = await sharp(
			Buffer.from(
				'<svg xmlns="http://www.w3.org/2000/svg" width="1000" height="800"><rect width="1000" height="800" fill="#222"/><circle cx="500" cy="400" r="300" fill="#bbb"/></svg>'
			)
		)
			.jpeg()
			.toBuffer();
		expect(await readPhoto(disc, taps)).toMatchObject({ ok: false, field: 'image' });
		const gear = await syntheticWheelPhoto({ teeth: 36, missing: 0 });
		const r = await readPhoto(gear.image, gear.taps);
		expect(r).toMatchObject({ ok: false, field: 'image' });
		if (!r.ok) expect(r.message).toMatch(/no gap/);
	});

	it('bytes that are not a picture, or a cut-off JPEG, name image instead of throwing', async () => {
		expect(await readPhoto(Buffer.from('not a picture'), taps)).toMatchObject({ ok: false, field: 'image' });
		const photo = await syntheticWheelPhoto({ teeth: 36, missing: 1 });
		expect(await readPhoto(photo.image.subarray(0, 4000), photo.taps)).toMatchObject({ ok: false, field: 'image' });
	});

	it('taps far from the wheel name image', async () => {
		const photo = await syntheticWheelPhoto({ teeth: 36, missing: 1 });
		expect(await readPhoto(photo.image, { centre: { x: 100, y: 100 }, tips: [{ x: 200, y: 120 }] })).toMatchObject({
			ok: false,
			field: 'image'
		});
	});
});

describe('readPhoto answers where it read, and what would help', () => {
	it('the tip ellipse, and each tooth numbered from the first after the gap, where the export drew them', async () => {
		const photo = await syntheticWheelPhoto({ teeth: 36, missing: 1, rotationDeg: 100, tips: 1 });
		const r = await readPhoto(photo.image, photo.taps);
		if (!r.ok) throw new Error(`refused: ${r.message}`);
		// The ellipse: the export's OD times the drawing scale, about the centre the photo was drawn at.
		expect(Math.abs(r.ellipse.cx - photo.truth.centre.x)).toBeLessThan(2);
		expect(Math.abs(r.ellipse.cy - photo.truth.centre.y)).toBeLessThan(2);
		expect(Math.abs(r.ellipse.a / photo.truth.radiusPx - 1)).toBeLessThan(0.01);
		expect(r.ellipse.b / r.ellipse.a).toBeGreaterThan(0.99);
		expect(r.teethAt.map((t) => t.n)).toEqual(Array.from({ length: 35 }, (_, i) => i + 1));
		// Tooth n sits (M + 1) / 2 + (n - 1) pitches ccw of the gap's middle (an N-M wheel's geometry;
		// counting ccw is the cw-turning wheel's order past a fixed sensor), on the tip circle.
		const pitch = 360 / 36;
		for (const t of r.teethAt) {
			const dx = t.x - photo.truth.centre.x;
			const dy = -(t.y - photo.truth.centre.y);
			expect(Math.abs(Math.hypot(dx, dy) / photo.truth.radiusPx - 1)).toBeLessThan(0.02);
			const at = (Math.atan2(dy, dx) * 180) / Math.PI;
			expect(Math.abs(angleDiff(at, photo.truth.gapAngleDeg + pitch + (t.n - 1) * pitch))).toBeLessThan(pitch / 4);
		}
		expect(r.unseen).toEqual([]);
		expect(r.confidenceWord).toBe(confidenceWord(r.confidence));
	}, 30_000);

	it('a bracket over part of the rim: still reads N and M, and names the stretch it did not see', async () => {
		const photo = await syntheticWheelPhoto({ teeth: 36, missing: 1, rotationDeg: 90, tips: 3 });
		// A dull green bar across the rim opposite the gap, from the tip circle's inside to well outside it.
		const away = ((photo.truth.gapAngleDeg + 180) * Math.PI) / 180;
		const c = photo.truth.centre;
		const R = photo.truth.radiusPx;
		const bx = c.x + R * Math.cos(away);
		const by = c.y - R * Math.sin(away);
		const bar = Buffer.from(
			`<svg xmlns="http://www.w3.org/2000/svg" width="1200" height="900"><rect x="${bx - 50}" y="${by - 50}" width="100" height="100" fill="#4a6b3a"/></svg>`
		);
		const image = await sharp(photo.image)
			.composite([{ input: bar }])
			.jpeg()
			.toBuffer();
		const r = await readPhoto(image, photo.taps);
		if (!r.ok) throw new Error(`refused: ${r.message}`);
		expect([r.teeth, r.missing]).toEqual([36, 1]);
		expect(r.unseen.length).toBeGreaterThan(0);
		// The bar's middle lies on the rim at `away`.
		const mid = (away * 180) / Math.PI;
		const covers = r.unseen.some((u) => angleDiff(mid, u.fromDeg) >= 0 && angleDiff(u.toDeg, mid) >= 0);
		expect(covers, `${mid} in ${JSON.stringify(r.unseen)}`).toBe(true);
		expect(r.teethAt.length).toBeLessThan(35);
	}, 30_000);

	it('tips at 1.38 : 1 from a tapped centre (a tilted photo) are taken, nonsense ones are not', async () => {
		const photo = await syntheticWheelPhoto({ teeth: 36, missing: 1, squash: 0.72, squashAxisDeg: 0, tips: 1 });
		const c = photo.truth.centre;
		const R = photo.truth.radiusPx;
		// Tips on the long and the short axis of the squashed wheel: 1 / 0.72 = 1.39 apart.
		const tips = [
			{ x: c.x + R, y: c.y },
			{ x: c.x, y: c.y - 0.72 * R }
		];
		const r = await readPhoto(photo.image, { centre: c, tips });
		expect(r.ok || r.field).not.toBe('tips');
		const far = await readPhoto(photo.image, {
			centre: c,
			tips: [
				{ x: c.x + 30, y: c.y },
				{ x: c.x + 300, y: c.y }
			]
		});
		expect(far).toMatchObject({ ok: false, field: 'tips' });
	}, 30_000);

	it('a refusal says what would help in this photo', async () => {
		const blank = await sharp({ create: { width: 1000, height: 800, channels: 3, background: '#808080' } })
			.jpeg()
			.toBuffer();
		const r = await readPhoto(blank, { centre: { x: 500, y: 400 }, tips: [{ x: 800, y: 400 }] });
		if (r.ok) throw new Error('read a blank photo');
		expect(r.advice.length).toBeGreaterThan(0);
		expect(r.advice.join(' ')).toMatch(/tap five or more/);
	});

	it('says high only at and above HIGH_CONFIDENCE', () => {
		expect(confidenceWord(HIGH_CONFIDENCE)).toBe('high');
		expect(confidenceWord(HIGH_CONFIDENCE - 0.001)).not.toBe('high');
		expect(confidenceWord(0)).toBe('low');
	});
});
