// Tolerances a shop drawing states: the bore's fit and the general tolerance for everything else.

/**
 * ISO 286-1 standard tolerance IT7 by nominal size, "over … up to and including" (mm → µm), as
 * reprinted in every fits table (from memory; check your copy of ISO 286-1, Table 1).
 */
const it7 = [
	{ upTo: 3, um: 10 },
	{ upTo: 6, um: 12 },
	{ upTo: 10, um: 15 },
	{ upTo: 18, um: 18 },
	{ upTo: 30, um: 21 },
	{ upTo: 50, um: 25 },
	{ upTo: 80, um: 30 },
	{ upTo: 120, um: 35 },
	{ upTo: 180, um: 40 },
	{ upTo: 250, um: 46 },
	{ upTo: 315, um: 52 },
	{ upTo: 400, um: 57 },
	{ upTo: 500, um: 63 }
] as const;

export interface HoleFit {
	/** The ISO 286 symbol, e.g. "H7". */
	fit: string;
	/** Deviations from the nominal size, mm (an H hole starts at the nominal: lower 0). */
	upperMm: number;
	lowerMm: number;
	source: string;
}

/**
 * A keyed hub's bore: H7, the hole-basis fit common practice gives a hub on a keyed shaft (a
 * transition or light press fit with a k6 / j6 shaft, a sliding one with h6). Null past 500 mm,
 * where the table stops.
 */
export function boreFit(boreMm: number): HoleFit | null {
	if (!(boreMm > 0)) return null;
	const row = it7.find((r) => boreMm <= r.upTo + 1e-9);
	if (!row) return null;
	return { fit: 'H7', upperMm: row.um / 1000, lowerMm: 0, source: 'ISO 286-2 (H: lower deviation 0; IT7 from ISO 286-1)' };
}

/** The general tolerance for every dimension not toleranced on its own. */
export const generalTolerance = 'ISO 2768-m';
