// Abusive uploads through POST /api/v1/builds/:id/photos: bytes that are not a photo, headers that
// claim a huge image (decompression bombs), files and bodies over the size caps, names shaped like
// paths or carrying control characters. Each must be refused with a 400 or 413 naming `file`, or
// taken under a cleaned name, and a refusal must leave nothing behind: no wheel_photo row, no
// object in the store.
import { sql } from 'drizzle-orm';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connect } from '../../src/lib/server/db';
import { listKeys } from '../../src/lib/server/storage';
import { appUrl, freshEmail, signUp, type Client } from '../support/client';

const database = connect(process.env.DATABASE_URL!);
afterAll(() => database.$client.end());

const MB = 1024 * 1024;

/** CRC-32 as PNG uses it (PNG spec / RFC 2083 section 15, ISO-HDLC polynomial 0xEDB88320). */
function crc32(bytes: Uint8Array): number {
	let c = ~0;
	for (const byte of bytes) {
		c ^= byte;
		for (let k = 0; k < 8; k++) c = (c >>> 1) ^ (0xedb88320 & -(c & 1));
	}
	return ~c >>> 0;
}

/** A 1 x 1 PNG whose IHDR claims `side` x `side`, CRC recomputed so the header reads as valid: a decompression bomb's header. */
async function bombPng(side: number): Promise<Buffer> {
	const png = Buffer.from(
		await sharp({ create: { width: 1, height: 1, channels: 3, background: '#0000ff' } })
			.png()
			.toBuffer()
	);
	// PNG spec 5.3/11.2.2: signature (8 bytes), IHDR length (4), 'IHDR' at 12, width at 16, height at 20, CRC over type + 13 data bytes at 29.
	expect(png.subarray(12, 16).toString('latin1')).toBe('IHDR');
	png.writeUInt32BE(side, 16);
	png.writeUInt32BE(side, 20);
	png.writeUInt32BE(crc32(png.subarray(12, 29)), 29);
	return png;
}

/** A tiny baseline JPEG whose SOF0 frame header claims `side` x `side` (ITU T.81 B.2.2: SOF0 = FF C0, length, precision, height, width). */
async function bombJpeg(side: number): Promise<Buffer> {
	const jpeg = Buffer.from(
		await sharp({ create: { width: 8, height: 8, channels: 3, background: '#808080' } })
			.jpeg({ mozjpeg: false })
			.toBuffer()
	);
	// Walk the marker segments after SOI (FF D8): each is FF, a marker byte, then a 2-byte length.
	let at = 2;
	while (jpeg[at] === 0xff && jpeg[at + 1] !== 0xc0) at += 2 + jpeg.readUInt16BE(at + 2);
	expect(jpeg[at + 1]).toBe(0xc0);
	jpeg.writeUInt16BE(side, at + 5);
	jpeg.writeUInt16BE(side, at + 7);
	return jpeg;
}

const png = () =>
	sharp({ create: { width: 48, height: 32, channels: 3, background: '#336699' } })
		.png()
		.toBuffer();
const jpeg = () =>
	sharp({ create: { width: 48, height: 32, channels: 3, background: '#996633' } })
		.jpeg()
		.toBuffer();

type Upload = {
	status: number;
	body: { photos?: { id: string; name: string; mime: string }[]; errors?: Record<string, string>; message?: string };
};

describe('abusive photo uploads', () => {
	let client: Client;
	let cookie: string;
	let buildId: string;
	let workshopId: string;

	const stored = async () => ({
		rows: (await database.execute<{ n: number }>(sql`select count(*)::int as n from wheel_photo where build_id = ${buildId}`)).rows[0]!.n,
		objects: (await listKeys(`photos/${workshopId}/${buildId}/`)).sort()
	});

	const upload = (files: { bytes: Uint8Array; name: string; type?: string }[]): Promise<Upload> => {
		const form = new FormData();
		for (const f of files) form.append('file', new Blob([new Uint8Array(f.bytes)], { type: f.type ?? 'application/octet-stream' }), f.name);
		return client.send('POST', `/api/v1/builds/${buildId}/photos`, form) as Promise<Upload>;
	};

	/** A multipart body written by hand, so a file name reaches the server byte for byte (FormData would escape CR, LF and quotes). */
	const rawUpload = async (filename: string, bytes: Uint8Array): Promise<Upload> => {
		const boundary = 'pwBoundary7MA4YWxkTrZu0gW';
		const head = Buffer.from(
			`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${filename}"\r\nContent-Type: image/png\r\n\r\n`,
			'utf8'
		);
		const body = Buffer.concat([head, bytes, Buffer.from(`\r\n--${boundary}--\r\n`)]);
		const res = await fetch(new URL(`/api/v1/builds/${buildId}/photos`, appUrl), {
			method: 'POST',
			headers: {
				cookie,
				origin: new URL(appUrl).origin,
				accept: 'application/json',
				'content-type': `multipart/form-data; boundary=${boundary}`
			},
			body
		});
		return { status: res.status, body: (await res.json()) as Upload['body'] };
	};

	/** A refusal: 400 or 413, `errors.file` saying what is wrong, and the store exactly as before. */
	async function expectRefused(answer: Promise<Upload>, status: 400 | 413, says: RegExp) {
		const before = await stored();
		const res = await answer;
		expect(res.status, JSON.stringify(res.body)).toBe(status);
		expect(res.body.errors?.file, JSON.stringify(res.body)).toMatch(/^file: /);
		expect(res.body.errors!.file).toMatch(says);
		expect(await stored()).toEqual(before);
	}

	beforeAll(async () => {
		client = await signUp('upload abuse', freshEmail('abuse'));
		cookie = [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
		workshopId = (await client.json<{ workshop: { id: string } }>('/api/v1/builds')).body.workshop.id;
		buildId = (await client.send<{ id: string }>('POST', '/api/v1/builds', { name: 'Upload abuse' })).body.id;
	});

	it('refuses bytes that are not JPEG, PNG or WebP, whatever the name and declared type say', async () => {
		const full = await jpeg();
		const cases: { bytes: Uint8Array; name: string; type: string; says: RegExp }[] = [
			{ bytes: new Uint8Array(), name: 'empty.jpg', type: 'image/jpeg', says: /empty/ },
			{ bytes: Buffer.from('%PDF-1.7\n%âãÏÓ\n1 0 obj\n<<>>\nendobj\n'), name: 'wheel.jpg', type: 'image/jpeg', says: /a PDF/ },
			{ bytes: Buffer.from('<html><script>alert(1)</script></html>'), name: 'wheel.png', type: 'image/png', says: /plain text/ },
			{
				bytes: Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"/>'),
				name: 'wheel.webp',
				type: 'image/webp',
				says: /SVG/
			},
			// Local file header signature PK\3\4 (PKWARE APPNOTE 4.3.7): a ZIP named as a photo.
			{
				bytes: Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0, 0, 0, 8, 0]),
				name: 'wheel.jpg',
				type: 'image/jpeg',
				says: /not an image we recognise/
			},
			// ELF magic 7F 'ELF' (System V ABI): an executable.
			{
				bytes: Buffer.from([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0, 0, 0, 0, 0]),
				name: 'wheel.png',
				type: 'image/png',
				says: /not an image we recognise/
			},
			{ bytes: Buffer.from('RIFF\x24\0\0\0WAVEfmt ', 'latin1'), name: 'wheel.webp', type: 'image/webp', says: /JPEG, PNG or WebP only/ },
			// The PNG signature alone, and a JPEG cut off after its first 60 bytes.
			{
				bytes: Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
				name: 'sig.png',
				type: 'image/png',
				says: /truncated or damaged/
			},
			{ bytes: full.subarray(0, 60), name: 'cut.jpg', type: 'image/jpeg', says: /truncated or damaged/ },
			{
				bytes: Buffer.concat([full.subarray(0, 3), Buffer.alloc(2000, 0x41)]),
				name: 'junk.jpg',
				type: 'image/jpeg',
				says: /truncated or damaged/
			}
		];
		for (const c of cases) await expectRefused(upload([c]), 400, c.says);
	});

	it('refuses decompression bombs by their header, before decoding a pixel', async () => {
		// 30000 x 30000 = 900 megapixels (3.6 GB decoded) in a file of under 100 bytes.
		const bomb = await bombPng(30_000);
		expect(bomb.length).toBeLessThan(100);
		await expectRefused(
			upload([{ bytes: bomb, name: 'bomb.png', type: 'image/png' }]),
			400,
			/at most 50 megapixels; this image is 30000 x 30000/
		);
		await expectRefused(
			upload([{ bytes: await bombJpeg(65_000), name: 'bomb.jpg', type: 'image/jpeg' }]),
			400,
			/at most 50 megapixels; this image is 65000 x 65000/
		);
		// Just over the cap: 7072 x 7072 = 50.01 megapixels.
		await expectRefused(upload([{ bytes: await bombPng(7072), name: 'edge.png' }]), 400, /at most 50 megapixels/);
		// A bomb among good photos: none of them is kept.
		await expectRefused(
			upload([
				{ bytes: await png(), name: 'good.png' },
				{ bytes: bomb, name: 'bomb.png' }
			]),
			400,
			/megapixels.*bomb\.png/
		);
	});

	it('refuses files and bodies over the size caps with 413, streamed or declared', async () => {
		// One file just over the 20 MB cap, inside the 21 MB body limit: refused by its own size.
		await expectRefused(upload([{ bytes: Buffer.alloc(20 * MB + 1024, 0xff), name: 'big.jpg' }]), 413, /over 20 MB/);
		// Two files of 15 MB: the body (30 MB) is over what one upload may carry.
		await expectRefused(
			upload([
				{ bytes: Buffer.alloc(15 * MB), name: 'a.jpg' },
				{ bytes: Buffer.alloc(15 * MB), name: 'b.jpg' }
			]),
			413,
			/at most 20 MB per photo, and 21 MB per upload/
		);
		// 30 MB streamed without a content-length (chunked): the server's body limit stops it as it comes in.
		const before = await stored();
		const boundary = 'pwStreamBoundary';
		const chunks = [
			Buffer.from(
				`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="stream.jpg"\r\nContent-Type: image/jpeg\r\n\r\n`
			),
			...Array.from({ length: 30 }, () => Buffer.alloc(MB, 0xd8)),
			Buffer.from(`\r\n--${boundary}--\r\n`)
		];
		const stream = new ReadableStream({
			pull(controller) {
				const next = chunks.shift();
				if (next) controller.enqueue(new Uint8Array(next));
				else controller.close();
			}
		});
		const res = await fetch(new URL(`/api/v1/builds/${buildId}/photos`, appUrl), {
			method: 'POST',
			headers: {
				cookie,
				origin: new URL(appUrl).origin,
				accept: 'application/json',
				'content-type': `multipart/form-data; boundary=${boundary}`
			},
			body: stream,
			duplex: 'half'
		} as RequestInit);
		expect(res.status).toBe(413);
		expect(((await res.json()) as Upload['body']).errors?.file).toMatch(/^file: at most 20 MB/);
		expect(await stored()).toEqual(before);
		// Thirteen small photos at once: over the twelve one upload takes.
		const small = await png();
		await expectRefused(
			upload(Array.from({ length: 13 }, (_, i) => ({ bytes: small, name: `p${i}.png` }))),
			400,
			/at most 12 photos at once/
		);
	});

	it('refuses what is not a multipart upload of files, naming file', async () => {
		const post = (body: string, type: string) =>
			fetch(new URL(`/api/v1/builds/${buildId}/photos`, appUrl), {
				method: 'POST',
				headers: { cookie, origin: new URL(appUrl).origin, accept: 'application/json', 'content-type': type },
				body
			}).then(async (r) => ({ status: r.status, body: (await r.json()) as Upload['body'] }));
		await expectRefused(post('{"file":"AAAA"}', 'application/json'), 400, /multipart\/form-data/);
		await expectRefused(post('file=AAAA', 'application/x-www-form-urlencoded'), 400, /choose at least one photo/);
		await expectRefused(post('--x\r\nbroken', 'multipart/form-data; boundary=x'), 400, /multipart\/form-data|choose at least one photo/);
		const form = new FormData();
		form.append('file', 'just a string, not a file');
		await expectRefused(client.send('POST', `/api/v1/builds/${buildId}/photos`, form) as Promise<Upload>, 400, /choose at least one photo/);
	});

	it('keeps path-like and control-character names only as a cleaned display name; the store key never comes from the name', async () => {
		const bytes = await png();
		// Expected display names: the last path segment, controls and bidi overrides removed, no
		// leading dots, at most 120 characters (common practice for untrusted upload names; OWASP File
		// Upload Cheat Sheet: never use the client's name as the storage path).
		const cases: [string, string][] = [
			['../../etc/passwd.jpg', 'passwd.jpg'],
			['C:\\x\\y.png', 'y.png'],
			['/absolute/path/wheel.png', 'wheel.png'],
			['..\\..\\windows\\system32\\wheel.png', 'wheel.png'],
			['.htaccess', 'htaccess'],
			['...', 'photo'],
			['wheel\u202egnp.exe', 'wheelgnp.exe'],
			[`${'w'.repeat(300)}.png`, `${'w'.repeat(116)}.png`],
			['tab\there.png', 'tab here.png'],
			["o'clock (1)*.png", "o'clock (1)_.png"]
		];
		for (const [name, cleaned] of cases) {
			const before = await stored();
			const res = await upload([{ bytes, name, type: 'image/png' }]);
			expect(res.status, name).toBe(201);
			expect(res.body.photos![0]!.name, name).toBe(cleaned);
			const after = await stored();
			expect(after.rows, name).toBe(before.rows + 1);
			// Two new objects, the photo and its thumbnail, named by the photo's id alone.
			const added = after.objects.filter((k) => !before.objects.includes(k));
			const id = res.body.photos![0]!.id;
			expect(added.sort(), name).toEqual([`photos/${workshopId}/${buildId}/${id}-thumb.webp`, `photos/${workshopId}/${buildId}/${id}.png`]);
			// The download's Content-Disposition carries the name as an RFC 8187 ext-value (RFC 6266 4.1):
			// charset, two quotes, then only attr-chars or percent-encoded octets, which decode to the name.
			const download = await client.get(`/api/v1/photos/${id}`);
			expect(download.status).toBe(200);
			const disposition = /^inline; filename\*=UTF-8''([A-Za-z0-9!#$&+\-.^_`|~%]*)$/.exec(
				download.headers.get('content-disposition') ?? ''
			);
			expect(disposition, `${name}: ${download.headers.get('content-disposition')}`).not.toBeNull();
			expect(decodeURIComponent(disposition![1]!)).toBe(cleaned);
		}
	});

	it('names carrying NUL, CR or LF as raw bytes in the multipart header: cleaned or refused naming file, never stored under them', async () => {
		const bytes = await png();
		for (const name of [
			'a\u0000b.png',
			'line\nbreak.png',
			'cr\r\nContent-Type: text/html\r\n\r\n.png',
			'\u0000',
			'../\u0000../etc/passwd.png'
		]) {
			const before = await stored();
			const res = await rawUpload(name, bytes);
			if (res.status === 201) {
				const kept = res.body.photos![0]!.name;
				expect(kept, JSON.stringify(name)).not.toMatch(/[\u0000-\u001f\u007f/\\]/);
				expect((await stored()).rows).toBe(before.rows + 1);
			} else {
				expect(res.status, JSON.stringify(name)).toBe(400);
				expect(res.body.errors?.file).toMatch(/^file: /);
				expect(await stored()).toEqual(before);
			}
		}
	});

	it('stores the type the bytes declare, not the name or the declared content type, and re-encodes away what follows the image', async () => {
		// A JPEG named .png and sent as image/png; and a PNG with a ZIP appended after IEND (a polyglot).
		const payload = Buffer.from('PK\u0003\u0004 secret payload after the image');
		const res = await upload([
			{ bytes: await jpeg(), name: 'really-a-jpeg.png', type: 'image/png' },
			{ bytes: Buffer.concat([await png(), payload]), name: 'polyglot.png', type: 'image/png' }
		]);
		expect(res.status).toBe(201);
		const byName = Object.fromEntries(res.body.photos!.map((p) => [p.name, p]));
		expect(byName['really-a-jpeg.png']!.mime).toBe('image/jpeg');
		const polyglot = Buffer.from(await (await client.get(`/api/v1/photos/${byName['polyglot.png']!.id}`)).arrayBuffer());
		expect((await sharp(polyglot).metadata()).format).toBe('png');
		expect(polyglot.includes(payload)).toBe(false);
	});
});
