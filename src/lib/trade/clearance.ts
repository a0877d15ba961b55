// How close a round hole comes to the other things on a wheel: used alike by the refusals
// (checks.ts) and by the balance suggestion (balance.ts), so a suggestion is never refused.
import type { Point } from './geometry';
import type { PlacedLabel } from './label';
import { clearanceMm, holeCenters, innerRadius, rootRadius, type HoleCircle, type WheelSpec } from './wheel';

/** Distance from a point to a convex polygon given corner by corner; 0 inside it. */
export function distanceToPolygon(p: Point, poly: readonly Point[]): number {
	let inside = true;
	let best = Infinity;
	let sign = 0;
	poly.forEach((a, i) => {
		const b = poly[(i + 1) % poly.length]!;
		const [ex, ey] = [b.x - a.x, b.y - a.y];
		const cross = ex * (p.y - a.y) - ey * (p.x - a.x);
		if (cross !== 0) {
			if (sign === 0) sign = Math.sign(cross);
			else if (Math.sign(cross) !== sign) inside = false;
		}
		const t = Math.max(0, Math.min(1, ((p.x - a.x) * ex + (p.y - a.y) * ey) / (ex * ex + ey * ey || 1)));
		best = Math.min(best, Math.hypot(p.x - (a.x + t * ex), p.y - (a.y + t * ey)));
	});
	return inside ? 0 : best;
}

/** The band of pitch-circle radii on which a hole of this size keeps its clearance from the bore, keyway and tooth roots. */
export const holeBand = (spec: WheelSpec, holeMm: number): [number, number] => [
	innerRadius(spec) + clearanceMm + holeMm / 2,
	rootRadius(spec) - clearanceMm - holeMm / 2
];

/** Whether a hole at `center` keeps its clearance from the label's ink box. */
export const clearOfLabel = (center: Point, holeMm: number, label: PlacedLabel | null) =>
	!label || distanceToPolygon(center, label.corners) >= holeMm / 2 + clearanceMm - 1e-9;

/** Whether two holes keep their clearance from each other. */
export const clearOfHole = (p: Point, pMm: number, q: Point, qMm: number) =>
	Math.hypot(p.x - q.x, p.y - q.y) >= (pMm + qMm) / 2 + clearanceMm - 1e-9;

/** Whether every pair of holes of one circle keeps its clearance. */
export function circleClear(spec: WheelSpec, holes: HoleCircle): boolean {
	const at = holeCenters(spec, holes);
	return at.every((p, i) => at.slice(i + 1).every((q) => clearOfHole(p, holes.holeMm, q, holes.holeMm)));
}
