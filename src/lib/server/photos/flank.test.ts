// Reading the teeth from their shadows, on a wheel drawn here in the cover's own shade (150 grey on
// 150 grey): only the shadows show the teeth. The drawing follows how a cast shadow falls (common
// practice for a wheel raised over a cover in hard light): where the light throws the shadow out of
// the wheel (around 300° here) it fills the spaces, gap included; elsewhere each tooth casts a thin
// line into the space beside the flank that faces the shadow's way. The expected N-M is the drawing's.
import { describe, expect, it } from 'vitest';
import { flankProfile } from './flank';
import { affinePose } from './plane';
import { readProfile } from './profile';
import type { Grey } from './ring';

const size = 640;
const [cx, cy, radius] = [320, 320, 250];

/** A 36-2 of tooth depth 0.08 (ρ 0.92..1), its gap's middle at 300°, the shadow thrown towards `shadowDeg`. */
function wheel(shadowDeg: number | null): Grey {
	const data = new Uint8Array(size * size).fill(150);
	const [n, missing, gapDeg] = [36, 2, 300];
	const pitch = 360 / n;
	// Teeth at positions k (their middles k pitches after the gap's last missing one); spaces between.
	const first = gapDeg + ((missing + 1) / 2) * pitch;
	for (let y = 0; y < size; y++)
		for (let x = 0; x < size; x++) {
			const rho = Math.hypot(x - cx, y - cy) / radius;
			if (rho < 0.92 || rho > 1) continue;
			const deg = ((((Math.atan2(-(y - cy), x - cx) * 180) / Math.PI) % 360) + 360) % 360;
			const fromFirst = (((deg - first + pitch / 2) % 360) + 360) % 360;
			const k = Math.floor(fromFirst / pitch);
			const within = fromFirst / pitch - k;
			const tooth = k < n - missing && within >= 0.25 && within < 0.75;
			if (tooth || shadowDeg === null) continue;
			// The shadow's way seen at this angle: out of the wheel within 60° of it (spaces filled),
			// else along the ring, onward or back; the line lies beside the flank facing that way.
			const off = Math.sin(((shadowDeg - deg) * Math.PI) / 180);
			const out = Math.cos(((shadowDeg - deg) * Math.PI) / 180) > 0.5;
			const line = 0.06;
			const dark =
				out || k >= n - missing ? true : off > 0 ? within >= 0.75 && within < 0.75 + line : within < 0.25 && within >= 0.25 - line;
			if (dark) data[y * size + x] = 80;
		}
	return { data, width: size, height: size, channels: 1 };
}

describe('flankProfile: the teeth from their shadows', () => {
	it('reads a 36-2 of the cover’s shade from the lines along its flanks and the spaces its cast shadow fills', () => {
		const profile = flankProfile(wheel(300), affinePose(cx, cy, radius, radius, 0), radius);
		expect(profile).not.toBeNull();
		const read = readProfile(profile!);
		expect('failure' in read ? read.failure : `${read.teeth}-${read.missing}`).toBe('36-2');
	});

	it('finds nothing on a wheel that casts no shadow (the cover’s shade all round)', () => {
		expect(flankProfile(wheel(null), affinePose(cx, cy, radius, radius, 0), radius)).toBeNull();
	});
});
