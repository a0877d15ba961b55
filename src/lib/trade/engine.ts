// Engine profiles: how many cylinders, the stroke, and the firing intervals in crank degrees.
// A four-stroke cylinder fires once every 720° of crank, a two-stroke once every 360°, so the
// intervals of one cycle add up to that (engine cycle definition, common practice).

export type Stroke = 2 | 4;

export const cycleDeg = (stroke: Stroke) => (stroke === 4 ? 720 : 360);

export interface Layout {
	id: string;
	label: string;
	stroke: Stroke;
	/** Crank degrees from each cylinder's firing to the next one's, starting at cylinder 1. */
	intervals: number[];
}

/**
 * Presets for the common layouts. Parallel twins are named by their crankpin offset (180°, 270°,
 * 360°); a single-crankpin V-twin with V angle α fires at 360° + α and 360° − α; a flat-plane
 * inline four every 180° (engine layout definitions, common practice).
 */
export const layouts: Layout[] = [
	{ id: 'single-4', label: 'Single, 4-stroke', stroke: 4, intervals: [720] },
	{ id: 'single-2', label: 'Single, 2-stroke', stroke: 2, intervals: [360] },
	{ id: 'twin-180', label: 'Parallel twin, 180° crank', stroke: 4, intervals: [180, 540] },
	{ id: 'twin-270', label: 'Parallel twin, 270° crank', stroke: 4, intervals: [270, 450] },
	{ id: 'twin-360', label: 'Parallel twin, 360° crank', stroke: 4, intervals: [360, 360] },
	...[45, 60, 75, 90].map((v) => ({ id: `v-twin-${v}`, label: `V-twin, ${v}° V, one crankpin`, stroke: 4 as const, intervals: [360 + v, 360 - v] })),
	{ id: 'twin-2-180', label: 'Twin, 2-stroke, 180° crank', stroke: 2, intervals: [180, 180] },
	{ id: 'four-inline', label: 'Inline four, flat-plane crank', stroke: 4, intervals: [180, 180, 180, 180] }
];

/** Each cylinder's TDC (in firing order) in crank degrees after cylinder 1's firing TDC. */
export function firingTdcs(intervals: number[]): number[] {
	const out = [0];
	for (const i of intervals.slice(0, -1)) out.push(out.at(-1)! + i);
	return out;
}
