// npm run bench: a photo reading of a 12-megapixel (4000 x 3000) JPEG of a 60-2 wheel, decode
// included (the target is under 2 s). The photo is drawn once, outside the timed function.
import { bench, describe } from 'vitest';
import { readPhoto } from '../src/lib/server/photos/reading';
import { syntheticWheelPhoto } from '$support/synthetic-photos';

const photo = await syntheticWheelPhoto({
	teeth: 60,
	missing: 2,
	width: 4000,
	height: 3000,
	rotationDeg: 33,
	noise: 8,
	blur: 2,
	light: 0.3,
	jitterPx: 4
});

describe('photo reading, 60-2 wheel, 4000 x 3000 JPEG', () => {
	bench(
		'readPhoto: decode, crop, shrink, three rings, pattern',
		async () => {
			const r = await readPhoto(photo.image, photo.taps);
			if (!r.ok || r.teeth !== 60 || r.missing !== 2) throw new Error(`misread: ${JSON.stringify(r)}`);
		},
		{ iterations: 10, warmupIterations: 2 }
	);
});
