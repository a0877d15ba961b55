// npm run bench: a photo reading of a 12-megapixel (4000 x 3000) JPEG, decode included (the aim is
// under 1 s). The photo is t01 of the rendered photo set (tests/fixtures/photo-set: a steel 36-1
// wheel on a wooden bench, tilted 12°), upscaled with sharp once, outside the timed function; the
// taps are its truth's centre and seven tips, scaled the same.
import { readFileSync } from 'node:fs';
import sharp from 'sharp';
import { bench, describe } from 'vitest';
import { readPhoto } from '../src/lib/server/photos/reading';

const dir = new URL('../tests/fixtures/photo-set/', import.meta.url);
const truth = JSON.parse(readFileSync(new URL('t01.json', dir), 'utf8')) as {
	teeth: number;
	missing: number;
	width: number;
	centre: { x: number; y: number };
	tips: { x: number; y: number }[];
};
const k = 4000 / truth.width;
const image = await sharp(readFileSync(new URL('t01.jpg', dir)))
	.resize(4000, 3000, { fit: 'fill' })
	.jpeg({ quality: 90 })
	.toBuffer();
const scale = (p: { x: number; y: number }) => ({ x: p.x * k, y: p.y * k });
const taps = { centre: scale(truth.centre), tips: truth.tips.map(scale) };

describe('photo reading, 36-1 steel wheel on a bench, 4000 x 3000 JPEG', () => {
	bench(
		'readPhoto: decode shrunk, colour edges, tip ellipse, perspective, ring, pattern',
		async () => {
			const r = await readPhoto(image, taps);
			if (!r.ok || r.teeth !== truth.teeth || r.missing !== truth.missing) throw new Error(`misread: ${JSON.stringify(r).slice(0, 300)}`);
		},
		{ iterations: 10, warmupIterations: 2 }
	);
});
