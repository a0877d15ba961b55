import { createHash } from 'node:crypto';
import sharp, { type Sharp } from 'sharp';

// Intake of an uploaded wheel photo, before anything is stored: the type is judged by the bytes
// alone (names and declared content types are the sender's word), sizes are capped before any
// decoding, and what comes out is a fresh encoding with no metadata (phone photos carry GPS).

export const photoLimits = {
	/** A full-resolution phone JPEG is 3 to 12 MB; 20 MB leaves room without inviting abuse. */
	maxBytes: 20 * 1024 * 1024,
	/** Decoded size is what costs memory (about 4 bytes a pixel): 50 MP covers today's phones. */
	maxPixels: 50_000_000,
	thumbnailPx: 320
} as const;

type PhotoType = 'jpeg' | 'png' | 'webp';

const formats = {
	jpeg: { mime: 'image/jpeg', ext: 'jpg', label: 'JPEG' },
	png: { mime: 'image/png', ext: 'png', label: 'PNG' },
	webp: { mime: 'image/webp', ext: 'webp', label: 'WebP' }
} as const;

export type IntakeResult =
	| {
			ok: true;
			photo: {
				name: string;
				mime: 'image/jpeg' | 'image/png' | 'image/webp';
				ext: 'jpg' | 'png' | 'webp';
				width: number;
				height: number;
				bytes: Buffer;
				/** Of the re-encoded bytes, i.e. of what gets stored. */
				sha256: string;
				thumbnail: { bytes: Buffer; width: number; height: number; mime: 'image/webp' };
			};
	  }
	| { ok: false; field: 'file'; message: string; status: 400 | 413 };

const ascii = (text: string) => Array.from(text, (c) => c.charCodeAt(0));

function startsWith(bytes: Uint8Array, signature: number[], at = 0): boolean {
	return bytes.length >= at + signature.length && signature.every((b, i) => bytes[at + i] === b);
}

/** The image type the bytes themselves declare; null for anything we do not take. */
export function sniffImageType(bytes: Uint8Array): PhotoType | null {
	if (startsWith(bytes, [0xff, 0xd8, 0xff])) return 'jpeg';
	if (startsWith(bytes, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'png';
	if (startsWith(bytes, ascii('RIFF')) && startsWith(bytes, ascii('WEBP'), 8)) return 'webp';
	return null;
}

/** What a refused file is, in words the sender recognises (mostly a wrong camera setting or file). */
function describeBytes(bytes: Uint8Array): string {
	if (startsWith(bytes, ascii('GIF8'))) return 'a GIF';
	if (startsWith(bytes, ascii('%PDF-'))) return 'a PDF';
	if (startsWith(bytes, ascii('ftyp'), 4)) {
		const brand = String.fromCharCode(...bytes.subarray(8, 12));
		if (/^(heic|heix|hevc|heim|heis|mif1|msf1)$/.test(brand)) return 'HEIC (set the camera to save JPEG)';
		if (brand === 'avif') return 'AVIF';
	}
	if (startsWith(bytes, ascii('II*\0')) || startsWith(bytes, ascii('MM\0*'))) return 'TIFF';
	if (startsWith(bytes, ascii('BM'))) return 'a BMP';
	let head: string;
	try {
		head = new TextDecoder('utf-8', { fatal: true }).decode(bytes.subarray(0, 1024), { stream: true });
	} catch {
		return 'not an image we recognise';
	}
	if (/[\0-\x08\x0e-\x1f]/.test(head)) return 'not an image we recognise';
	return /<svg[\s>]/i.test(head) ? 'SVG' : 'plain text';
}

const maxNameLength = 120;

/** A display name: the last path segment, no control or direction characters, at most 120 long. */
export function cleanPhotoName(name: string): string {
	const base = (typeof name === 'string' ? name : '').normalize('NFC').split(/[/\\]/).pop() ?? '';
	const cleaned = base
		.replace(/[\t\n\v\f\r\p{Zl}\p{Zp}]/gu, ' ')
		// Cc: NUL, escapes; Cf: bidi overrides that make `gpj.exe` read as `exe.jpg`.
		.replace(/[\p{Cc}\p{Cf}]/gu, '')
		// Characters that break a quoted header or a Windows file name if this ever ends up there.
		.replace(/[<>:"|?*]/g, '_')
		.replace(/\s+/g, ' ')
		.replace(/^[\s.]+|[\s.]+$/g, '');
	if (cleaned.length <= maxNameLength) return cleaned || 'photo';
	const dot = cleaned.lastIndexOf('.');
	const ext = dot > 0 && cleaned.length - dot <= 11 ? cleaned.slice(dot) : '';
	let stem = '';
	// By code points, so an emoji is never cut in half.
	for (const ch of cleaned.slice(0, cleaned.length - ext.length)) {
		if (stem.length + ch.length > maxNameLength - ext.length) break;
		stem += ch;
	}
	return stem.trimEnd() + ext;
}

function refuse(message: string, status: 400 | 413 = 400): IntakeResult {
	return { ok: false, field: 'file', message, status };
}

const mb = (n: number) => `${(n / 1024 / 1024).toFixed(1)} MB`;
const tooManyPixels = (w: number, h: number) =>
	refuse(`file: at most ${photoLimits.maxPixels / 1e6} megapixels; this image is ${w} x ${h} (${((w * h) / 1e6).toFixed(1)} megapixels)`);
const damaged = (type: PhotoType) =>
	refuse(`file: a complete, undamaged JPEG, PNG or WebP; this ${formats[type].label} is truncated or damaged`);

function encode(image: Sharp, type: PhotoType): Sharp {
	if (type === 'jpeg') return image.jpeg({ quality: 90, mozjpeg: false });
	if (type === 'webp') return image.webp({ quality: 90 });
	return image.png();
}

/** Checks, orients and re-encodes an upload; refuses bad input with a message, never throws. */
export async function intakePhoto(bytes: Buffer, name: string): Promise<IntakeResult> {
	if (!bytes?.length) return refuse('file: a JPEG, PNG or WebP photo; this file is empty');
	if (bytes.length > photoLimits.maxBytes) {
		return refuse(`file: at most ${photoLimits.maxBytes / 1024 / 1024} MB; this file is ${mb(bytes.length)}`, 413);
	}
	const type = sniffImageType(bytes);
	if (!type) return refuse(`file: JPEG, PNG or WebP only; this file's bytes are ${describeBytes(bytes)}`);

	// The header alone: a bomb declares its size up front, so it is refused before any pixel is
	// decoded. The limit is off here only so the refusal can say the dimensions.
	let width: number, height: number;
	try {
		const meta = await sharp(bytes, { limitInputPixels: false }).metadata();
		if (meta.format !== type) return damaged(type);
		({ width, height } = meta);
	} catch {
		return damaged(type);
	}
	if (width * height > photoLimits.maxPixels) return tooManyPixels(width, height);

	try {
		// limitInputPixels again, in case the decoder sees other dimensions than the header read.
		// failOn 'error' refuses truncated data but not the harmless libjpeg warnings some phones cause.
		// rotate() with no angle applies the EXIF orientation; without keepExif/withMetadata sharp
		// writes no EXIF, XMP or IPTC and converts an embedded ICC profile to untagged sRGB.
		const oriented = sharp(bytes, { limitInputPixels: photoLimits.maxPixels, failOn: 'error' }).rotate();
		const side = photoLimits.thumbnailPx;
		// One after the other: a turned 50 MP image is held whole in memory, twice would be too much.
		const full = await encode(oriented.clone(), type).toBuffer({ resolveWithObject: true });
		const thumb = await oriented
			.clone()
			.resize(side, side, { fit: 'inside', withoutEnlargement: true })
			.webp({ quality: 80 })
			.toBuffer({ resolveWithObject: true });
		const { mime, ext } = formats[type];
		return {
			ok: true,
			photo: {
				name: cleanPhotoName(name),
				mime,
				ext,
				width: full.info.width,
				height: full.info.height,
				bytes: full.data,
				sha256: createHash('sha256').update(full.data).digest('hex'),
				thumbnail: { bytes: thumb.data, width: thumb.info.width, height: thumb.info.height, mime: 'image/webp' }
			}
		};
	} catch (error) {
		if (error instanceof Error && /pixel limit/i.test(error.message)) return tooManyPixels(width, height);
		return damaged(type);
	}
}
