import { createHash } from 'node:crypto';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { cleanPhotoName, intakePhoto, photoLimits, sniffImageType } from './intake';

const blue = '#0000ff';
const red = '#ff0000';

/** 64 x 32, blue, with a red 16 x 16 block in the top-left corner, to see where rotation moved it. */
function marked(width = 64, height = 32) {
	return sharp({ create: { width, height, channels: 3, background: blue } }).composite([
		{ input: { create: { width: 16, height: 16, channels: 3, background: red } }, left: 0, top: 0 }
	]);
}

/** EXIF as phone cameras write it: maker, model, a GPS position. Orientation is set separately
 * because sharp's withExif keeps its own Orientation tag (it wrote 1 over ours when tried). */
const phoneExif = {
	IFD0: { Make: 'PhasewrightCam', Model: 'Test Phone' },
	IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '48/1 51/1 24/1', GPSLongitudeRef: 'E', GPSLongitude: '2/1 21/1 3/1' }
};

async function pixel(image: Buffer, x: number, y: number): Promise<number[]> {
	const { data, info } = await sharp(image).removeAlpha().raw().toBuffer({ resolveWithObject: true });
	const at = (y * info.width + x) * info.channels;
	return [...data.subarray(at, at + 3)];
}

function isRed([r, g, b]: number[]) {
	return r! > 200 && g! < 60 && b! < 60;
}

async function accepted(bytes: Buffer, name = 'wheel.jpg') {
	const result = await intakePhoto(bytes, name);
	if (!result.ok) throw new Error(`refused: ${result.message}`);
	return result.photo;
}

async function refused(bytes: Buffer, name = 'photo.jpg') {
	const result = await intakePhoto(bytes, name);
	if (result.ok) throw new Error('accepted');
	expect(result.field).toBe('file');
	expect(result.message).toMatch(/^file: /);
	return result;
}

/** CRC-32 as PNG uses it (PNG spec / RFC 2083 section 15, ISO-HDLC polynomial); Node 20 has no zlib.crc32. */
function crc32(bytes: Uint8Array): number {
	let c = ~0;
	for (const byte of bytes) {
		c ^= byte;
		for (let k = 0; k < 8; k++) c = (c >>> 1) ^ (0xedb88320 & -(c & 1));
	}
	return ~c >>> 0;
}

/** A 1 x 1 PNG whose IHDR claims `side` x `side`: the shape of a decompression bomb. */
async function bombPng(side: number): Promise<Buffer> {
	const png = Buffer.from(
		await sharp({ create: { width: 1, height: 1, channels: 3, background: blue } })
			.png()
			.toBuffer()
	);
	// PNG spec: 8-byte signature, then IHDR: length at 8, type at 12, width at 16, height at 20,
	// 13 data bytes, CRC over type + data at 29.
	expect(png.subarray(12, 16).toString('latin1')).toBe('IHDR');
	png.writeUInt32BE(side, 16);
	png.writeUInt32BE(side, 20);
	png.writeUInt32BE(crc32(png.subarray(12, 29)), 29);
	return png;
}

describe('sniffImageType', () => {
	it('knows the three signatures and nothing else', () => {
		// JPEG SOI marker FF D8 then the next marker's FF: ITU T.81 annex B.
		expect(sniffImageType(Uint8Array.from([0xff, 0xd8, 0xff, 0xe0]))).toBe('jpeg');
		expect(sniffImageType(Uint8Array.from([0xff, 0xd8]))).toBeNull();
		// PNG signature: PNG spec section 5.2 / RFC 2083 section 3.1.
		expect(sniffImageType(Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))).toBe('png');
		expect(sniffImageType(Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a]))).toBeNull();
		// WebP container spec: 'RIFF', 4-byte size, 'WEBP'. A WAV file is RIFF too.
		expect(sniffImageType(Buffer.from('RIFF\x10\0\0\0WEBPVP8 ', 'latin1'))).toBe('webp');
		expect(sniffImageType(Buffer.from('RIFF\x10\0\0\0WAVEfmt ', 'latin1'))).toBeNull();
		expect(sniffImageType(new Uint8Array())).toBeNull();
	});
});

describe('intakePhoto', () => {
	it('applies EXIF orientation 6 and strips EXIF including GPS', async () => {
		const input = await marked().jpeg().withExif(phoneExif).withMetadata({ orientation: 6 }).toBuffer();
		const before = await sharp(input).metadata();
		expect(before.orientation).toBe(6);
		expect(input.includes('PhasewrightCam')).toBe(true);

		const photo = await accepted(input);
		expect(photo).toMatchObject({ mime: 'image/jpeg', ext: 'jpg', width: 32, height: 64 });
		const after = await sharp(photo.bytes).metadata();
		expect(after).toMatchObject({ format: 'jpeg', width: 32, height: 64 });
		expect(after.exif).toBeUndefined();
		expect(after.orientation).toBeUndefined();
		expect(after.xmp).toBeUndefined();
		expect(photo.bytes.includes('PhasewrightCam')).toBe(false);
		// EXIF 2.3, tag 0x0112: 6 means the picture must turn 90 degrees clockwise to display, so
		// the stored top-left corner ends up top-right.
		expect(isRed(await pixel(photo.bytes, 31, 0))).toBe(true);
		expect(isRed(await pixel(photo.bytes, 0, 0))).toBe(false);
		expect(photo.sha256).toBe(createHash('sha256').update(photo.bytes).digest('hex'));

		// Smaller than 320 x 320: the thumbnail is not enlarged, but it is oriented too.
		expect(photo.thumbnail).toMatchObject({ mime: 'image/webp', width: 32, height: 64 });
		expect(sniffImageType(photo.thumbnail.bytes)).toBe('webp');
		expect((await sharp(photo.thumbnail.bytes).metadata()).exif).toBeUndefined();
		expect(isRed(await pixel(photo.thumbnail.bytes, 31, 0))).toBe(true);
	});

	it('takes a PNG, drops XMP and converts its ICC profile to sRGB', async () => {
		const input = await sharp({ create: { width: 1000, height: 500, channels: 3, background: { r: 200, g: 60, b: 40 } } })
			.png()
			.withXmp(
				'<x:xmpmeta xmlns:x="adobe:ns:meta/"><rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#"><rdf:Description xmlns:dc="http://purl.org/dc/elements/1.1/"><dc:creator>Secret Owner</dc:creator></rdf:Description></rdf:RDF></x:xmpmeta>'
			)
			.withIccProfile('p3')
			.toBuffer();
		// The file holds Display P3 numbers, not sRGB ones (read with the profile ignored).
		const stored = await sharp(input, { ignoreIcc: true }).raw().toBuffer();
		expect(Math.abs(stored[0]! - 200)).toBeGreaterThan(5);

		const photo = await accepted(input, 'wheel.png');
		expect(photo).toMatchObject({ mime: 'image/png', ext: 'png', width: 1000, height: 500 });
		const after = await sharp(photo.bytes).metadata();
		expect(after.format).toBe('png');
		expect(after.xmp).toBeUndefined();
		expect(after.icc).toBeUndefined();
		expect(photo.bytes.includes('Secret Owner')).toBe(false);
		const [r, g, b] = await pixel(photo.bytes, 500, 250);
		expect([Math.abs(r! - 200), Math.abs(g! - 60), Math.abs(b! - 40)].every((d) => d <= 2)).toBe(true);
		// Fit inside 320 x 320, aspect kept.
		expect(photo.thumbnail).toMatchObject({ width: 320, height: 160 });
	});

	it('takes a WebP and orients it too', async () => {
		const input = await marked().webp().withExif(phoneExif).withMetadata({ orientation: 6 }).toBuffer();
		const photo = await accepted(input, 'wheel.webp');
		expect(photo).toMatchObject({ mime: 'image/webp', ext: 'webp', width: 32, height: 64 });
		const after = await sharp(photo.bytes).metadata();
		expect(after.format).toBe('webp');
		expect(after.exif).toBeUndefined();
		expect(after.orientation).toBeUndefined();
		expect(isRed(await pixel(photo.bytes, 31, 0))).toBe(true);
	});

	it('refuses other types by their bytes, whatever the name says', async () => {
		const text = await refused(Buffer.from('Tooth count 36, missing 1\n'), 'photo.jpg');
		expect(text).toMatchObject({ status: 400, message: "file: JPEG, PNG or WebP only; this file's bytes are plain text" });
		const svg = Buffer.from('<?xml version="1.0"?>\n<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"/>');
		expect((await refused(svg, 'wheel.png')).message).toMatch(/bytes are SVG$/);
		const gif = await sharp({ create: { width: 4, height: 4, channels: 3, background: red } })
			.gif()
			.toBuffer();
		expect((await refused(gif)).message).toMatch(/bytes are a GIF$/);
		expect((await refused(Buffer.from('%PDF-1.7\n%\xe2\xe3\xcf\xd3\n', 'latin1'))).message).toMatch(/bytes are a PDF$/);
		// ISO/IEC 23008-12 (HEIF): a box of type 'ftyp' with major brand 'heic' first.
		const heic = Buffer.concat([Buffer.from([0, 0, 0, 0x18]), Buffer.from('ftypheic\0\0\0\0mif1heic', 'latin1')]);
		expect((await refused(heic, 'IMG_0001.jpg')).message).toMatch(/bytes are HEIC/);
	});

	it('refuses an empty, truncated or damaged image', async () => {
		expect((await refused(Buffer.alloc(0))).message).toBe('file: a JPEG, PNG or WebP photo; this file is empty');
		// Noise so that most of the file is scan data, which the cut then loses.
		const noise = Buffer.from(Array.from({ length: 400 * 300 * 3 }, (_, i) => (i * 2654435761) >>> 24));
		const jpeg = await sharp(noise, { raw: { width: 400, height: 300, channels: 3 } })
			.jpeg()
			.toBuffer();
		const cut = await refused(jpeg.subarray(0, Math.floor(jpeg.length * 0.6)));
		expect(cut).toMatchObject({ status: 400, message: 'file: a complete, undamaged JPEG, PNG or WebP; this JPEG is truncated or damaged' });
		// Right signature, nothing after it.
		expect((await refused(Buffer.from([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3]))).message).toMatch(/this JPEG is truncated or damaged$/);
		const png = await sharp(noise, { raw: { width: 400, height: 300, channels: 3 } })
			.png()
			.toBuffer();
		expect((await refused(png.subarray(0, 2000), 'wheel.png')).message).toMatch(/this PNG is truncated or damaged$/);
	});

	it('refuses more than maxBytes with 413 before looking inside', async () => {
		expect(photoLimits.maxBytes).toBe(20 * 1024 * 1024);
		const big = await refused(Buffer.alloc(photoLimits.maxBytes + 1));
		expect(big.status).toBe(413);
		expect(big.message).toMatch(/^file: at most 20 MB; /);
		// Exactly the limit is allowed in and refused for what it is.
		expect((await refused(Buffer.alloc(photoLimits.maxBytes))).status).toBe(400);
	});

	it('refuses a decompression bomb from its header', async () => {
		// Standard CRC-32 check value of "123456789" (the CRC catalogue, CRC-32/ISO-HDLC).
		expect(crc32(Buffer.from('123456789'))).toBe(0xcbf43926);
		expect(photoLimits.maxPixels).toBe(50_000_000);
		// 900 MP would need about 2.7 GB decoded; a decode would also blow the test timeout.
		const huge = await refused(await bombPng(30000), 'wheel.png');
		expect(huge.message).toBe('file: at most 50 megapixels; this image is 30000 x 30000 (900.0 megapixels)');
		// Under sharp's own default cap (0x3FFF squared) but over ours.
		expect((await refused(await bombPng(10000), 'wheel.png')).message).toMatch(/^file: at most 50 megapixels; this image is 10000 x 10000/);
	});
});

describe('cleanPhotoName', () => {
	it('keeps the base name of a path', () => {
		expect(cleanPhotoName('../../etc/passwd.jpg')).toBe('passwd.jpg');
		expect(cleanPhotoName('C:\\Users\\x\\photo.png')).toBe('photo.png');
		expect(cleanPhotoName('/var/www/..')).toBe('photo');
		expect(cleanPhotoName('')).toBe('photo');
		expect(cleanPhotoName('.htaccess')).toBe('htaccess');
	});

	it('drops control and direction characters', () => {
		expect(cleanPhotoName('wheel\u0000\r\n36-1\t.jpg')).toBe('wheel 36-1 .jpg');
		// U+202E RIGHT-TO-LEFT OVERRIDE would show 'invoice\u202Egpj.exe' as 'invoiceexe.jpg'.
		expect(cleanPhotoName('invoice\u202Egpj.exe')).toBe('invoicegpj.exe');
		expect(cleanPhotoName('my "best" wheel?.jpg')).toBe('my _best_ wheel_.jpg');
	});

	it('shortens long names to 120, keeping the extension and whole characters', () => {
		const long = cleanPhotoName(`${'a'.repeat(300)}.jpg`);
		expect(long).toHaveLength(120);
		expect(long.endsWith('a.jpg')).toBe(true);
		const emoji = cleanPhotoName(`${'⚙️🔧'.repeat(60)}.png`);
		expect(emoji.length).toBeLessThanOrEqual(120);
		expect(emoji.endsWith('.png')).toBe(true);
		expect(/[\uD800-\uDFFF]/u.test(emoji)).toBe(false); // no half of a surrogate pair
	});

	it('is what intakePhoto returns as the name', async () => {
		const png = await marked().png().toBuffer();
		expect((await accepted(png, '../../etc/passwd.png')).name).toBe('passwd.png');
	});
});
