// The wheel's shape, computed here from first principles (not from src/lib/trade) so the test set
// stays an independent oracle: N positions round the circle, the last M of them left empty, each
// tooth `duty` of a pitch wide between straight flanks, standing on a root circle.
export interface WheelGeometry {
	teeth: number;
	missing: number;
	tipR: number;
	rootR: number;
	duty: number;
	/** Angle (radians, in the x-z plane) of position 0's middle. */
	startRad: number;
}

/** Middle angle (radians) of position k. Positions run with increasing angle. */
export const positionRad = (g: WheelGeometry, k: number) => g.startRad + (k * 2 * Math.PI) / g.teeth;

/** The positions that carry a tooth: all but the last M. */
export const presentPositions = (g: WheelGeometry) => Array.from({ length: g.teeth - g.missing }, (_, k) => k);

/**
 * One tooth's outline as [x, z] points, moved `inset` mm into the metal (the top of a chamfered
 * wheel is the outline inset by the chamfer). Flanks stay parallel to the radial line through the
 * tooth's edge, so an inset flank is that line moved sideways. The foot reaches 1.5 mm inside the
 * root circle so the tooth overlaps the disc it stands on.
 */
export function toothOutline(g: WheelGeometry, k: number, inset: number): [number, number][] {
	const half = (g.duty * Math.PI) / g.teeth;
	const a = positionRad(g, k);
	const tip = g.tipR - inset;
	const foot = g.rootR - inset - 1.5;
	const pts: [number, number][] = [];
	const at = (r: number, ang: number) => pts.push([r * Math.cos(ang), r * Math.sin(ang)]);
	at(foot, a - half + Math.asin(inset / foot));
	const from = a - half + Math.asin(inset / tip);
	const to = a + half - Math.asin(inset / tip);
	const n = Math.max(2, Math.ceil((to - from) / 0.03));
	for (let i = 0; i <= n; i++) at(tip, from + ((to - from) * i) / n);
	at(foot, a + half - Math.asin(inset / foot));
	return pts;
}
