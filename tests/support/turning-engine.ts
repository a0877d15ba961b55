// The test oracle for everything that places BTDC or ATDC: a model of the turning engine written
// from the geometry alone (rigid rotation, arc length s = r·θ), not from src/lib/trade.
//
// The set-up, in 3D: the crank axis is z; the person stands on the wheel side, on +z, looking
// toward the engine (−z). The timing hub has diameter D; a paper tape of thickness t is wrapped
// round its rim, printed side out, with the tape's top edge (as printed, read upright) toward the
// engine and its bottom edge toward the wheel face. A pointer is fixed to the engine at some place
// round the rim. The tape was glued with its 0 under the pointer while the piston sat at TDC.
//
// At crank angle θ (degrees after TDC, negative before), every point of the hub has been carried
// by the rotation R(θ) about the crank axis, in the crank's sense, from where it was at TDC. The
// point of the tape now under the pointer is the one that sat at R(−θ)·P at TDC; its tape
// coordinate is the arc along the tape (on the paper's mid-thickness, radius (D + t)/2) from 0
// to it, counted positive toward the tape's own right as printed.

export type Rotation = 'cw' | 'ccw';
type V = [number, number, number];

const cross = (a: V, b: V): V => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
const dot = (a: V, b: V) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const rad = (d: number) => (d * Math.PI) / 180;

/** Rodrigues' rotation of v about the unit axis k by `angle` radians (right-hand rule). */
function rotate(v: V, k: V, angle: number): V {
	const c = Math.cos(angle);
	const s = Math.sin(angle);
	const kxv = cross(k, v);
	const kv = dot(k, v);
	return [0, 1, 2].map((i) => v[i]! * c + kxv[i]! * s + k[i]! * kv * (1 - c)) as V;
}

export interface TurningEngine {
	hubDiameterMm: number;
	paperThicknessMm: number;
	/** Crank rotation as seen from the wheel side (+z). */
	rotation: Rotation;
	/** Where the pointer is fixed round the rim, degrees anticlockwise from +x seen from +z (90 = top). */
	pointerAtDeg?: number;
}

/** The crank's rotation axis by the right-hand rule: clockwise seen from +z turns about −z. */
const spinAxis = (rotation: Rotation): V => (rotation === 'cw' ? [0, 0, -1] : [0, 0, 1]);

/**
 * The tape coordinate under the fixed pointer with the crank at `crankAtdcDeg` (degrees after
 * TDC, negative before TDC): mm from the tape's 0, positive toward the tape's right as printed.
 * On a full circle the answer is the nearer way round, within ±half the circumference.
 */
export function underPointer(engine: TurningEngine, crankAtdcDeg: number): number {
	const r = (engine.hubDiameterMm + engine.paperThicknessMm) / 2;
	const a = rad(engine.pointerAtDeg ?? 90);
	const pointer: V = [r * Math.cos(a), r * Math.sin(a), 0];
	// The tape point now under the pointer, where it sat at TDC (when 0 was under the pointer).
	const then = rotate(pointer, spinAxis(engine.rotation), rad(-crankAtdcDeg));
	// The tape's own right at 0: a page facing its reader has right = up × (normal toward the reader).
	const outward: V = [Math.cos(a), Math.sin(a), 0];
	const up: V = [0, 0, -1]; // top edge toward the engine
	const right = cross(up, outward);
	// Angle from 0 to that point round the axis, then signed by whether that way round is the tape's right.
	const z: V = [0, 0, 1];
	const anticlockwise = Math.atan2(dot(cross(pointer, then), z), dot(pointer, then));
	const rightIsAnticlockwise = Math.sign(dot(right, cross(z, outward)));
	return rightIsAnticlockwise * anticlockwise * r;
}

/** The side of the tape's 0 a reading lies on, as read upright: what a person says at the engine. */
export const sideOf = (tapeMm: number): 'left' | 'right' | 'at 0' => (Math.abs(tapeMm) < 1e-9 ? 'at 0' : tapeMm > 0 ? 'right' : 'left');

/**
 * A round scale on the hub's face (a degree wheel), read from the wheel side (+z): the face point
 * under the fixed pointer with the crank at `crankAtdcDeg`, in degrees clockwise from the scale's
 * 0 as seen from there, (−180, 180]. The scale's 0 sat under the pointer at TDC.
 */
export function faceUnderPointer(engine: Pick<TurningEngine, 'rotation' | 'pointerAtDeg'>, crankAtdcDeg: number): number {
	const a = rad(engine.pointerAtDeg ?? 90);
	const pointer: V = [Math.cos(a), Math.sin(a), 0];
	const then = rotate(pointer, spinAxis(engine.rotation), rad(-crankAtdcDeg));
	const anticlockwise = Math.atan2(dot(cross(pointer, then), [0, 0, 1]), dot(pointer, then));
	const deg = (-anticlockwise * 180) / Math.PI;
	return deg <= -180 + 1e-9 ? 180 : deg;
}
