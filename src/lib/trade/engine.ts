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

/** The V angles a single-crankpin V-twin may be given, degrees (narrower is a parallel twin in all but name). */
export const vAngleRange = { min: 15, max: 120 } as const;

/**
 * A four-stroke V-twin with both rods on one crankpin and V angle `vAngleDeg` between the
 * cylinders: cylinder 2 fires 360° + V after cylinder 1, then cylinder 1 again 360° − V later
 * (engine layout definition, common practice).
 */
export function vTwin(vAngleDeg: number): Layout {
	return { id: 'v-twin', label: `V-twin, ${vAngleDeg}° V, one crankpin`, stroke: 4, intervals: [360 + vAngleDeg, 360 - vAngleDeg] };
}

/**
 * Presets for the common layouts with fixed intervals. Parallel twins are named by their crankpin
 * offset (180°, 270°, 360°); a flat-plane inline four fires every 180° (engine layout
 * definitions, common practice). V-twins take any V angle: see `vTwin`.
 */
export const layouts: Layout[] = [
	{ id: 'single-4', label: 'Single, 4-stroke', stroke: 4, intervals: [720] },
	{ id: 'single-2', label: 'Single, 2-stroke', stroke: 2, intervals: [360] },
	{ id: 'twin-180', label: 'Parallel twin, 180° crank', stroke: 4, intervals: [180, 540] },
	{ id: 'twin-270', label: 'Parallel twin, 270° crank', stroke: 4, intervals: [270, 450] },
	{ id: 'twin-360', label: 'Parallel twin, 360° crank', stroke: 4, intervals: [360, 360] },
	{ id: 'twin-2-180', label: 'Twin, 2-stroke, 180° crank', stroke: 2, intervals: [180, 180] },
	{ id: 'four-inline', label: 'Inline four, flat-plane crank', stroke: 4, intervals: [180, 180, 180, 180] }
];

/** What a layout select offers: the presets, and the V-twin whose V angle is typed. */
export const layoutChoices: { id: string; label: string }[] = [
	...layouts.slice(0, 5),
	{ id: 'v-twin', label: 'V-twin, one crankpin (type the V angle)' },
	...layouts.slice(5)
];

/** Layout ids of earlier versions, still read (saved profiles and shared links): `v-twin-90` is a 90° V-twin. */
export function legacyVTwin(id: string | undefined): number | null {
	const m = /^v-twin-(45|60|75|90)$/.exec(id ?? '');
	return m ? Number(m[1]) : null;
}

/** Each cylinder's TDC (in firing order) in crank degrees after cylinder 1's firing TDC. */
export function firingTdcs(intervals: number[]): number[] {
	const out = [0];
	for (const i of intervals.slice(0, -1)) out.push(out.at(-1)! + i);
	return out;
}
