// Which angles of the ring are seen, on a polar grid drawn here: metal inside ρ = 1, a green mat
// outside, the colours chosen by hand, so what is seen is the drawing's own.
import { describe, expect, it } from 'vitest';
import { projectColour, type Polar } from './ring';

const na = 720;
const radii = Float64Array.from({ length: 41 }, (_, j) => 0.8 + j * 0.01);

/** Metal of colour `metal(deg)` inside ρ = 1, the mat's green outside; `over(deg)` paints something over both. */
function ring(metal: (deg: number) => number[], over?: (deg: number) => number[] | null): Polar {
	const values = new Float32Array(na * radii.length * 3);
	for (let i = 0; i < na; i++) {
		const deg = (360 * i) / na;
		for (let j = 0; j < radii.length; j++) {
			const c = over?.(deg) ?? (radii[j]! < 1 ? metal(deg) : [60, 150, 90]);
			values.set(c, (i * radii.length + j) * 3);
		}
	}
	return { na, radii, values, channels: 3 };
}

describe('projectColour: the angles seen', () => {
	it('follows dark steel turning light grey round the ring (a flash), and stops at a finger', () => {
		// Steel from 50 grey at 0° to 190 at 180° and back: its colour seen from the mat turns from
		// "darker" to "lighter and less green" slowly; a skin-coloured finger over 100°..130° at once.
		const grey = (deg: number) => 50 + 140 * Math.sin((deg * Math.PI) / 360) ** 2;
		const steel = (deg: number) => [grey(deg), grey(deg), grey(deg)];
		const clear = projectColour(ring(steel), [0.8, 0.9], [1.06, 1.2]);
		expect(clear.seen.filter(Boolean)).toHaveLength(72);
		const finger = projectColour(
			ring(steel, (deg) => (deg >= 100 && deg < 130 ? [230, 180, 150] : null)),
			[0.8, 0.9],
			[1.06, 1.2]
		);
		// 72 bins of 5°: the six under the finger are not seen, every other one is.
		const unseen = [...finger.seen.keys()].filter((b) => !finger.seen[b]);
		expect(unseen).toEqual([20, 21, 22, 23, 24, 25]);
	});
});
