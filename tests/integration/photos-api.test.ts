// Wheel photos through the API: upload checks by bytes, nothing stored when refused, the photo
// reading on a picture rendered from the project's own SVG export.
import sharp from 'sharp';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connect } from '../../src/lib/server/db';
import { syntheticWheelPhoto } from '$support/synthetic-photos';
import { listKeys } from '../../src/lib/server/storage';
import { Client, freshEmail, signUp } from '../support/client';

const database = connect(process.env.DATABASE_URL!);
afterAll(() => database.$client.end());

const upload = (client: Client, buildId: string, files: { bytes: Uint8Array; name: string; type?: string }[]) => {
	const form = new FormData();
	for (const f of files) form.append('file', new Blob([new Uint8Array(f.bytes)], { type: f.type ?? 'application/octet-stream' }), f.name);
	return client.send<{ photos: { id: string; name: string; width: number; height: number }[]; errors: Record<string, string> }>(
		'POST',
		`/api/v1/builds/${buildId}/photos`,
		form
	);
};

describe('wheel photos', () => {
	let client: Client;
	let buildId: string;
	let workshopId: string;
	const stored = async () => ({
		rows: (await database.execute<{ n: number }>(sql`select count(*)::int as n from wheel_photo where build_id = ${buildId}`)).rows[0]!.n,
		objects: (await listKeys(`photos/${workshopId}/${buildId}/`)).length
	});

	beforeAll(async () => {
		client = await signUp('photo owner', freshEmail('photo'));
		workshopId = (await client.json<{ workshop: { id: string } }>('/api/v1/builds')).body.workshop.id;
		buildId = (await client.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Photo bench' })).body.id;
	});

	it('stores a photo upright without its metadata, with a thumbnail', async () => {
		// A 60 x 40 JPEG tagged orientation 6 (EXIF 2.3: rotate 90° clockwise to view) and a camera make.
		const jpeg = await sharp({ create: { width: 60, height: 40, channels: 3, background: '#808080' } })
			.jpeg()
			.withExif({ IFD0: { Make: 'BenchCam' } })
			.withMetadata({ orientation: 6 })
			.toBuffer();
		const res = await upload(client, buildId, [{ bytes: jpeg, name: '../../wheel.jpg', type: 'image/jpeg' }]);
		expect(res.status).toBe(201);
		expect(res.body.photos).toMatchObject([{ name: 'wheel.jpg', width: 40, height: 60 }]);
		const id = res.body.photos[0]!.id;
		const image = await client.get(`/api/v1/photos/${id}`);
		expect(image.headers.get('content-type')).toBe('image/jpeg');
		const meta = await sharp(Buffer.from(await image.arrayBuffer())).metadata();
		expect([meta.width, meta.height, meta.exif, meta.orientation]).toEqual([40, 60, undefined, undefined]);
		const thumb = await client.get(`/api/v1/photos/${id}/thumbnail`);
		expect((await sharp(Buffer.from(await thumb.arrayBuffer())).metadata()).format).toBe('webp');
		expect(await stored()).toEqual({ rows: 1, objects: 2 });
	});

	it('refuses files that are not JPEG, PNG or WebP by their bytes, whatever their name, and stores nothing', async () => {
		const before = await stored();
		const cases = [
			{ bytes: new TextEncoder().encode('just some text, not a photo'), name: 'wheel.jpg', type: 'image/jpeg' },
			{
				bytes: new TextEncoder().encode('<svg xmlns="http://www.w3.org/2000/svg"><circle r="5"/></svg>'),
				name: 'wheel.svg',
				type: 'image/svg+xml'
			},
			{
				bytes: await sharp({ create: { width: 8, height: 8, channels: 3, background: 'red' } })
					.gif()
					.toBuffer(),
				name: 'wheel.png',
				type: 'image/png'
			}
		];
		for (const file of cases) {
			const res = await upload(client, buildId, [file]);
			expect(res.status, file.name).toBe(400);
			expect(res.body.errors.file).toMatch(/^file: /);
		}
		// One bad file among good ones: none of them is stored.
		const png = await sharp({ create: { width: 8, height: 8, channels: 3, background: 'blue' } })
			.png()
			.toBuffer();
		expect((await upload(client, buildId, [{ bytes: png, name: 'good.png' }, cases[0]!])).status).toBe(400);
		expect(await stored()).toEqual(before);
	});

	it('refuses an oversize upload with 413 naming the file field, storing nothing', async () => {
		const before = await stored();
		const res = await upload(client, buildId, [{ bytes: new Uint8Array(22 * 1024 * 1024), name: 'huge.jpg' }]);
		expect(res.status).toBe(413);
		expect(res.body.errors.file).toMatch(/^file: at most 20 MB/);
		expect(await stored()).toEqual(before);
	});

	it('reads N and M from a photo of a wheel rendered from the SVG export, and hands the designer its parameters', async () => {
		const shot = await syntheticWheelPhoto({
			teeth: 36,
			missing: 1,
			width: 1600,
			height: 1200,
			rotationDeg: 37,
			noise: 6,
			blur: 1,
			tips: 3,
			jitterPx: 3,
			seed: 7
		});
		const res = await upload(client, buildId, [{ bytes: shot.image, name: 'bench-wheel.jpg' }]);
		expect(res.status).toBe(201);
		const id = res.body.photos[0]!.id;
		const read = await client.send<{
			reading: { teeth: number; missing: number; confidence: number };
			design: Record<string, string>;
			stored: boolean;
		}>('POST', `/api/v1/photos/${id}/reading`, { ...shot.taps, odMm: 100 });
		expect(read.status).toBe(200);
		expect(read.body.reading).toMatchObject({ teeth: 36, missing: 1 });
		expect(read.body.design).toMatchObject({ teeth: '36', missing: '1', pattern: 'missing', od: '100' });
		expect(read.body.stored).toBe(true);
		const outside = await client.send<{ errors: Record<string, string> }>('POST', `/api/v1/photos/${id}/reading`, {
			centre: { x: -5, y: 10 },
			tips: [{ x: 10, y: 10 }]
		});
		expect(outside.status).toBe(400);
		expect(outside.body.errors.centre).toMatch(/^centre: inside the photo/);
	});

	it('takes the known diameter as od with units, fractions of an inch too, or as the older odMm, to the same reading', async () => {
		// A 3 1/2 in wheel, drawn from the SVG export at 3.5 × 25.4 = 88.9 mm across the tips (1 in = 25.4 mm exactly).
		const shot = await syntheticWheelPhoto({
			teeth: 24,
			missing: 2,
			odMm: 88.9,
			width: 1200,
			height: 900,
			rotationDeg: 80,
			noise: 4,
			tips: 3,
			seed: 5
		});
		const id = (await upload(client, buildId, [{ bytes: shot.image, name: 'three-and-a-half-inch.jpg' }])).body.photos[0]!.id;
		type Answer = {
			reading: Record<string, number>;
			design: Record<string, string>;
			errors: Record<string, string>;
			refusals: { field: string; message: string }[];
		};
		const read = (body: Record<string, unknown>) => client.send<Answer>('POST', `/api/v1/photos/${id}/reading`, body);
		const inch = await read({ ...shot.taps, od: '3 1/2', units: 'in' });
		const older = await read({ ...shot.taps, odMm: 88.9 });
		expect([inch.status, older.status]).toEqual([200, 200]);
		// The same reading either way, bar the time it took and the scale's last bit (3.5 × 25.4 is 88.89999… in floating point).
		const rest = (r: Record<string, number>) => Object.fromEntries(Object.entries(r).filter(([k]) => k !== 'ms' && k !== 'mmPerPx'));
		expect(rest(inch.body.reading)).toEqual(rest(older.body.reading));
		expect(inch.body.reading.mmPerPx).toBeCloseTo(older.body.reading.mmPerPx!, 12);
		expect(inch.body.reading).toMatchObject({ teeth: shot.truth.teeth, missing: shot.truth.missing });
		// The scale comes from the diameter: 88.9 mm over the tip circle drawn 2 × radiusPx across.
		expect(Math.abs(inch.body.reading.mmPerPx! / (88.9 / (2 * shot.truth.radiusPx)) - 1)).toBeLessThan(0.03);
		// The designer opens in the units the diameter was given in.
		expect(inch.body.design).toMatchObject({ units: 'in', od: '3.5', teeth: '24', missing: '2', pattern: 'missing' });
		expect(older.body.design).toMatchObject({ units: 'mm', od: '88.9', teeth: '24', missing: '2', pattern: 'missing' });
		// 1/4 in (6.35 mm) is under the 10 mm least; the range is said in inches (10 / 25.4 = 0.394, 2000 / 25.4 = 78.74).
		const small = await read({ ...shot.taps, od: '1/4', units: 'in' });
		expect(small.status).toBe(400);
		expect(small.body.errors.od).toBe('od: 0.394 in to 78.74 in');
		expect(small.body.refusals).toEqual([{ field: 'od', message: '0.394 in to 78.74 in' }]);
		const both = await read({ ...shot.taps, od: '100', odMm: 100 });
		expect(both.status).toBe(400);
		expect(Object.keys(both.body.errors)).toEqual(['odMm']);
	});
});
