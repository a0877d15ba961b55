// The committed cases: each is a pattern and a seed; everything else (sizes, finish, bench, light,
// camera, occluder) is drawn from the seed, spread round-robin over the set so every finish meets
// every background and light.
import { BACKGROUNDS, LIGHTS, MATERIALS, type Background, type Light, type Material, type Occluder } from './scene';

export interface CaseDef {
	name: string;
	teeth: number;
	missing: number;
	seed: number;
	material: Material;
	background: Background;
	light: Light;
	occluder: Occluder;
	width: number;
	height: number;
}

const SIZES: [number, number][] = [
	[1600, 1200],
	[1600, 1200],
	[1200, 1600],
	[1600, 1200],
	[2000, 1500]
];

function spread(prefix: string, patterns: [number, number][], seedBase: number, occludedEvery: number, shift: number): CaseDef[] {
	return patterns.map(([teeth, missing], i) => {
		const j = i + shift;
		const occluder: Occluder =
			i % occludedEvery === occludedEvery - 1 ? (Math.floor(i / occludedEvery) % 2 ? 'bracket' : 'finger') : 'none';
		const [width, height] = SIZES[j % SIZES.length]!;
		return {
			name: `${prefix}${String(i + 1).padStart(2, '0')}`,
			teeth,
			missing,
			seed: seedBase + i * 7919,
			material: MATERIALS[j % 4]!,
			background: BACKGROUNDS[(j + Math.floor(j / 4)) % 4]!,
			light: LIGHTS[j % 3]!,
			occluder,
			width,
			height
		};
	});
}

// Common patterns (36-1, 60-2, 24-1, 12-1, 36-2, 48-1, 4-1, 8-1) and a few odd ones, N <= 72.
export const TEST_CASES = spread(
	't',
	[
		[36, 1],
		[60, 2],
		[24, 1],
		[12, 1],
		[36, 2],
		[48, 1],
		[4, 1],
		[8, 1],
		[36, 1],
		[60, 2],
		[24, 1],
		[12, 1],
		[36, 2],
		[48, 1],
		[30, 2],
		[72, 1],
		[36, 1],
		[60, 2],
		[24, 1],
		[12, 1],
		[36, 2],
		[60, 2],
		[18, 1],
		[36, 1]
	],
	1701,
	3,
	0
);

export const CALIBRATION_CASES = spread(
	'c',
	[
		[36, 1],
		[60, 2],
		[24, 1],
		[12, 1],
		[36, 2],
		[48, 1],
		[4, 1],
		[8, 1],
		[36, 1],
		[60, 2],
		[24, 1],
		[32, 1],
		[36, 2],
		[60, 2],
		[12, 1],
		[36, 1]
	],
	52211,
	3,
	1
);
